import { createHash } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { latestMailTo, linkIn } from '../support/mail';
import { PEAKS_HP, seedReportScenario, solidPng } from '../support/report-fixtures';
import { fmtPctChange, fmtPowerGain, fmtRpm, fmtTorqueGain, powerIn, torqueIn } from '@server/modules/reports/figures';
import { Shop } from '@server/modules/shops/shop.entity';
import { ShareLink } from '@server/modules/reports/report.entity';
import { Stage } from '@server/modules/stages/stage.entity';
import type { ComparisonDetailDto } from '@shared/schemas/comparison';

const ARTIFACTS = path.resolve('tests/artifacts');
/** Clears the share look-up counters of every address (supertest's address form varies). */
const resetShareLimits = () => t.deps.orm.em.fork().getConnection().execute("delete from rate_limit where key like 'share:%'");
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let t: TestApp;
let a: TestShop;
let b: TestShop;
let scenario: Awaited<ReturnType<typeof seedReportScenario>>;
let desk: ReturnType<typeof supertest.agent>;
let owner: ReturnType<typeof supertest.agent>;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Northgate Cycle Works');
  b = await t.createShop('Other Garage');
  const em = t.deps.orm.em.fork();
  await em.nativeUpdate(Shop, { id: a.shop.id }, { address: '14 Foundry Lane, Millbrook', phone: '555-0142', email: 'desk@northgate.test' });
  scenario = await seedReportScenario(t, a);
  desk = await t.signIn(a.users.desk);
  owner = await t.signIn(a.users.owner);
  fs.mkdirSync(ARTIFACTS, { recursive: true });
});
afterAll(() => t.close());

/** Binary body of a supertest response. */
function binary(req: supertest.Test) {
  return req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}

function pdfText(pdf: Buffer): string {
  const file = path.join(os.tmpdir(), `pb-report-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, pdf);
  try {
    return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
  } finally {
    fs.rmSync(file, { force: true });
  }
}

function pdfInfo(pdf: Buffer): string {
  const file = path.join(os.tmpdir(), `pb-info-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, pdf);
  try {
    return execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  } finally {
    fs.rmSync(file, { force: true });
  }
}

function renderPage1(pdf: Buffer, name: string): string {
  const file = path.join(ARTIFACTS, `${name}.pdf`);
  fs.writeFileSync(file, pdf);
  execFileSync('pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', '-singlefile', file, path.join(ARTIFACTS, name)]);
  return path.join(ARTIFACTS, `${name}.png`);
}

async function comparisonFigures(agent = desk) {
  const res = await agent.get(`/api/comparisons/${scenario.comparisonId}`);
  expect(res.status).toBe(200);
  return (res.body as ComparisonDetailDto).preview!;
}

describe('shop logo', () => {
  it('accepts a PNG up to 2 MB from the owner and refuses other bytes by their magic number', async () => {
    const png = solidPng(120, 40, [180, 71, 15]);
    const ok = await owner.post('/api/shop-logo').attach('logo', png, { filename: 'logo.png', contentType: 'image/png' });
    expect(ok.status).toBe(200);
    expect(ok.body.format).toBe('png');
    const stored = await binary(owner.get('/api/shop-logo'));
    expect(stored.status).toBe(200);
    expect(sha256(stored.body as Buffer)).toBe(sha256(png));

    // A text file named .png is refused: it does not start with the PNG signature.
    const fake = await owner.post('/api/shop-logo').attach('logo', Buffer.from('not really an image'), { filename: 'logo.png', contentType: 'image/png' });
    expect(fake.status).toBe(415);
    const big = Buffer.concat([png, Buffer.alloc(2 * 1024 * 1024)]);
    expect((await owner.post('/api/shop-logo').attach('logo', big, { filename: 'big.png', contentType: 'image/png' })).status).toBe(413);
    expect((await desk.post('/api/shop-logo').attach('logo', png, { filename: 'logo.png', contentType: 'image/png' })).status).toBe(403);
  });
});

