/**
 * A logo is judged by its header before anything decodes it. A 2 kB PNG that claims 8000 × 8000
 * px (a decompression bomb: 64 MP, 256 MB of RGBA once decoded) is refused at upload, and a report
 * never decodes such a logo even when one is already stored (left out of the PDF instead).
 * Header layout: W3C PNG 2nd ed. §5.2–5.3 (signature, IHDR width and height, big-endian).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { seedReportScenario, solidPng } from '../support/report-fixtures';
import { Shop } from '@server/modules/shops/shop.entity';

let t: TestApp;
let a: TestShop;

/** A real small PNG whose IHDR is rewritten to claim other dimensions (the CRC no longer matches, as in a crafted file). */
function claiming(width: number, height: number): Buffer {
  const png = Buffer.from(solidPng(16, 16, [10, 20, 30]));
  png.writeUInt32BE(width, 16);
  png.writeUInt32BE(height, 20);
  return png;
}

function imagesIn(pdf: Buffer): number {
  const file = path.join(os.tmpdir(), `pb-logo-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, pdf);
  try {
    return execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' }).split('\n').filter((l) => /^\s*\d+\s+\d+\s+image/.test(l)).length;
  } finally {
    fs.rmSync(file, { force: true });
  }
}

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Logo Guard');
});
afterAll(async () => t?.close());

describe('logo dimensions', () => {
  it('refuses a PNG that claims 8000 × 8000 px with 422 IMAGE_TOO_LARGE, and accepts 2000 × 2000', async () => {
    const owner = await t.signIn(a.users.owner);
    const bomb = await owner.post('/api/shop-logo').attach('logo', claiming(8000, 8000), { filename: 'logo.png', contentType: 'image/png' });
    expect(bomb.status).toBe(422);
    expect(bomb.body.error.code).toBe('IMAGE_TOO_LARGE');
    expect(bomb.body.error.message).toContain('8000 × 8000 px');
    const shop = await t.deps.orm.em.fork().findOneOrFail(Shop, a.shop.id);
    expect(shop.logoKey).toBeNull();
    const edge = await owner.post('/api/shop-logo').attach('logo', claiming(2000, 2000), { filename: 'logo.png', contentType: 'image/png' });
    expect(edge.status).toBe(200);
  });

  it('leaves an oversized stored logo out of the report instead of decoding it', async () => {
    const scenario = await seedReportScenario(t, a);
    const key = `shops/${a.shop.id}/logo/stored-before-the-rule.png`;
    await t.deps.storage.put(key, claiming(8000, 8000), { contentType: 'image/png' });
    await t.deps.orm.em.fork().nativeUpdate(Shop, { id: a.shop.id }, { logoKey: key });
    const desk = await t.signIn(a.users.desk);
    const res = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId });
    expect(res.status).toBe(201);
    const pdf = await desk.get(res.body.pdfUrl).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(pdf.status).toBe(200);
    expect(imagesIn(pdf.body as Buffer)).toBe(0);
  });
});
