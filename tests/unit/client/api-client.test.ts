import { afterEach, describe, expect, it, vi } from 'vitest';
import { API_ERROR_CODES } from '@shared/errors';
import { ApiError, CLIENT_ERROR_CODES, api } from '@/lib/api-client';

afterEach(() => vi.unstubAllGlobals());

describe('ApiError codes', () => {
  it('carries the server’s code and field messages from an error answer', async () => {
    const body = { error: { code: 'VALIDATION_FAILED', message: 'Check the fields', details: { fields: [{ path: 'email', message: 'Enter an e-mail address' }] } } };
    vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify(body), { status: 400 })));
    const err = await api.post('/api/customers', {}).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect(err).toMatchObject({ status: 400, code: 'VALIDATION_FAILED', fields: [{ path: 'email', message: 'Enter an e-mail address' }] });
  });

  it('codes an answer without a JSON error by its status, and a lost connection as NETWORK', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => new Response('<html>Bad gateway</html>', { status: 502 })));
    await expect(api.get('/api/runs')).rejects.toMatchObject({ status: 502, code: 'HTTP_502' });
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(api.get('/api/runs')).rejects.toMatchObject({ status: 0, code: 'NETWORK' });
  });

  it('the client’s own codes never collide with a code the server sends', () => {
    const server = new Set<string>(API_ERROR_CODES);
    expect(CLIENT_ERROR_CODES.filter((c) => server.has(c))).toEqual([]);
  });
});
