/**
 * Sends one run file to Pullbook with the dyno's device token. Talks only to the device upload
 * route; tells apart what a retry can fix (server or network away, 5xx, 429) from what it cannot
 * (the token refused, the file refused).
 */
import { DEVICE_UPLOAD_PATH, type DeviceUploadResponse } from '@shared/schemas/device';
import type { ApiErrorBody } from '@shared/errors';

/** Nothing will get through until a person fixes the set-up: the agent stops instead of retrying. */
export class FatalSendError extends Error {
  constructor(readonly status: number, message: string) {
    super(message);
    this.name = 'FatalSendError';
  }
}

/** The token was refused (wrong, revoked, or its dyno removed): nothing will get through until it is replaced. */
export class TokenRefusedError extends FatalSendError {
  name = 'TokenRefusedError';
}

export type SendOutcome =
  | { kind: 'sent'; response: DeviceUploadResponse }
  | { kind: 'refused'; status: number; code: string; message: string }
  | { kind: 'retry'; reason: string; retryAfterMs?: number };

export interface SendInput {
  server: string;
  token: string;
  fileName: string;
  bytes: Uint8Array;
  /** Gives up on one try after this long (a stalled connection counts as the network being away). */
  timeoutMs?: number;
}

export async function sendRunFile({ server, token, fileName, bytes, timeoutMs = 60_000 }: SendInput): Promise<SendOutcome> {
  const form = new FormData();
  // A Buffer's memory is never shared here; the cast only narrows ArrayBufferLike for the DOM typings.
  form.append('files', new Blob([bytes as Uint8Array<ArrayBuffer>], { type: 'text/plain' }), fileName);
  let res: Response;
  try {
    res = await fetch(new URL(DEVICE_UPLOAD_PATH, server), {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}`, Accept: 'application/json' },
      body: form,
      signal: AbortSignal.timeout(timeoutMs),
    });
  } catch (err) {
    const cause = (err as { cause?: { code?: string } }).cause?.code ?? (err as Error).name;
    return { kind: 'retry', reason: `server not reachable (${cause})` };
  }
  const body = (await res.json().catch(() => null)) as (ApiErrorBody & DeviceUploadResponse) | null;
  if (res.ok && body?.results) return { kind: 'sent', response: body };
  if (res.status === 401 || res.status === 403) {
    throw new TokenRefusedError(res.status, body?.error?.message ?? 'the server refused the device token');
  }
  if (res.status === 404) {
    // The address answers but has no device upload route: a wrong --server, not a file problem.
    throw new FatalSendError(404, `${new URL(DEVICE_UPLOAD_PATH, server).href} does not exist on this server; check --server`);
  }
  if (res.status === 429 || res.status >= 500 || !body) {
    const retryAfter = Number(res.headers.get('retry-after'));
    return { kind: 'retry', reason: `server answered ${res.status}${body?.error ? ` ${body.error.code}` : ''}`, retryAfterMs: Number.isFinite(retryAfter) && retryAfter > 0 ? retryAfter * 1000 : undefined };
  }
  return { kind: 'refused', status: res.status, code: body.error?.code ?? `HTTP_${res.status}`, message: body.error?.message ?? res.statusText };
}

/** Header that marks a POST to the device route as a heartbeat: no file, only "the agent is running". */
export const HEARTBEAT_HEADER = 'X-Pullbook-Heartbeat';

/**
 * Tells the server the agent is running (the bay board's "agent last heard"), on the device upload
 * route itself, the only one a device token may use. True when heard; a refused token throws
 * TokenRefusedError (so a revoked token stops an idle agent too); anything else is false.
 */
export async function sendHeartbeat({ server, token, timeoutMs = 15_000 }: { server: string; token: string; timeoutMs?: number }): Promise<boolean> {
  let res: Response;
  try {
    res = await fetch(new URL(DEVICE_UPLOAD_PATH, server), { method: 'POST', headers: { Authorization: `Bearer ${token}`, [HEARTBEAT_HEADER]: '1' }, signal: AbortSignal.timeout(timeoutMs) });
  } catch {
    return false;
  }
  await res.arrayBuffer().catch(() => undefined);
  if (res.status === 401 || res.status === 403) throw new TokenRefusedError(res.status, 'the server refused the device token');
  return res.ok;
}
