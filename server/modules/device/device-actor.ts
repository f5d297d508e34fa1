import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import { User } from '../users/user.entity';
import type { DeviceCaller } from './device-auth';

/**
 * The person a device upload is recorded under (runs' "uploaded by", audit lines): whoever made
 * the token, or the shop's first active owner when that user is gone or disabled. The audit lines
 * also name the token (`via`), as the command line's say `via: 'command line'`.
 */
export async function deviceActor(em: EntityManager, caller: DeviceCaller): Promise<Actor> {
  const maker = caller.createdById ? await em.findOne(User, { id: caller.createdById, shop: caller.shopId, disabled: false }) : null;
  const user = maker ?? (await em.findOne(User, { shop: caller.shopId, role: 'owner', disabled: false }, { orderBy: { createdAt: 'asc' } }));
  if (!user) throw new AppError('DEVICE_TOKEN_REFUSED', 'The shop has no active owner to record uploads under', 401);
  return { id: user.id, shopId: caller.shopId, role: 'tuner', email: user.email, name: user.name, customerId: null };
}

export const viaToken = (caller: DeviceCaller) => `sync agent (token “${caller.tokenName}”)`;
