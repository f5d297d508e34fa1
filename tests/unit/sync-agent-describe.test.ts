import { describe, expect, it } from 'vitest';
import { describeSent } from '@server/sync-agent/agent';
import type { DeviceUploadResponse } from '@shared/schemas/device';

/** The agent's one line per file says where the file landed: the bike on the dyno, or the inbox. */
describe('describeSent', () => {
  it('names the inbox, the pulls found and a file already waiting there', () => {
    const fresh: DeviceUploadResponse = { landing: { kind: 'inbox', itemId: 'i1', duplicate: false, pulls: 3 }, results: [] };
    expect(describeSent(fresh)).toBe('the inbox (nothing was on the dyno): 3 pulls, waiting to be assigned');
    const again: DeviceUploadResponse = { landing: { kind: 'inbox', itemId: 'i1', duplicate: true, pulls: 1 }, results: [] };
    expect(describeSent(again)).toBe('the inbox: already waiting there (1 pull); nothing new was kept');
  });
  it('names the bike on the dyno and counts what could not be read', () => {
    const r: DeviceUploadResponse = {
      landing: { kind: 'dyno', bikeId: 'b', bikeLabel: '2020 Testmake Own', sessionId: 's', stageId: null },
      results: [{ file: 'x.csv', ok: false, error: { code: 'NO_TABLE', message: 'no table' } }],
    };
    expect(describeSent(r)).toBe('2020 Testmake Own: 0 new runs, 1 could not be read');
  });
});
