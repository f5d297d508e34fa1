/**
 * "12 s ago", "4 min ago", "3 h ago", "2 days ago": how long since the dyno's agent was heard.
 * Never a future time: a clock a little ahead of the server's reads as "just now".
 */
export function sinceText(iso: string | null, now: number = Date.now()): string {
  if (!iso) return 'never';
  const s = Math.max(0, Math.round((now - new Date(iso).getTime()) / 1000));
  if (s < 5) return 'just now';
  if (s < 90) return `${s} s ago`;
  const min = Math.round(s / 60);
  if (min < 90) return `${min} min ago`;
  const h = Math.round(min / 60);
  if (h < 36) return `${h} h ago`;
  const d = Math.round(h / 24);
  return `${d} day${d === 1 ? '' : 's'} ago`;
}

/** The agent counts as quiet when not heard for this long (a running agent checks in every minute). */
export const AGENT_QUIET_MS = 3 * 60 * 1000;
