/** A file uploaded again that is already archived but was never read: the answer says so. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { runFile as file, uploadRuns as upload, type Agent } from '../support/run-fixtures';

let t: TestApp;
let a: TestShop;
let tuner: Agent;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Duplicate Upload Shop');
  tuner = await t.signIn(a.users.tuner);
});
afterAll(() => t.close());

describe('uploading again a file archived as unreadable', () => {
  it('answers that the stored copy could not be read and points at the mapping', async () => {
    // A log without power or torque columns needs mapping by hand (NO_POWER_OR_TORQUE).
    const noLoad = { name: 'no-load.csv', bytes: file(401, {}, { columns: ['time', 'rpm', 'afr'] }) };
    const first = await upload(tuner, a.bike.id, [noLoad]);
    expect(first.body.results[0]).toMatchObject({ ok: false, error: { code: 'NO_POWER_OR_TORQUE' } });
    const again = await upload(tuner, a.bike.id, [noLoad]);
    expect(again.status).toBe(201);
    const r = again.body.results[0];
    expect(r).toMatchObject({ ok: true, duplicate: true, run: { id: first.body.results[0].runId, status: 'needs-mapping' } });
    expect(r.message).toContain('The stored copy could not be read');
    expect(r.message).toContain('Choose its columns to read it.');

    const headerOnly = { name: 'header-only.csv', bytes: Buffer.from('Engine Speed [rpm],Torque [lb-ft],Power [hp]\n') };
    await upload(tuner, a.bike.id, [headerOnly]);
    const failed = (await upload(tuner, a.bike.id, [headerOnly])).body.results[0];
    expect(failed).toMatchObject({ ok: true, duplicate: true, run: { status: 'failed' } });
    expect(failed.message).toContain('The stored copy could not be read');
  });
});
