/**
 * The one way the client talks to the API: JSON in and out, cookies included, and every
 * failure turned into an ApiError carrying the server's stable code and field messages.
 */
import type { ApiErrorBody, ApiErrorCode } from '@shared/errors';

/**
 * Codes the client makes itself, for failures the server never answered: no connection, a
 * cancelled upload, an upload that ended without a result, or an error answer without a JSON body
 * (a proxy's page), coded by its HTTP status ("HTTP_502").
 */
export const CLIENT_ERROR_CODES = ['NETWORK', 'ABORTED', 'UPLOAD', 'NO_RESULT'] as const;
export type ClientErrorCode = (typeof CLIENT_ERROR_CODES)[number] | `HTTP_${number}`;

/** Every code an ApiError may carry: the server's closed union or one the client made. */
export type ApiErrorCodeOnClient = ApiErrorCode | ClientErrorCode;

export interface FieldIssue {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: ApiErrorCodeOnClient,
    message: string,
    readonly details?: { fields?: FieldIssue[]; [k: string]: unknown },
  ) {
    super(message);
    this.name = 'ApiError';
  }
  get fields(): FieldIssue[] {
    return this.details?.fields ?? [];
  }
}

type Query = Record<string, string | number | boolean | undefined | null | (string | number)[]>;

export function withQuery(path: string, query?: Query): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) {
    if (v === undefined || v === null || v === '') continue;
    if (Array.isArray(v)) v.forEach((x) => params.append(k, String(x)));
    else params.set(k, String(v));
  }
  const s = params.toString();
  return s ? `${path}?${s}` : path;
}

async function toApiError(res: Response): Promise<ApiError> {
  const body = await res.json().catch(() => null);
  const e = (body as Partial<ApiErrorBody> | null)?.error;
  if (e?.code) return new ApiError(res.status, e.code, e.message ?? res.statusText, e.details as ApiError['details']);
  return new ApiError(res.status, `HTTP_${res.status}`, res.status >= 500 ? 'The server had a problem; try again.' : res.statusText);
}

export async function apiFetch<T>(method: string, path: string, body?: unknown, init: RequestInit = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      credentials: 'same-origin',
      headers: body !== undefined && !(body instanceof FormData) ? { 'Content-Type': 'application/json' } : undefined,
      body: body === undefined ? undefined : body instanceof FormData ? body : JSON.stringify(body),
      ...init,
    });
  } catch {
    throw new ApiError(0, 'NETWORK', 'Cannot reach Pullbook; check the connection and try again.');
  }
  if (!res.ok) throw await toApiError(res);
  if (res.status === 204) return undefined as T;
  return (await res.json()) as T;
}

export const api = {
  get: <T>(path: string, query?: Query) => apiFetch<T>('GET', withQuery(path, query)),
  post: <T>(path: string, body?: unknown) => apiFetch<T>('POST', path, body ?? {}),
  put: <T>(path: string, body?: unknown) => apiFetch<T>('PUT', path, body ?? {}),
  patch: <T>(path: string, body?: unknown) => apiFetch<T>('PATCH', path, body ?? {}),
  delete: <T>(path: string) => apiFetch<T>('DELETE', path),
};

export interface UploadProgress {
  loaded: number;
  total: number;
}

/**
 * Multipart upload with progress events (fetch has none for request bodies, so this uses XHR).
 */
export function uploadWithProgress<T>(path: string, form: FormData, onProgress: (p: UploadProgress) => void, signal?: AbortSignal): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.withCredentials = true;
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => onProgress({ loaded: e.loaded, total: e.lengthComputable ? e.total : 0 });
    xhr.onload = () => {
      const body = xhr.response;
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as T);
      else {
        const e = (body as Partial<ApiErrorBody> | null)?.error;
        reject(new ApiError(xhr.status, e?.code ?? `HTTP_${xhr.status}`, e?.message ?? 'Upload failed', e?.details as ApiError['details']));
      }
    };
    xhr.onerror = () => reject(new ApiError(0, 'NETWORK', 'The upload was interrupted; check the connection and try again.'));
    xhr.onabort = () => reject(new ApiError(0, 'ABORTED', 'Upload cancelled'));
    signal?.addEventListener('abort', () => xhr.abort());
    xhr.send(form);
  });
}

/** Apply server field errors to a react-hook-form form. Returns true if any were applied. */
export function applyFieldErrors(err: unknown, setError: (name: never, e: { message: string }) => void): boolean {
  if (!(err instanceof ApiError) || !err.fields.length) return false;
  for (const f of err.fields) if (f.path) setError(f.path as never, { message: f.message });
  return true;
}