describe('generating a report', () => {
  let first: { id: string; version: number; pdfUrl: string };

  it('makes version 1 stored in object storage with its sha256', async () => {
    const res = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId, technicianNote: 'Re-torque the exhaust clamps after the first 300 miles.' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: 1, pdfUrl: `/api/reports/${res.body.id}/pdf` });
    first = res.body;
    const pdf = await binary(desk.get(first.pdfUrl));
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toMatch(/^application\/pdf/);
    const bytes = pdf.body as Buffer;
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
    const detail = (await desk.get(`/api/reports/${first.id}`)).body;
    expect(detail.number).toMatch(/^R-\d{4}-\d{4}$/);
    expect(detail.pdfSha256).toBe(sha256(bytes));
    const stored = await t.deps.storage.getBuffer(`shops/${a.shop.id}/reports/${detail.number}/v1.pdf`);
    expect(sha256(stored)).toBe(detail.pdfSha256);
    renderPage1(bytes, 'report-page1');
  });

  it('prints the comparison API’s gain figures, formatted the same way', async () => {
    const preview = await comparisonFigures();
    const text = pdfText((await binary(desk.get(first.pdfUrl))).body as Buffer);
    expect(preview.results).toHaveLength(2);
    for (const r of preview.results) {
      expect(text).toContain(fmtPowerGain(r.peakPowerGain.hp, 'imperial'));
      expect(text).toContain(fmtTorqueGain(r.peakTorqueGain.lbft, 'imperial'));
      expect(text).toContain(fmtPctChange(r.areaGainPct));
      expect(text).toContain(fmtPowerGain(r.averagePowerGainHp, 'imperial'));
    }
    const last = preview.results[1];
    for (const band of last.bands) expect(text).toContain(fmtPowerGain(band.averagePowerGainHp, 'imperial'));
    expect(text).toContain(`${fmtPowerGain(last.largestGain.hp, 'imperial')} at ${fmtRpm(last.largestGain.rpm)}`);
    // Peaks were set by construction and the runs sit at SAE J1349 reference air (factor exactly 1):
    // 103.5 − 85 = +18.5 hp and 92 − 85 = +7.0 hp.
    expect(last.peakPowerGain.hp).toBeCloseTo(PEAKS_HP.stage2 - PEAKS_HP.baseline, 2);
    expect(text).toContain('+18.5 hp');
    expect(text).toContain('+7.0 hp');
  });

  it('prints shop, customer, bike, stages and costs, conditions, note, cautions and page numbers', async () => {
    const text = pdfText((await binary(desk.get(first.pdfUrl))).body as Buffer);
    for (const s of ['Northgate Cycle Works', '14 Foundry Lane, Millbrook', '555-0142', a.customer.name, 'Testmake Own', 'Baseline', 'Stage 1', 'Stage 2', 'Two-into-one stainless system', '$899.00', '$720.00', 'SAE J1349', 'Re-torque the exhaust clamps', 'ISO 4106', 'emissions', 'warranty', 'insurance', 'local law', 'Page 1 of 2', 'Page 2 of 2']) {
      expect(text, s).toContain(s);
    }
    // Cost of the work after the baseline ÷ peak power gain: (899 + 180 + 450 + 549 + 720) / 18.5 = $151 per hp.
    const costDollars = 899 + 180 + 450 + 549 + 720;
    expect(text).toContain(`$${Math.round(costDollars / (PEAKS_HP.stage2 - PEAKS_HP.baseline))}`);
    expect(text).toMatch(/Baseline: 2 runs|Repeatability|run-to-run/);
  });

  it('prints the air conditions in the shop’s units (°F and inHg here) and says what correction was done', async () => {
    const text = pdfText((await binary(desk.get(first.pdfUrl))).body as Buffer);
    // 25 °C × 9/5 + 32 = 77.0 °F; 99 kPa ÷ 3.38638 kPa/inHg (32 °F) = 29.235 inHg (NIST SP 811).
    expect(text).toContain('77.0 °F');
    expect(text).toContain('29.23 inHg');
    expect(text).not.toContain('25.0 °C');
    expect(text).not.toContain('99.0 kPa');
    expect(text).toContain('Corrected to SAE J1349');
  });


  it('embeds the shop logo as an image', async () => {
    const file = path.join(os.tmpdir(), `pb-img-${process.pid}.pdf`);
    fs.writeFileSync(file, (await binary(desk.get(first.pdfUrl))).body as Buffer);
    const list = execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' });
    fs.rmSync(file);
    expect(list.split('\n').filter((l) => /^\s*1\s/.test(l)).length).toBeGreaterThanOrEqual(1);
  });

  it('regenerating makes version 2 with the same number and leaves version 1 as it was', async () => {
    const v1 = (await desk.get(`/api/reports/${first.id}`)).body;
    const res = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId });
    expect(res.status).toBe(201);
    expect(res.body.version).toBe(2);
    const v2 = (await desk.get(`/api/reports/${res.body.id}`)).body;
    expect(v2.number).toBe(v1.number);
    expect(v2.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    // The note carries over when not given again.
    expect(v2.technicianNote).toBe(v1.technicianNote);
    const stored1 = await t.deps.storage.getBuffer(`shops/${a.shop.id}/reports/${v1.number}/v1.pdf`);
    expect(sha256(stored1)).toBe(v1.pdfSha256);
    const list = await desk.get('/api/reports').query({ bikeId: a.bike.id });
    expect(list.body.items.map((r: { version: number }) => r.version)).toEqual([2, 1]);
  });

  it('prints kW and N·m on A4 when the shop says so', async () => {
    const em = t.deps.orm.em.fork();
    await em.nativeUpdate(Shop, { id: a.shop.id }, { units: 'metric', paperSize: 'a4' });
    try {
      const res = await desk.post('/api/reports').send({ comparisonId: scenario.comparisonId });
      expect(res.status).toBe(201);
      const pdf = (await binary(desk.get(res.body.pdfUrl))).body as Buffer;
      // A4 is 210 × 297 mm = 595.28 × 841.89 pt (ISO 216).
      expect(pdfInfo(pdf)).toMatch(/Page size:\s+595\.2\d? x 841\.8\d?/);
      const text = pdfText(pdf);
      const last = (await comparisonFigures()).results[1];
      expect(text).toContain(fmtPowerGain(last.peakPowerGain.hp, 'metric'));
      expect(text).toContain(fmtTorqueGain(last.peakTorqueGain.lbft, 'metric'));
      // 18.5 hp × 0.7456999 kW/hp (NIST SP 811) = 13.8 kW.
      expect(powerIn(18.5, 'metric')).toBeCloseTo(13.795, 3);
      expect(torqueIn(1, 'metric')).toBeCloseTo(1.355818, 6);
      expect(text).toContain('+13.8 kW');
      // Air in the metric shop's own units: the stored 25 °C and 99 kPa.
      expect(text).toContain('25.0 °C');
      expect(text).toContain('99.0 kPa');
      expect(text).not.toContain(' hp ');
      renderPage1(pdf, 'report-page1-metric-a4');
    } finally {
      await em.nativeUpdate(Shop, { id: a.shop.id }, { units: 'imperial', paperSize: 'letter' });
    }
  });

  it('answers 404 for another shop’s comparison and report', async () => {
    const otherDesk = await t.signIn(b.users.desk);
    expect((await otherDesk.post('/api/reports').send({ comparisonId: scenario.comparisonId })).status).toBe(404);
    expect((await otherDesk.get(`/api/reports/${first.id}`)).status).toBe(404);
    expect((await otherDesk.get(first.pdfUrl)).status).toBe(404);
    expect((await otherDesk.get('/api/reports').query({ bikeId: a.bike.id })).body.items).toEqual([]);
  });
});

