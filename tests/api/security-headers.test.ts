/**
 * Security headers (server/middleware/security-headers.ts): strict CSP with scripts from self
 * only, frame-ancestors 'none', Permissions-Policy, HSTS only on https.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app';

let t: TestApp;
let https: TestApp;
const clientDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pb-client-'));

/** The CSP's directives by name. */
function csp(header: string | undefined): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const part of (header ?? '').split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) out.set(name, values);
  }
  return out;
}

beforeAll(async () => {
  fs.writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Pullbook</title><div id="root"></div><script type="module" src="/assets/app.js"></script>');
  t = await createTestApp({ clientDir, workers: false });
  https = await createTestApp({ clientDir, workers: false, env: { PUBLIC_URL: 'https://pullbook.example.test' } });
});
afterAll(async () => {
  await t.close();
  await https.close();
  fs.rmSync(clientDir, { recursive: true, force: true });
});

describe('security headers', () => {
  it('serve the app shell with a strict CSP: scripts from self only, no inline script, never framed', async () => {
    const res = await t.request.get('/runs');
    expect(res.status).toBe(200);
    const d = csp(res.headers['content-security-policy']);
    expect(d.get('script-src')).toEqual(["'self'"]);
    expect(d.get('script-src-attr')).toEqual(["'none'"]);
    expect(d.get('default-src')).toEqual(["'self'"]);
    expect(d.get('frame-ancestors')).toEqual(["'none'"]);
    expect(d.get('style-src')).toEqual(["'self'"]);
    expect(d.has('upgrade-insecure-requests')).toBe(false);
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('same-origin');
    expect(res.headers['permissions-policy']).toMatch(/camera=\(\)/);
    expect(res.headers['permissions-policy']).toMatch(/geolocation=\(\)/);
    expect(res.headers['permissions-policy']).toMatch(/microphone=\(\)/);
  });

  it('send HSTS only when PUBLIC_URL is https', async () => {
    expect((await t.request.get('/api/health')).headers['strict-transport-security']).toBeUndefined();
    const res = await https.request.get('/api/health');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=31536000/);
    expect(csp(res.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(true);
  });

  it('put the same headers on API answers, errors included', async () => {
    const res = await t.request.get('/api/no-such-route');
    expect(res.status).toBe(404);
    expect(csp(res.headers['content-security-policy']).get('frame-ancestors')).toEqual(["'none'"]);
    expect(res.headers['permissions-policy']).toBeTruthy();
  });

  it('let a report PDF be framed by the app itself and nothing else', async () => {
    const res = await t.request.get('/api/share/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA/pdf');
    expect(csp(res.headers['content-security-policy']).get('frame-ancestors')).toEqual(["'self'"]);
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
  });

  it.skipIf(!process.env.PULLBOOK_CLIENT_DIR)('the built client has no inline script or style element for the CSP to block', () => {
    const html = fs.readFileSync(path.join(process.env.PULLBOOK_CLIENT_DIR!, 'index.html'), 'utf8');
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attrs, body] of scripts) {
      expect(attrs).toMatch(/\bsrc=/);
      expect(body.trim()).toBe('');
    }
    expect(html).not.toMatch(/<style\b/i);
    expect(html).not.toMatch(/\son[a-z]+=/i);
  });
});
