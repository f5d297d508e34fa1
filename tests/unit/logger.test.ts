/**
 * The access log: one JSON line per request with request id, user, shop, status and time, and no
 * secret in it — credentials, cookies and the tokens inside share, invitation and reset URLs.
 */
import { describe, expect, it } from 'vitest';
import express from 'express';
import request from 'supertest';
import { Writable } from 'node:stream';
import { createLogger, httpLogger, safeUrl } from '../../server/lib/logger';

function capture() {
  const lines: string[] = [];
  const destination = new Writable({
    write(chunk, _enc, done) {
      lines.push(...String(chunk).split('\n').filter(Boolean));
      done();
    },
  });
  return { lines, logger: createLogger({ destination, level: 'info' }) };
}

describe('access log', () => {
  it('writes one line per request with ids, status and time, and redacts secrets', async () => {
    const { lines, logger } = capture();
    const app = express();
    app.use((req, _res, next) => {
      (req as express.Request & { user?: object }).user = { id: 'user-1', shopId: 'shop-9' };
      next();
    });
    app.use(httpLogger(logger));
    app.get('/api/share/:token', (_req, res) => {
      res.json({ ok: true });
    });
    await request(app)
      .get('/api/share/S3cretShareToken_abc?token=alsoSecret')
      .set('Authorization', 'Bearer device-secret-123')
      .set('Cookie', 'pullbook.sid=s%3Asession-secret')
      .set('X-Request-Id', 'req-42')
      .expect(200)
      .expect('X-Request-Id', 'req-42');
    expect(lines).toHaveLength(1);
    const line = JSON.parse(lines[0]);
    expect(line).toMatchObject({ level: 'info', userId: 'user-1', shopId: 'shop-9', res: { status: 200 }, req: { id: 'req-42', method: 'GET', url: '/api/share/[redacted]?token=[redacted]' } });
    expect(typeof line.responseTime).toBe('number');
    for (const secret of ['S3cretShareToken_abc', 'alsoSecret', 'device-secret-123', 'session-secret']) expect(lines[0]).not.toContain(secret);
  });

  it('logs a server error at error level and makes a request id when none is given', async () => {
    const { lines, logger } = capture();
    const app = express();
    app.use(httpLogger(logger));
    app.get('/boom', (_req, res) => {
      res.status(500).json({});
    });
    const res = await request(app).get('/boom').expect(500);
    const line = JSON.parse(lines[0]);
    expect(line.level).toBe('error');
    expect(line.req.id).toMatch(/^[0-9a-f]{8}$/);
    expect(res.headers['x-request-id']).toBe(line.req.id);
  });

  it('redacts passwords and tokens inside logged objects', () => {
    const { lines, logger } = capture();
    logger.info({ body: { email: 'a@b.test', password: 'hunter2-long-pass', token: 'tok-1' } }, 'sign-in body');
    expect(lines[0]).not.toContain('hunter2-long-pass');
    expect(lines[0]).not.toContain('tok-1');
    expect(JSON.parse(lines[0]).body.email).toBe('a@b.test');
  });

  it('keeps URLs without tokens as they are', () => {
    expect(safeUrl('/api/runs?page=2&q=exhaust')).toBe('/api/runs?page=2&q=exhaust');
    expect(safeUrl('/invite/abc/def')).toBe('/invite/[redacted]/def');
  });
});
