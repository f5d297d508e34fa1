import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { shopSettingsInput, type ShopDto } from '@shared/schemas/shop';
import { Shop } from './shop.entity';
import { recordAudit } from '../audit/audit.service';

const toDto = (s: Shop): ShopDto => ({
  id: s.id,
  name: s.name,
  address: s.address,
  phone: s.phone,
  email: s.email,
  hasLogo: Boolean(s.logoKey),
  units: s.units,
  paperSize: s.paperSize,
  defaultCorrection: s.defaultCorrection as ShopDto['defaultCorrection'],
  timeZone: s.timeZone,
  currency: s.currency,
  depositMode: s.depositMode,
  depositPercent: s.depositPercent,
  depositFixedCents: s.depositFixedCents,
});

export function shopRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/shop', deps);
  api.route({ method: 'get', path: '/', access: 'signed-in', summary: 'The caller’s shop', handler: async ({ em, actor }) => toDto(await em.findOneOrFail(Shop, actor.shopId)) });
  api.route({
    method: 'put',
    path: '/',
    access: ['owner'],
    summary: 'Edit shop settings',
    body: shopSettingsInput,
    handler: async ({ em, actor, body }) => {
      const shop = await em.transactional(async (tx) => {
        const found = await tx.findOneOrFail(Shop, actor.shopId);
        tx.assign(found, body);
        await recordAudit(tx, actor, 'shop.update', 'shop', found.id, body);
        return found;
      });
      return toDto(shop);
    },
  });
  return api;
}
