import { z } from 'zod';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { optionalEmail, optionalText, requiredText } from '@shared/schemas/common';
import { Shop } from './shop.entity';
import { recordAudit } from '../audit/audit.service';

export const shopSettingsInput = z.object({
  name: requiredText(200, 'Shop name'),
  address: optionalText(1000),
  phone: optionalText(60),
  email: optionalEmail,
  units: z.enum(['imperial', 'metric']),
  paperSize: z.enum(['letter', 'a4']),
  defaultCorrection: z.enum(['none', 'sae-j1349', 'sae-j1349-1990', 'iso-1585', 'din-70020', 'sae-j607']),
});

const toDto = (s: Shop) => ({
  id: s.id,
  name: s.name,
  address: s.address,
  phone: s.phone,
  email: s.email,
  hasLogo: Boolean(s.logoKey),
  units: s.units,
  paperSize: s.paperSize,
  defaultCorrection: s.defaultCorrection,
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
      const shop = await em.findOneOrFail(Shop, actor.shopId);
      em.assign(shop, body);
      await em.flush();
      await recordAudit(em, actor, 'shop.update', 'shop', shop.id, body);
      return toDto(shop);
    },
  });
  return api;
}
