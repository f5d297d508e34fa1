/**
 * A file from a dyno's sync agent: it lands in what is on the dyno now (bike, session, stage)
 * through the normal upload pipeline, so duplicates and multi-pull logs behave as uploads do.
 * With nothing on the dyno it waits in the shop's inbox (inbox.ts). Nothing is lost or guessed.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import { AppError, notFound } from '../../lib/errors';
import type { DeviceUploadResponse } from '@shared/schemas/device';
import { bikeLabel } from '@shared/labels';
import { Dyno } from '../dynos/dyno.entity';
import { ingestFiles, type IncomingFile } from '../runs/upload-runs';
import type { DeviceCaller } from './device-auth';
import { deviceActor, viaToken } from './device-actor';
import { putInInbox } from './inbox';

export async function deviceUpload(em: EntityManager, deps: AppDeps, caller: DeviceCaller, files: IncomingFile[]): Promise<DeviceUploadResponse> {
  if (!files.length) throw new AppError('NO_FILES', 'Add at least one run file (field "files")', 400);
  const dyno = await em.findOne(Dyno, { id: caller.dynoId, shop: caller.shopId }, { populate: ['currentBike', 'currentSession', 'currentStage'] });
  if (!dyno) throw notFound('Dyno');
  const actor = await deviceActor(em, caller);
  const bike = dyno.currentBike;
  const session = dyno.currentSession;
  if (!bike || !session) {
    const landing = await putInInbox(em, deps, caller, files);
    return { landing, results: [] };
  }
  const results = await ingestFiles(em, deps, actor, { bikeId: bike.id, sessionId: session.id, stageId: dyno.currentStage?.id ?? null }, files, { via: viaToken(caller), requireSafety: false });
  return { landing: { kind: 'dyno', bikeId: bike.id, bikeLabel: bikeLabel(bike), sessionId: session.id, stageId: dyno.currentStage?.id ?? null }, results };
}