describe('customers', () => {
  it('see and download reports of their own bikes only, and cannot send or share', async () => {
    const customer = await t.signIn(a.users.customer);
    const list = await customer.get('/api/reports').query({ bikeId: a.bike.id });
    expect(list.status).toBe(200);
    expect(list.body.items.length).toBeGreaterThan(0);
    const id = list.body.items[0].id;
    const pdf = await binary(customer.get(`/api/reports/${id}/pdf`));
    expect(pdf.status).toBe(200);
    expect(sha256(pdf.body as Buffer)).toBe(list.body.items[0].pdfSha256);
    expect((await customer.get('/api/reports').query({ bikeId: a.otherBike.id })).body.items).toEqual([]);
    expect((await customer.post(`/api/reports/${id}/send`).send({ to: 'x@y.test', message: 'hi' })).status).toBe(403);
    expect((await customer.post(`/api/reports/${id}/share`).send({})).status).toBe(403);
    expect((await customer.post('/api/reports').send({ comparisonId: scenario.comparisonId })).status).toBe(403);
  });
});

describe('sending', () => {
  it('e-mails the stored PDF (same sha256) with a working share link and logs the delivery', async () => {
    const [report] = (await desk.get('/api/reports').query({ bikeId: a.bike.id })).body.items;
    const to = a.customer.email!;
    const res = await desk.post(`/api/reports/${report.id}/send`).send({ to, message: 'Hello, here is your report.' });
    expect(res.status).toBe(201);
    expect(res.body.status).toBe('sent');
    const mail = await latestMailTo(to);
    expect(mail.subject).toContain(report.number);
    expect(mail.text).toContain('Hello, here is your report.');
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0].contentType).toBe('application/pdf');
    expect(sha256(mail.attachments[0].content)).toBe(report.pdfSha256);
    const token = linkIn(mail.text, '/share/');
    expect(token).toHaveLength(43);
    expect((await t.request.get(`/api/share/${token}`)).status).toBe(200);
    const log = await desk.get(`/api/reports/${report.id}/deliveries`);
    expect(log.body.items[0]).toMatchObject({ to, status: 'sent', error: null });
  });

  it('sends an HTML e-mail with a plain-text part, from the shop’s name, greeting the customer', async () => {
    const [report] = (await desk.get('/api/reports').query({ bikeId: a.bike.id })).body.items;
    const to = a.customer.email!;
    const res = await desk.post(`/api/reports/${report.id}/send`).send({ to, message: 'Your bike made more power across the range.\n\nCall us with any question.' });
    expect(res.status).toBe(201);
    const mail = await latestMailTo(to);
    // From the shop's name on the configured sender address.
    expect(mail.from?.value[0].name).toBe('Northgate Cycle Works');
    const first = a.customer.name.split(/\s+/)[0];
    for (const part of [mail.text, String(mail.html)]) {
      expect(part).toContain(`Hello ${first},`);
      expect(part).toContain('Your bike made more power across the range.');
      expect(part).toContain('Call us with any question.');
      expect(part).toContain('/share/');
    }
    expect(String(mail.html)).toMatch(/<html[^>]*lang="en"/);
    expect(mail.text).not.toMatch(/<[a-z]/i);
    expect((await (await t.signIn(a.users.desk)).get(`/api/share/${linkIn(String(mail.html), '/share/')}`)).status).toBe(200);
  });

  it('logs a failed delivery with the relay’s error', async () => {
    const [report] = (await desk.get('/api/reports').query({ bikeId: a.bike.id })).body.items;
    const original = t.deps.mailer.send;
    t.deps.mailer.send = async () => {
      throw new Error('550 mailbox unavailable');
    };
    try {
      const res = await desk.post(`/api/reports/${report.id}/send`).send({ to: 'nobody@nowhere.test', message: 'Hi' });
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('MAIL_FAILED');
    } finally {
      t.deps.mailer.send = original;
    }
    const log = await desk.get(`/api/reports/${report.id}/deliveries`);
    expect(log.body.items[0]).toMatchObject({ to: 'nobody@nowhere.test', status: 'failed', error: '550 mailbox unavailable' });
  });

  it('validates the recipient', async () => {
    const [report] = (await desk.get('/api/reports').query({ bikeId: a.bike.id })).body.items;
    const res = await desk.post(`/api/reports/${report.id}/send`).send({ to: 'not-an-address', message: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['to', 'message']));
  });
});

