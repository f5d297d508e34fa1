/**
 * "On the dyno now": the bike strapped to a dyno, with its session and stage. Files from the
 * dyno PC's sync agent land there. Set without a session, today's session of that bike on that
 * dyno is used (the day of the shop's time zone), or started with the shop's default correction and its conditions flagged to be
 * confirmed (temperature, pressure and humidity are not guessed).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { AppError, notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import type { DynoCurrentDto, dynoCurrentInput } from '@shared/schemas/bay';
import { startOfDayIn } from '@shared/time-zone';
import { Dyno } from './dyno.entity';
import { getDynoEntity } from './dyno.service';
import { Bike } from '../bikes/bike.entity';
import { DynoSession } from '../sessions/dyno-session.entity';
import { Stage } from '../stages/stage.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';

type CurrentInput = z.output<typeof dynoCurrentInput>;

async function sessionFor(tx: EntityManager, actor: Actor, dyno: Dyno, bike: Bike, sessionId: string | undefined): Promise<{ session: DynoSession; created: boolean }> {
  if (sessionId) {
    const session = await tx.findOne(DynoSession, tenantScope<DynoSession>(actor, undefined, { id: sessionId }));
    if (!session) throw notFound('Session');
    if (session.bike.id !== bike.id) throw new AppError('SESSION_OTHER_BIKE', 'That session belongs to another bike', 400);
    if (session.dyno && session.dyno.id !== dyno.id) throw new AppError('SESSION_OTHER_DYNO', 'That session was recorded on another dyno', 400);
    if (!session.dyno) session.dyno = dyno;
    return { session, created: false };
  }
  // "Today" is the shop's calendar day: an evening session in Denver is not tomorrow's in UTC.
  const shop = await tx.findOneOrFail(Shop, { id: actor.shopId });
  const since = startOfDayIn(shop.timeZone);
  const today = await tx.findOne(DynoSession, tenantScope<DynoSession>(actor, undefined, { bike: bike.id, dyno: dyno.id, startedAt: { $gte: since } }), { orderBy: { startedAt: 'desc' } });
  if (today) return { session: today, created: false };
  const session = tx.create(DynoSession, {
    shop,
    bike,
    dyno,
    startedAt: new Date(),
    operator: tx.getReference(User, actor.id),
    correctionStandard: shop.defaultCorrection,
    conditionsToConfirm: true,
  } as DynoSession);
  await recordAudit(tx, actor, 'session.create', 'session', session.id, { bikeId: bike.id, dynoId: dyno.id, via: 'on the dyno now', conditionsToConfirm: true });
  return { session, created: true };
}

export async function setDynoCurrent(em: EntityManager, actor: Actor, dynoId: string, input: CurrentInput): Promise<DynoCurrentDto> {
  return em.transactional(async (tx) => {
    const dyno = await getDynoEntity(tx, actor, dynoId);
    const bike = await tx.findOne(Bike, tenantScope<Bike>(actor, undefined, { id: input.bikeId }));
    if (!bike) throw notFound('Bike');
    let stage: Stage | null = null;
    if (input.stageId) {
      stage = await tx.findOne(Stage, tenantScope<Stage>(actor, undefined, { id: input.stageId }));
      if (!stage) throw notFound('Stage');
      if (stage.bike.id !== bike.id) throw new AppError('STAGE_OTHER_BIKE', 'That stage belongs to another bike', 400);
    }
    const { session, created } = await sessionFor(tx, actor, dyno, bike, input.sessionId);
    dyno.currentBike = bike;
    dyno.currentSession = session;
    dyno.currentStage = stage;
    dyno.currentSetAt = new Date();
    await recordAudit(tx, actor, 'dyno.current.set', 'dyno', dyno.id, { bikeId: bike.id, sessionId: session.id, stageId: stage?.id ?? null, sessionCreated: created });
    return { bikeId: bike.id, sessionId: session.id, stageId: stage?.id ?? null };
  });
}

/** Nothing on the dyno: files from its agent wait in the inbox. Clearing twice is harmless. */
export async function clearDynoCurrent(em: EntityManager, actor: Actor, dynoId: string): Promise<void> {
  await em.transactional(async (tx) => {
    const dyno = await getDynoEntity(tx, actor, dynoId);
    if (!dyno.currentBike && !dyno.currentSession) return;
    const before = { bikeId: dyno.currentBike?.id ?? null, sessionId: dyno.currentSession?.id ?? null };
    dyno.currentBike = null;
    dyno.currentSession = null;
    dyno.currentStage = null;
    dyno.currentSetAt = new Date();
    await recordAudit(tx, actor, 'dyno.current.clear', 'dyno', dyno.id, before);
  });
}
