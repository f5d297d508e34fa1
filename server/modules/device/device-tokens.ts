/**
 * Device tokens: the owner makes one per dyno PC; the token is answered once and only its SHA-256
 * is kept. A token may upload run files for its dyno and nothing else (device-auth.ts).
 */
import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import { notFound } from '../../lib/errors';
import { tenantScope } from '../../http/tenant-scope';
import { wholePage, type Page } from '@shared/schemas/common';
import type { DeviceTokenCreatedDto, DeviceTokenDto } from '@shared/schemas/bay';
import { DeviceToken } from './device-token.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { recordAudit } from '../audit/audit.service';
import { getDynoEntity } from '../dynos/dyno.service';

/** Prefix that makes a Pullbook device token recognisable in a config file or a leak scan. */
const TOKEN_PREFIX = 'pbd_';

export const hashDeviceToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

const toDto = (t: DeviceToken): DeviceTokenDto => ({
  id: t.id,
  dynoId: t.dyno.id,
  name: t.name,
  createdAt: t.createdAt.toISOString(),
  createdByName: t.createdBy?.name ?? null,
  lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
  revokedAt: t.revokedAt?.toISOString() ?? null,
});

export async function createDeviceToken(em: EntityManager, actor: Actor, dynoId: string, name: string): Promise<DeviceTokenCreatedDto> {
  const token = `${TOKEN_PREFIX}${randomBytes(32).toString('base64url')}`;
  const created = await em.transactional(async (tx) => {
    const dyno = await getDynoEntity(tx, actor, dynoId);
    const row = tx.create(DeviceToken, { shop: tx.getReference(Shop, actor.shopId), dyno, name, tokenHash: hashDeviceToken(token), createdBy: tx.getReference(User, actor.id) } as DeviceToken);
    await recordAudit(tx, actor, 'device-token.create', 'device-token', row.id, { dynoId: dyno.id, dyno: dyno.name, name });
    return row;
  });
  return { id: created.id, token };
}

/** A dyno's tokens, newest first, revoked ones included (with when). */
export async function listDeviceTokens(em: EntityManager, actor: Actor, dynoId: string): Promise<Page<DeviceTokenDto>> {
  const dyno = await getDynoEntity(em, actor, dynoId);
  const rows = await em.find(DeviceToken, tenantScope<DeviceToken>(actor, undefined, { dyno: dyno.id }), { populate: ['createdBy'], orderBy: { createdAt: 'desc', id: 'asc' } });
  return wholePage(rows.map(toDto));
}

/** Revokes a token at once: its next request is refused. Revoking twice is harmless. */
export async function revokeDeviceToken(em: EntityManager, actor: Actor, dynoId: string, tokenId: string): Promise<void> {
  await em.transactional(async (tx) => {
    const dyno = await getDynoEntity(tx, actor, dynoId);
    const row = await tx.findOne(DeviceToken, tenantScope<DeviceToken>(actor, undefined, { id: tokenId, dyno: dyno.id }));
    if (!row) throw notFound('Device token');
    if (row.revokedAt) return;
    row.revokedAt = new Date();
    await recordAudit(tx, actor, 'device-token.revoke', 'device-token', row.id, { dynoId: dyno.id, dyno: dyno.name, name: row.name });
  });
}
