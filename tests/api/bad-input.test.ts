/**
 * Malformed requests answer 400 or 415 with a clear code, never 500; long upload names and types
 * are shortened and kept.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';

let t: TestApp;
let s: TestShop;
let tuner: Awaited<ReturnType<TestApp['signIn']>>;

beforeAll(async () => {
  t = await createTestApp({ workers: false });
  s = await t.createShop('Bad Input Shop');
  tuner = await t.signIn(s.users.tuner);
});
afterAll(() => t.close());

const code = (res: supertest.Response) => [res.status, res.body?.error?.code];

describe('malformed requests', () => {
  it('a truncated multipart upload: 400 MALFORMED_MULTIPART', async () => {
    const res = await tuner
      .post('/api/runs')
      .set('Content-Type', 'multipart/form-data; boundary=XyZ')
      .send(Buffer.from(`--XyZ\r\nContent-Disposition: form-data; name="bikeId"\r\n\r\n${s.bike.id}\r\n--XyZ\r\nContent-Disposition: form-data; name="files"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\nrpm,hp\r\n1,2`));
    expect(code(res)).toEqual([400, 'MALFORMED_MULTIPART']);
  });

  it('an unsupported Content-Encoding: 415 UNSUPPORTED_ENCODING', async () => {
    const json = await t.request.post('/api/auth/login').set('Content-Type', 'application/json').set('Content-Encoding', 'x-snappy').send('{"email":"a@b.test","password":"x"}');
    expect(code(json)).toEqual([415, 'UNSUPPORTED_ENCODING']);
    const upload = await tuner.post('/api/runs').set('Content-Encoding', 'gzip').field('bikeId', s.bike.id).attach('files', Buffer.from('rpm,hp\n1,2\n'), 'a.csv');
    expect(code(upload)).toEqual([415, 'UNSUPPORTED_ENCODING']);
  });

  it('bad percent-encoding in the path: 400 BAD_ENCODING', async () => {
    expect(code(await tuner.get('/api/bikes/%E0%A4%A'))).toEqual([400, 'BAD_ENCODING']);
    expect(code(await tuner.get('/api/runs/%'))).toEqual([400, 'BAD_ENCODING']);
  });

  it('invalid dates and out-of-range years in build search: 400 with the field named', async () => {
    for (const q of ['from=2024-02-31', 'to=2024-13-01', 'from=0000-01-01', 'to=99999-01-01']) {
      const res = await tuner.get(`/api/builds/search?${q}`);
      expect(code(res), q).toEqual([400, 'VALIDATION_FAILED']);
    }
  });

  it('a forged cursor with an impossible date: 400, not 500', async () => {
    const cursor = Buffer.from(JSON.stringify({ s: 'date', k: '2024-99-99', id: '00000000-0000-4000-8000-000000000000' })).toString('base64url');
    const res = await tuner.get(`/api/builds/search?sort=date&cursor=${cursor}`);
    expect(res.status).toBe(400);
    expect(['BAD_CURSOR', 'INVALID_VALUE']).toContain(res.body.error.code);
  });
});

describe('long upload names', () => {
  it('keeps a file whose name is over 300 characters and whose type is over 120, shortened', async () => {
    const name = `${'long-name-'.repeat(40)}.csv`;
    const res = await tuner
      .post('/api/runs')
      .field('bikeId', s.bike.id)
      .attach('files', Buffer.from('rpm,hp\n1,2\n'), { filename: name, contentType: `text/csv; note=${'x'.repeat(150)}` });
    expect(res.status).toBe(201);
    const [result] = res.body.results;
    expect(JSON.stringify(result)).not.toMatch(/SAVE_FAILED|try again/i);
    const [row] = (await t.deps.orm.em.fork().getConnection().execute(`select original_name, content_type from run where bike_id = ? order by created_at desc limit 1`, [s.bike.id])) as { original_name: string; content_type: string }[];
    expect(Array.from(row.original_name).length).toBe(300);
    expect(row.original_name.endsWith('….csv')).toBe(true);
    expect(row.content_type).toBe('text/csv');
  });
});
