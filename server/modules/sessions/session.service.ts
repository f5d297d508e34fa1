import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import type { Page } from '@shared/schemas/common';
import type { CorrectionId, SessionDetailDto, SessionDto, safetyCheckInput, sessionInput, sessionUpdateInput } from '@shared/schemas/run';
import { DynoSession } from './dyno-session.entity';
import { Dyno } from '../dynos/dyno.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { Run } from '../runs/run.entity';
import { getBikeEntity } from '../bikes/bike.service';
import { recordAudit } from '../audit/audit.service';
import { RUN_POPULATE, toRunSummaries } from '../runs/run.service';
import { listSessionRows } from './list-sessions';

type SessionInput = z.output<typeof sessionInput>;
type SessionUpdateInput = z.output<typeof sessionUpdateInput>;
type SafetyCheckInput = z.output<typeof safetyCheckInput>;

export function toSessionDto(s: DynoSession, runCount: number): SessionDto {
  return {
    id: s.id,
    bikeId: s.bike.id,
    startedAt: s.startedAt.toISOString(),
    dynoId: s.dyno?.id ?? null,
    dynoName: s.dyno?.name ?? null,
    operatorName: s.operator?.name ?? null,
    ambientTempC: s.ambientTempC,
    baroKpa: s.baroKpa,
    humidityPct: s.humidityPct,
    correctionStandard: s.correctionStandard as CorrectionId,
    notes: s.notes,
    safetyConfirmedAt: s.safetyConfirmedAt ? s.safetyConfirmedAt.toISOString() : null,
    safetyConfirmedByName: s.safetyConfirmedBy?.name ?? null,
    runCount,
    conditionsToConfirm: s.conditionsToConfirm,
  };
}

async function runCounts(em: EntityManager, shopId: string, ids: string[]): Promise<Map<string, number>> {
  if (!ids.length) return new Map();
  // shop_id first: the (shop_id, session_id) index, not a scan of every run.
  const rows = (await em.getConnection().execute(
    `select session_id, count(*)::int as n from run where shop_id = ? and session_id in (${ids.map(() => '?').join(',')}) and deleted_at is null group by session_id`,
    [shopId, ...ids],
  )) as { session_id: string; n: number }[];
  return new Map(rows.map((r) => [r.session_id, Number(r.n)]));
}

const POPULATE = ['dyno', 'operator', 'safetyConfirmedBy'] as const;

/** Rows from SQL (list-sessions.ts); a customer asking for another's bike gets 404 as before. */
export async function listSessions(em: EntityManager, actor: Actor, query: { bikeId?: string }): Promise<Page<SessionDto>> {
  if (query.bikeId && actor.role === 'customer') await getBikeEntity(em, actor, query.bikeId);
  return listSessionRows(em, actor, query);
}

export async function getSessionEntity(em: EntityManager, actor: Actor, id: string): Promise<DynoSession> {
  const s = await em.findOne(DynoSession, tenantScope<DynoSession>(actor, 'bike.customer', { id }), { populate: POPULATE as never });
  if (!s) throw notFound('Session');
  return s;
}

export async function sessionWithRuns(em: EntityManager, actor: Actor, id: string): Promise<SessionDetailDto> {
  const s = await getSessionEntity(em, actor, id);
  const runs = await em.find(Run, tenantScope<Run>(actor, undefined, { session: s.id, deletedAt: null }), { populate: RUN_POPULATE as never, orderBy: { sequence: 'asc', createdAt: 'asc' } });
  return { ...toSessionDto(s, runs.length), runs: await toRunSummaries(em, runs) };
}

async function dynoOfShop(em: EntityManager, actor: Actor, dynoId: string | null | undefined): Promise<Dyno | null> {
  if (!dynoId) return null;
  const dyno = await em.findOne(Dyno, tenantScope<Dyno>(actor, undefined, { id: dynoId }));
  if (!dyno) throw notFound('Dyno');
  return dyno;
}

export async function createSession(em: EntityManager, actor: Actor, input: SessionInput): Promise<SessionDto> {
  const s = await em.transactional(async (tx) => {
    const bike = await getBikeEntity(tx, actor, input.bikeId);
    const created = tx.create(DynoSession, {
      shop: tx.getReference(Shop, actor.shopId),
      bike,
      startedAt: input.startedAt ?? new Date(),
      dyno: await dynoOfShop(tx, actor, input.dynoId),
      operator: tx.getReference(User, actor.id),
      ambientTempC: input.ambientTempC,
      baroKpa: input.baroKpa,
      humidityPct: input.humidityPct,
      correctionStandard: input.correctionStandard,
      notes: input.notes,
    } as DynoSession);
    await recordAudit(tx, actor, 'session.create', 'session', created.id, { bikeId: bike.id });
    return created;
  });
  await em.populate(s, POPULATE as never);
  return toSessionDto(s, 0);
}

export async function updateSession(em: EntityManager, actor: Actor, id: string, input: SessionUpdateInput): Promise<SessionDto> {
  const s = await em.transactional(async (tx) => {
    const found = await getSessionEntity(tx, actor, id);
    const { dynoId, ...rest } = input;
    // Conditions entered by hand replace the shop's defaults a bay session started with.
    if (input.ambientTempC !== undefined || input.baroKpa !== undefined || input.humidityPct !== undefined) found.conditionsToConfirm = false;
    if (dynoId !== undefined) found.dyno = await dynoOfShop(tx, actor, dynoId);
    for (const [k, v] of Object.entries(rest)) if (v !== undefined) (found as unknown as Record<string, unknown>)[k] = v;
    await recordAudit(tx, actor, 'session.update', 'session', found.id, { ...input, startedAt: input.startedAt?.toISOString() });
    return found;
  });
  await em.populate(s, POPULATE as never);
  const counts = await runCounts(em, actor.shopId, [s.id]);
  return toSessionDto(s, counts.get(s.id) ?? 0);
}

/** Record that the dyno-bay checks were confirmed: who and when. */
export async function confirmSafety(em: EntityManager, actor: Actor, id: string, input: SafetyCheckInput): Promise<SessionDto> {
  const s = await em.transactional(async (tx) => {
    const found = await getSessionEntity(tx, actor, id);
    found.safetyConfirmedAt = new Date();
    found.safetyConfirmedBy = tx.getReference(User, actor.id);
    await recordAudit(tx, actor, 'session.safety-check', 'session', found.id, { checks: input.checks });
    return found;
  });
  await em.populate(s, POPULATE as never, { refresh: true });
  const counts = await runCounts(em, actor.shopId, [s.id]);
  return toSessionDto(s, counts.get(s.id) ?? 0);
}
