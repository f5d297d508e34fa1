/**
 * Use cases: the shop logo printed on gain reports — replace, read, remove. The image lives in
 * object storage; the shop row keeps its key. A change and its audit entry commit together.
 */
import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.service';
import { Shop } from './shop.entity';
import { checkUploadedImage } from '../../lib/image-guard';

/** POST /api/shop-logo's answer. */
export interface ShopLogoDto {
  hasLogo: true;
  format: 'png' | 'jpg';
  sizeBytes: number;
  url: string;
}

/** Stores a new logo and points the shop at it; the old image is deleted once the change committed. */
export async function uploadShopLogo(deps: AppDeps, em: EntityManager, actor: Actor, file: { buffer: Buffer; size: number } | undefined): Promise<ShopLogoDto> {
  if (!file) throw new AppError('FILE_REQUIRED', 'Choose a PNG or JPEG image to upload (form field "logo")', 400);
  // Judged from the header alone: an image claiming huge dimensions is refused before anything decodes it.
  const { format, width, height } = checkUploadedImage(file.buffer);
  const key = `shops/${actor.shopId}/logo/${randomUUID()}.${format === 'png' ? 'png' : 'jpg'}`;
  await deps.storage.put(key, file.buffer, { contentType: format === 'png' ? 'image/png' : 'image/jpeg' });
  let old: string | null;
  try {
    old = await em.transactional(async (tx) => {
      const shop = await tx.findOneOrFail(Shop, actor.shopId);
      const previous = shop.logoKey;
      shop.logoKey = key;
      await tx.flush();
      await recordAudit(tx, actor, 'shop.logo', 'shop', shop.id, { bytes: file.size, format, width, height });
      return previous;
    });
  } catch (e) {
    // The shop does not point at the new image: remove it again.
    await deps.storage.delete(key).catch(() => undefined);
    throw e;
  }
  if (old) await deps.storage.delete(old).catch(() => undefined);
  return { hasLogo: true, format, sizeBytes: file.size, url: '/api/shop-logo' };
}

/** The logo image's stream, or NOT_FOUND when the shop has none. */
export async function shopLogo(deps: AppDeps, em: EntityManager, actor: Actor): Promise<{ body: Readable; contentType?: string }> {
  const shop = await em.findOneOrFail(Shop, actor.shopId);
  if (!shop.logoKey) throw new AppError('NOT_FOUND', 'This shop has no logo yet', 404);
  return deps.storage.getStream(shop.logoKey);
}

/** Removes the logo; the image is deleted once the change committed. */
export async function removeShopLogo(deps: AppDeps, em: EntityManager, actor: Actor): Promise<void> {
  const old = await em.transactional(async (tx) => {
    const shop = await tx.findOneOrFail(Shop, actor.shopId);
    const previous = shop.logoKey;
    shop.logoKey = null;
    await tx.flush();
    await recordAudit(tx, actor, 'shop.logo.remove', 'shop', shop.id, {});
    return previous;
  });
  if (old) await deps.storage.delete(old).catch(() => undefined);
}
