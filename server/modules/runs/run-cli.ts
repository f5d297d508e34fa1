/**
 * What `npm run reprocess` and `npm run import` do, as functions (the command lines in
 * server/cli/ only parse arguments and print).
 *
 * Both connect with loadConfig() from the environment: DATABASE_URL, S3_ENDPOINT, S3_BUCKET,
 * S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY, SMTP_URL, SESSION_SECRET… When a variable is unset they
 * fall back to the local services of `npm start` (which must be running): PostgreSQL at
 * postgres://pullbook@127.0.0.1:55432/pullbook, the S3 fake at http://127.0.0.1:45680 (keys
 * S3RVER/S3RVER, bucket pullbook), SMTP at smtp://127.0.0.1:25250 and a dummy session secret.
 *
 * Who acts: the command line has no signed-in user, so it acts as the shop's first active owner
 * (the person answerable for the archive). Its audit lines name that owner and say
 * `via: 'command line'` (or `'command line import'`); each commits with the change it records.
 * A shop without an active owner cannot be changed from the command line.
 */
import fs from 'node:fs';
import path from 'node:path';
import { loadConfig, type AppConfig } from '../../config/env';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import type { UploadResult } from '@shared/schemas/run';
import { recordAudit } from '../audit/audit.service';
import { Bike } from '../bikes/bike.entity';
import { User } from '../users/user.entity';
import { Stage } from '../stages/stage.entity';
import { Run } from './run.entity';
import { reprocessRun } from './reprocess-run';
import { ingestFiles } from './upload-runs';
import type { IncomingFile } from './raw-store';
import { refreshBikeOutcomes } from '../builds/build-outcome.service';

export const LOCAL_DEFAULTS: Record<string, string> = {
  DATABASE_URL: 'postgres://pullbook@127.0.0.1:55432/pullbook',
  S3_ENDPOINT: 'http://127.0.0.1:45680',
  S3_ACCESS_KEY_ID: 'S3RVER',
  S3_SECRET_ACCESS_KEY: 'S3RVER',
  S3_BUCKET: 'pullbook',
  SMTP_URL: 'smtp://127.0.0.1:25250',
  SESSION_SECRET: 'command-line-only-not-a-real-session-secret',
  AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
};

/** The environment's settings, with the local `npm start` services for whatever is unset. */
export function cliConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const merged: NodeJS.ProcessEnv = { ...env };
  for (const [k, v] of Object.entries(LOCAL_DEFAULTS)) if (!merged[k]) merged[k] = v;
  // Local keys only make sense with the local endpoint.
  if (env.S3_ENDPOINT && !env.S3_ACCESS_KEY_ID) delete merged.S3_ACCESS_KEY_ID;
  if (env.S3_ENDPOINT && !env.S3_SECRET_ACCESS_KEY) delete merged.S3_SECRET_ACCESS_KEY;
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  return loadConfig(merged);
}

export interface ReprocessLine {
  runId: string;
  file: string;
  /** "pull 2 of 3" for a run that is one pull of a log holding several, else absent. */
  pull?: string;
  status: string;
  changes: { field: string; before: unknown; after: unknown }[];
  error?: string;
}

const pullOf = (run: Run) => (run.pullCount > 1 || run.pullIndex > 0 ? { pull: `pull ${run.pullIndex + 1} of ${run.pullCount}` } : {});

