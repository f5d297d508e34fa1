/**
 * Waits between tries when the server or the network is away: doubling from `firstMs` up to
 * `maxMs`, with up to 20 % random jitter so several dyno PCs do not retry in step.
 */
export function backoffDelayMs(attempt: number, firstMs = 1000, maxMs = 60_000, random: () => number = Math.random): number {
  const base = Math.min(maxMs, firstMs * 2 ** Math.max(0, attempt));
  return Math.round(base * (1 - 0.2 * random()));
}
