/**
 * Runs for the other pulls of a log: a file that could only be read after a hand mapping (or an
 * engine-speed ratio) may turn out to hold several pulls. Its first run takes its own pull; each
 * other pull that has no run yet becomes a new run on the same stored raw file.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { Run } from './run.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import type { AnalysisOutcome } from './run-analysis';
import { applyOutcome } from './run-outcome';
import { nextSequence } from './run-sequence';

/** Creates a run for each readable pull of `from`'s raw file that has none yet; answers their ids. Call inside a transaction. */
export async function addMissingPullRuns(em: EntityManager, actor: Actor, from: Run, outcomes: AnalysisOutcome[]): Promise<string[]> {
  const wanted = outcomes.filter((o) => o.status === 'ready' && o.pullIndex !== from.pullIndex);
  if (!wanted.length) return [];
  const have = await em.find(Run, { bike: from.bike.id, rawSha256: from.rawSha256 }, { fields: ['id', 'pullIndex'] });
  const taken = new Set(have.map((r) => r.pullIndex));
  const ids: string[] = [];
  for (const o of wanted) {
    if (taken.has(o.pullIndex)) continue;
    const run = em.create(Run, {
      shop: from.shop,
      bike: from.bike,
      session: from.session,
      stage: from.stage,
      sequence: await nextSequence(em, from.bike.id, from.session?.id ?? null),
      pullIndex: o.pullIndex,
      rawKey: from.rawKey,
      rawSha256: from.rawSha256,
      rawSizeBytes: from.rawSizeBytes,
      originalName: from.originalName,
      contentType: from.contentType,
      uploadedBy: em.getReference(User, actor.id),
      tags: [],
    } as unknown as Run);
    applyOutcome(run, o);
    await em.flush();
    await recordAudit(em, actor, 'run.pull-found', 'run', run.id, { fromRunId: from.id, file: from.originalName, pull: o.pullIndex + 1, pulls: o.pullCount });
    ids.push(run.id);
  }
  return ids;
}
