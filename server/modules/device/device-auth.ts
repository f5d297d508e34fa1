/**
 * `Authorization: Bearer <device token>`: accepted on the device upload route only. A bearer token
 * on any other API route is answered 403 (a valid-looking token) before sessions are read, so such
 * a request never falls through to a cookie session; a wrong or revoked token is answered 401.
 */
import type express from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { DEVICE_UPLOAD_PATH } from '@shared/schemas/device';
import { AppError } from '../../lib/errors';
import { hashDeviceToken } from './device-tokens';

/** Who is calling on the device route: the token, its dyno and shop, and who made the token. */
export interface DeviceCaller {
  tokenId: string;
  tokenName: string;
  dynoId: string;
  shopId: string;
  createdById: string | null;
}

const refused = () => new AppError('DEVICE_TOKEN_REFUSED', 'This device token is not valid (wrong, or revoked): create a new one on the Dynos settings page.', 401);

/** The device caller of a request (set by deviceBearerGate), or null. */
export const deviceCallerOf = (res: express.Response): DeviceCaller | null => (res.locals.device as DeviceCaller | undefined) ?? null;

export function deviceBearerGate(): express.RequestHandler {
  return (req, res, next) => {
    const header = req.get('authorization');
    if (!header || !(req.path === '/api' || req.path.startsWith('/api/'))) return next();
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (!match) return next(new AppError('DEVICE_TOKEN_REFUSED', 'Only session cookies and device tokens (Bearer) are accepted', 401));
    if (req.method !== 'POST' || req.path !== DEVICE_UPLOAD_PATH) {
      return next(new AppError('DEVICE_TOKEN_NOT_HERE', `A device token may only upload run files (POST ${DEVICE_UPLOAD_PATH}); sign in for anything else.`, 403));
    }
    const em = res.locals.em as EntityManager;
    authenticate(em, match[1]).then(
      (caller) => {
        if (!caller) return next(refused());
        res.locals.device = caller;
        next();
      },
      (err: unknown) => next(err),
    );
  };
}

/** Finds a live token by its hash and records that its agent was heard (token and dyno). */
async function authenticate(em: EntityManager, token: string): Promise<DeviceCaller | null> {
  if (token.length > 200) return null;
  const rows = (await em.getConnection().execute(
    `update device_token t set last_used_at = now()
       from dyno d
      where t.token_hash = ? and t.revoked_at is null and d.id = t.dyno_id
      returning t.id, t.name, t.dyno_id, t.shop_id, t.created_by_id`,
    [hashDeviceToken(token)],
  )) as { id: string; name: string; dyno_id: string; shop_id: string; created_by_id: string | null }[];
  const row = rows[0];
  if (!row) return null;
  await em.getConnection().execute(`update dyno set agent_last_heard_at = now() where id = ?`, [row.dyno_id]);
  return { tokenId: row.id, tokenName: row.name, dynoId: row.dyno_id, shopId: row.shop_id, createdById: row.created_by_id };
}