/** Re-derive every run (deleted ones too) from its raw file; one line per run. */
export async function reprocessAll(deps: AppDeps, onLine: (line: ReprocessLine) => void = () => undefined): Promise<ReprocessLine[]> {
  const lines: ReprocessLine[] = [];
  const bikes = new Set<string>();
  const actors = new Map<string, Promise<Actor>>();
  const actorOf = (shopId: string) => {
    if (!actors.has(shopId)) actors.set(shopId, ownerActor(deps, shopId));
    return actors.get(shopId)!;
  };
  let lastId: string | null = null; // keyset paging by id
  for (;;) {
    const em = deps.orm.em.fork();
    const batch: Run[] = await em.find(Run, lastId ? { id: { $gt: lastId } } : {}, { orderBy: { id: 'asc' }, limit: 100 });
    if (!batch.length) break;
    for (const run of batch) {
      lastId = run.id;
      let line: ReprocessLine;
      try {
        const actor = await actorOf(run.shop.id);
        // Only a change is audited: a pass over an unchanged archive leaves no trail of no-ops.
        const changes = await reprocessRun(em, deps, actor, run, { details: { via: 'command line' }, auditUnchanged: false });
        if (changes.length) bikes.add(run.bike.id);
        line = { runId: run.id, file: run.originalName, ...pullOf(run), status: run.status, changes };
      } catch (e) {
        line = { runId: run.id, file: run.originalName, ...pullOf(run), status: run.status, changes: [], error: e instanceof Error ? e.message : String(e) };
      }
      lines.push(line);
      onLine(line);
    }
  }
  for (const bikeId of bikes) await refreshBikeOutcomes(deps.orm.em.fork(), bikeId);
  return lines;
}

/** The shop's first active owner, acting for the command line (uploads and the audit log name them). */
export async function ownerActor(deps: AppDeps, shopId: string): Promise<Actor> {
  const owner = await deps.orm.em.fork().findOne(User, { shop: shopId, role: 'owner', disabled: false }, { orderBy: { createdAt: 'asc' } });
  if (!owner) throw new Error('The shop has no active owner account for the command line to act as');
  return { id: owner.id, shopId, role: 'owner', email: owner.email, name: owner.name, customerId: null };
}

const CONTENT_TYPES: Record<string, string> = { '.csv': 'text/csv', '.txt': 'text/plain', '.tsv': 'text/tab-separated-values' };

/**
 * Bring a folder of old run files into the archive for one bike and stage (created when missing),
 * through the same pipeline as an upload. Files are sent in batches of `batchSize`.
 */
export async function importFolder(deps: AppDeps, opts: { bikeId: string; stageName: string; dir: string; batchSize?: number }, onResult: (r: UploadResult) => void = () => undefined): Promise<{ stageId: string; created: boolean; results: UploadResult[] }> {
  const em = deps.orm.em.fork();
  const bike = await em.findOne(Bike, { id: opts.bikeId });
  if (!bike) throw new Error(`No bike with id ${opts.bikeId}`);
  const actor = await ownerActor(deps, bike.shop.id);
  let stage = await em.findOne(Stage, { bike: bike.id, name: opts.stageName });
  const created = !stage;
  if (!stage) {
    stage = await em.transactional(async (tem) => {
      const last = await tem.findOne(Stage, { bike: bike.id }, { orderBy: { position: 'desc' } });
      const created = tem.create(Stage, { shop: bike.shop, bike, name: opts.stageName, position: last ? last.position + 1 : 0 } as Stage);
      await tem.flush();
      await recordAudit(tem, actor, 'stage.create', 'stage', created.id, { via: 'command line import', name: created.name });
      return created;
    });
  }
  const names = fs
    .readdirSync(opts.dir, { withFileTypes: true })
    .filter((d) => d.isFile() && !d.name.startsWith('.'))
    .map((d) => d.name)
    .sort();
  const results: UploadResult[] = [];
  const size = opts.batchSize ?? 20;
  for (let i = 0; i < names.length; i += size) {
    const files: IncomingFile[] = names.slice(i, i + size).map((name) => ({
      originalName: name,
      contentType: CONTENT_TYPES[path.extname(name).toLowerCase()] ?? 'application/octet-stream',
      path: path.join(opts.dir, name),
    }));
    const batch = await ingestFiles(deps.orm.em.fork(), deps, actor, { bikeId: bike.id, stageId: stage.id }, files);
    for (const r of batch) onResult(r);
    results.push(...batch);
  }
  return { stageId: stage.id, created, results };
}