describe('share links', () => {
  let reportId: string;
  let token: string;
  let shareId: string;

  beforeAll(async () => {
    reportId = (await desk.get('/api/reports').query({ bikeId: a.bike.id })).body.items[0].id;
    await resetShareLimits();
  });

  it('creates a 256-bit token, stores only its hash, and counts views', async () => {
    const res = await desk.post(`/api/reports/${reportId}/share`).send({});
    expect(res.status).toBe(201);
    const url = new URL(res.body.url);
    token = url.pathname.split('/').pop()!;
    shareId = res.body.id;
    // 32 random bytes in base64url = 43 characters (RFC 4648 §5, no padding).
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const days = (new Date(res.body.expiresAt).getTime() - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(29.9);
    expect(days).toBeLessThanOrEqual(30);
    const row = await t.deps.orm.em.fork().findOneOrFail(ShareLink, { id: shareId });
    expect(row.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(row.tokenHash).not.toContain(token);

    const view = await t.request.get(`/api/share/${token}`);
    expect(view.status).toBe(200);
    expect(view.body.shopName).toBe('Northgate Cycle Works');
    expect(view.body.curves.length).toBe(3);
    const json = JSON.stringify(view.body);
    for (const secret of [a.customer.email!, a.customer.name, '555-0142', 'desk@northgate.test', a.otherBike.id, 'Other']) expect(json).not.toContain(secret);
    await t.request.get(`/api/share/${token}`);
    const links = await desk.get(`/api/reports/${reportId}/share`);
    expect(links.body.items.find((l: { id: string }) => l.id === shareId).viewCount).toBe(2);
    const pdf = await binary(t.request.get(`/api/share/${token}/pdf`));
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toMatch(/^application\/pdf/);
  });

  it('answers unknown, expired and revoked tokens with the same 404', async () => {
    const unknown = await t.request.get(`/api/share/${'A'.repeat(43)}`);
    expect(unknown.status).toBe(404);
    const malformed = await t.request.get('/api/share/short');
    expect(malformed.status).toBe(404);
    expect(malformed.body).toEqual(unknown.body);

    const exp = await desk.post(`/api/reports/${reportId}/share`).send({ expiresInDays: 1 });
    const expToken = new URL(exp.body.url).pathname.split('/').pop()!;
    await t.deps.orm.em.fork().nativeUpdate(ShareLink, { id: exp.body.id }, { expiresAt: new Date(Date.now() - 1000) });
    const expired = await t.request.get(`/api/share/${expToken}`);
    expect(expired.status).toBe(404);
    expect(expired.body).toEqual(unknown.body);
    expect((await t.request.get(`/api/share/${expToken}/pdf`)).status).toBe(404);

    // Another shop cannot revoke it; the owner shop can.
    const otherDesk = await t.signIn(b.users.desk);
    expect((await otherDesk.delete(`/api/reports/${reportId}/share/${shareId}`)).status).toBe(404);
    expect((await desk.delete(`/api/reports/${reportId}/share/${shareId}`)).status).toBe(200);
    const revoked = await t.request.get(`/api/share/${token}`);
    expect(revoked.status).toBe(404);
    expect(revoked.body).toEqual(unknown.body);
    const links = (await desk.get(`/api/reports/${reportId}/share`)).body.items;
    expect(links.find((l: { id: string }) => l.id === shareId).status).toBe('revoked');
  });

  it('rate-limits look-ups per address', async () => {
    await resetShareLimits();
    const statuses: number[] = [];
    for (let i = 0; i < 62; i++) statuses.push((await t.request.get(`/api/share/${'B'.repeat(43)}`)).status);
    expect(statuses.slice(0, 60).every((s) => s === 404)).toBe(true);
    expect(statuses[61]).toBe(429);
    await resetShareLimits();
  });
});

describe('cost per hp with a stage left out of the comparison (hand-computed)', () => {
  it('counts every stage from the baseline’s to the compared run’s, and says which', async () => {
    const { r0, r1, r2 } = scenario.runs;
    const saved = await desk.post('/api/comparisons').send({ name: 'Stage 2 straight against baseline', runIds: [r0.id, r2.id], baselineRunId: r0.id, options: { correction: 'sae-j1349' } });
    expect(saved.status).toBe(201);
    const made = await desk.post('/api/reports').send({ comparisonId: saved.body.id });
    expect(made.status).toBe(201);
    const detail = (await desk.get(`/api/reports/${made.body.id}`)).body;
    // Hand-computed from the fixture's parts: Stage 1 = 899.00 + 180.00 + 0 + 450.00 = 1,529.00;
    // Stage 2 = 549.00 + 720.00 = 1,269.00; together 2,798.00. Peak gain 103.5 − 85 = 18.5 hp
    // (set by construction, SAE J1349 reference air, factor 1): 2,798.00 / 18.5 = 151.24 → "$151 per hp".
    expect(detail.data.cost).toMatchObject({ totalCostCents: 279_800, fromStageName: 'Baseline', stageNames: ['Stage 1', 'Stage 2'] });
    expect(detail.data.cost.gainHp).toBeCloseTo(18.5, 2);
    // Stage 1 is listed with its parts although no run of it is in the comparison.
    expect(detail.data.stages.map((s: { name: string }) => s.name)).toEqual(['Baseline', 'Stage 1', 'Stage 2']);
    const text = pdfText((await binary(desk.get(made.body.pdfUrl))).body as Buffer).replace(/\s+/g, ' ');
    expect(text).toContain('$2,798.00');
    expect(text).toContain('$151');
    expect(text).toContain('Stage 1 and Stage 2 (all work after Baseline)');
    renderPage1((await binary(desk.get(made.body.pdfUrl))).body as Buffer, 'report-cost-page1');

    // The bike page's stage timeline uses the same rule and the same numbers.
    const em = t.deps.orm.em.fork();
    await em.nativeUpdate(Stage, { id: scenario.stages.base.id }, { referenceRun: r0.id } as never);
    await em.nativeUpdate(Stage, { id: scenario.stages.s1.id }, { referenceRun: r1.id } as never);
    await em.nativeUpdate(Stage, { id: scenario.stages.s2.id }, { referenceRun: r2.id } as never);
    const tl = (await desk.get('/api/comparisons/timeline').query({ bikeId: a.bike.id, correction: 'sae-j1349' })).body;
    const st2 = tl.stages.find((s: { name: string }) => s.name === 'Stage 2');
    expect(st2.cumulativeCostCents - tl.stages.find((s: { name: string }) => s.name === 'Baseline').cumulativeCostCents).toBe(279_800);
    expect(st2.vsBaseline.peakPowerHp).toBeCloseTo(detail.data.cost.gainHp, 6);
    // 279 800 / 18.5 = 15 124.3 cents per hp.
    expect(st2.cumulativeCostPerHp.peakCents).toBeCloseTo(279_800 / 18.5, 0);
  });
});

describe('a comparison printed as measured', () => {
  it('names an uncorrected comparison in plain words, never "Corrected to Uncorrected"', async () => {
    const tuner = await t.signIn(a.users.tuner);
    const { r0, r2 } = scenario.runs;
    const cmp = await tuner.post('/api/comparisons').send({ name: 'As measured', runIds: [r0.id, r2.id], baselineRunId: r0.id, options: { correction: 'none' } });
    expect(cmp.status).toBe(201);
    const res = await desk.post('/api/reports').send({ comparisonId: cmp.body.id });
    expect(res.status).toBe(201);
    const text = pdfText((await binary(desk.get(res.body.pdfUrl))).body as Buffer);
    expect(text).toContain('Uncorrected (as measured)');
    expect(text).not.toContain('Corrected to Uncorrected');
    expect(text).not.toContain('corrected every run to Uncorrected');
  });
});

describe('long unbroken words in the PDF header', () => {
  /** Every word's box on every page, from pdftotext -bbox (points). */
  function wordBoxes(pdf: Buffer): { pageWidth: number; words: { text: string; xMax: number }[] } {
    const file = path.join(os.tmpdir(), `pb-report-bbox-${process.pid}-${Date.now()}.pdf`);
    fs.writeFileSync(file, pdf);
    try {
      const html = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
      const pageWidth = Number(/<page width="([\d.]+)"/.exec(html)?.[1]);
      const words = [...html.matchAll(/<word xMin="[\d.]+" yMin="[\d.]+" xMax="([\d.]+)" yMax="[\d.]+">([^<]*)<\/word>/g)].map((m) => ({ xMax: Number(m[1]), text: m[2] }));
      return { pageWidth, words };
    } finally {
      fs.rmSync(file, { force: true });
    }
  }

  it('breaks a shop name, address and note typed without spaces inside the page instead of running off it', async () => {
    const longName = 'Overlongworkshopnamewithoutanyspaces'.repeat(4);
    const em = t.deps.orm.em.fork();
    await em.nativeUpdate(Shop, { id: b.shop.id }, { name: longName, address: 'Unit' + '7'.repeat(140) });
    const sc = await seedReportScenario(t, b);
    const deskB = await t.signIn(b.users.desk);
    const res = await deskB.post('/api/reports').send({ comparisonId: sc.comparisonId, technicianNote: 'Checked'.repeat(40) });
    expect(res.status).toBe(201);
    const { pageWidth, words } = wordBoxes((await binary(deskB.get(res.body.pdfUrl))).body as Buffer);
    expect(pageWidth).toBeGreaterThan(500);
    // The name is there, in pieces, and nothing reaches past the page's right edge.
    expect(words.some((w) => w.text.startsWith('Overlong'))).toBe(true);
    const outside = words.filter((w) => w.xMax > pageWidth);
    expect(outside).toEqual([]);
  });
});
