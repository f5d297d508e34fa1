/**
 * The payment provider's official Node SDK, configured from the environment only: the secret key,
 * and PAYMENTS_API_URL when it should connect somewhere other than the provider (the local fake
 * that `npm start` and `npm test` run). No code path differs between the two.
 */
import Stripe from 'stripe';
import type { AppConfig } from '../../config/env';
import { AppError } from '../../lib/errors';

const clients = new Map<string, Stripe>();

export function paymentClient(config: AppConfig): Stripe {
  const key = config.PAYMENTS_SECRET_KEY;
  if (!key) throw new AppError('PAYMENTS_UNAVAILABLE', 'Online payments are not set up for this shop; take the deposit at the counter.', 503);
  const cacheKey = `${key}@${config.PAYMENTS_API_URL ?? ''}`;
  let client = clients.get(cacheKey);
  if (!client) {
    const url = config.PAYMENTS_API_URL ? new URL(config.PAYMENTS_API_URL) : null;
    client = new Stripe(key, {
      ...(url ? { host: url.hostname, port: Number(url.port || (url.protocol === 'https:' ? 443 : 80)), protocol: url.protocol.replace(':', '') as 'http' | 'https' } : {}),
      maxNetworkRetries: 2,
      timeout: 20_000,
    });
    clients.set(cacheKey, client);
  }
  return client;
}

/** Provider errors become 502 PAYMENTS_UNAVAILABLE with the provider's message, never a 500. */
export async function callProvider<T>(what: string, fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    if (e instanceof AppError) throw e;
    throw new AppError('PAYMENTS_UNAVAILABLE', `The payment service could not ${what}: ${e instanceof Error ? e.message : String(e)}`, 502);
  }
}
