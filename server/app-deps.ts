import type { AppConfig } from './config/env';
import type { Orm } from './db/orm';
import type { ObjectStore } from './lib/storage/object-store';
import type { Mailer } from './lib/mail/mailer';
import type { Outbox } from './lib/mail/outbox';
import type { MailQueue } from './lib/mail/mail-queue';

/** What the app is built from. Tests build the same thing against the test services. */
export interface AppDeps {
  config: AppConfig;
  orm: Orm;
  storage: ObjectStore;
  mailer: Mailer;
  outbox: Outbox;
  /** The durable mail queue and send log (lib/mail/mail-queue.ts); its worker runs once started. */
  mail: MailQueue;
}
