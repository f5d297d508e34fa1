/**
 * Durable outgoing mail. A change that sends mail calls `enqueueMail(em, message)` inside its
 * transaction: the message becomes a row of the send log (`mail_message`, status `queued`) that
 * commits or rolls back with the change. After the commit a pg-boss job (lib/jobs) asks a worker to
 * send it; a failed try is retried with exponential backoff, and the send log shows each message as
 * queued, sent or failed.
 *
 * Sent once: a worker claims a row by moving it from `queued` to `sending` in one guarded UPDATE,
 * so two app instances (or a job and an immediate try) never both send it; a unique
 * `message_key` keeps a message from being queued twice. The one gap SMTP leaves (the relay accepted
 * the message, then the process died before the row said so) is closed for the recipient by a
 * Message-ID that stays the same on the next try.
 *
 * A row whose job was lost (a crash right after the commit, a database outage while queueing) is
 * picked up by the sweep every instance runs; a claim older than CLAIM_TIMEOUT is released.
 */
import { randomUUID, createHash } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Logger } from 'pino';
import type { Orm } from '../../db/orm';
import type { ObjectStore } from '../storage/object-store';
import { JobQueue, type JobInfo, type JobQueueOptions, type QueueName } from '../jobs/job-queue';
import type { MailAttachment, Mailer } from './mailer';
import { describeMailError, fitSubject, isPermanentMailError } from './mail-text';
import type { MailLogEntry } from '@shared/schemas/outbox';

export type MailKind = 'invite' | 'reset' | 'report' | 'notice' | (string & {});
export type MailStatus = 'queued' | 'sending' | 'sent' | 'failed';

/** An attachment given inline (small) or by its object-storage key (read when the mail is sent). */
export interface QueuedAttachment {
  filename: string;
  contentType?: string;
  content?: Buffer;
  storageKey?: string;
  /** With storageKey: the stored object must still have this SHA-256, or the send fails. */
  sha256?: string;
}

export interface MailMessage {
  /** The shop the message is sent for (its send log and outbox). */
  shopId: string;
  kind: MailKind;
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Display name of the sender (e.g. the shop's name) on the configured MAIL_FROM address. */
  fromName?: string;
  /** Where replies go (e.g. the shop's own address). */
  replyTo?: string;
  attachments?: QueuedAttachment[];
  /** Unique key; a second message with the same key is not queued. Default: a new random key. */
  key?: string;
  /** The share link the message carries; removed if the message finally fails. */
  shareLinkId?: string;
  /** The report delivery row this message is; its status follows the message's. */
  reportDeliveryId?: string;
}

interface StoredBody {
  text: string;
  html?: string;
  fromName?: string;
  replyTo?: string;
  attachments?: { filename: string; contentType?: string; content?: string; storageKey?: string; sha256?: string }[];
}

interface MailRow {
  id: string;
  shop_id: string;
  message_key: string;
  kind: string;
  recipient: string;
  subject: string;
  body: StoredBody | null;
  status: MailStatus;
  attempts: number;
  last_error: string | null;
  share_link_id: string | null;
  report_delivery_id: string | null;
  created_at: Date;
  sent_at: Date | null;
  next_attempt_at: Date;
}

/** How long a claim (`sending`) may last before another worker may take the message over. */
export const CLAIM_TIMEOUT_SECONDS = 10 * 60;

type Dispatch = (id: string) => void;
/** One dispatcher per ORM (its driver), set by the MailQueue built on it. */
const dispatchers = new WeakMap<object, Dispatch>();

/**
 * Queue a message in the caller's transaction (or on its own when `em` is not in one). The job
 * that sends it is queued once the transaction commits; if that never happens, the sweep does it.
 * `dispatch: false` leaves the first try to the caller (`MailQueue.deliverNow`).
 */
export async function enqueueMail(em: EntityManager, message: MailMessage, opts: { dispatch?: boolean } = {}): Promise<{ id: string; queued: boolean }> {
  // Rows the message refers to (a share link, a delivery) may still be pending in the unit of work.
  await em.flush();
  const id = randomUUID();
  const body: StoredBody = {
    text: message.text,
    ...(message.html !== undefined ? { html: message.html } : {}),
    ...(message.fromName ? { fromName: message.fromName } : {}),
    ...(message.replyTo ? { replyTo: message.replyTo } : {}),
    ...(message.attachments?.length
      ? { attachments: message.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, storageKey: a.storageKey, sha256: a.sha256, content: a.content?.toString('base64') })) }
      : {}),
  };
  const trx = em.getTransactionContext<{ executionPromise?: Promise<unknown> } & Parameters<ReturnType<EntityManager['getConnection']>['execute']>[3]>();
  const rows = (await em.getConnection().execute(
    `insert into mail_message (id, shop_id, message_key, kind, recipient, subject, body, share_link_id, report_delivery_id)
     values (?, ?, ?, ?, ?, ?, ?::jsonb, ?, ?) on conflict (message_key) do nothing returning id`,
    [id, message.shopId, message.key ?? id, message.kind, message.to.slice(0, 320), fitSubject(message.subject, 300), JSON.stringify(body), message.shareLinkId ?? null, message.reportDeliveryId ?? null],
    'all',
    trx,
  )) as { id: string }[];
  const queued = rows.length === 1;
  if (queued && opts.dispatch !== false) {
    const dispatch = dispatchers.get(em.getDriver());
    if (dispatch) {
      if (trx?.executionPromise) trx.executionPromise.then(() => dispatch(id), () => undefined);
      else if (!em.isInTransaction()) dispatch(id);
    }
  }
  return { id, queued };
}

export interface MailQueueOptions {
  orm: Orm;
  storage: ObjectStore;
  mailer: Mailer;
  connectionString: string;
  logger: Logger;
  /** Host names and user names of the relay, removed from every error staff may see. */
  relayNames: string[];
  /** How often an idle worker looks for jobs (seconds, ≥ 0.5). */
  pollingIntervalSeconds?: number;
  /** How often each instance looks for messages whose job was lost (seconds). */
  sweepSeconds?: number;
  /** How overdue a queued message must be before the sweep queues it again (seconds). */
  sweepGraceSeconds?: number;
  /** How long a request waits for an immediate try before answering "queued" (ms). */
  immediateTimeoutMs?: number;
  retry?: JobQueueOptions['retry'];
}

/** One line of the owner's send log, as the outbox route answers it. */
export type MailLogRow = MailLogEntry;

type Worker = { queue: QueueName; handler: (data: object, job: JobInfo) => Promise<void> };

export class MailQueue {
  private jobs: JobQueue | null = null;
  private sweepTimer: NodeJS.Timeout | null = null;
  private readonly inFlight = new Set<Promise<unknown>>();

  constructor(private readonly opts: MailQueueOptions) {
    dispatchers.set(opts.orm.em.getDriver(), (id) => void this.dispatch(id));
  }

  private get conn() {
    return this.opts.orm.em.getConnection();
  }

  /** Starts this instance's mail worker (and any other job workers given) and the sweep. */
  async start(workers: Worker[] = []): Promise<void> {
    if (this.jobs) return;
    const jobs = await JobQueue.start({ connectionString: this.opts.connectionString, logger: this.opts.logger, pollingIntervalSeconds: this.opts.pollingIntervalSeconds, retry: this.opts.retry });
    this.jobs = jobs;
    await jobs.work<{ id: string }>('mail', async (data, job) => {
      await this.deliver(data.id, job);
    });
    for (const w of workers) await jobs.work(w.queue, w.handler);
    const every = (this.opts.sweepSeconds ?? 30) * 1000;
    this.sweepTimer = setInterval(() => void this.sweep().catch((err) => this.opts.logger.warn({ err }, 'mail sweep failed')), every);
    this.sweepTimer.unref();
  }

  async stop(): Promise<void> {
    if (this.sweepTimer) clearInterval(this.sweepTimer);
    this.sweepTimer = null;
    await Promise.allSettled([...this.inFlight]);
    const jobs = this.jobs;
    this.jobs = null;
    await jobs?.stop();
  }

  /** Queue a job on one of the other queues (e.g. an account look-up); false when no worker runs here. */
  async queueJob<T extends object>(queue: QueueName, data: T): Promise<boolean> {
    if (!this.jobs) return false;
    return (await this.jobs.send(queue, data)) !== null;
  }

  /** Asks a worker to try the message (now, or after `startAfterSeconds`). Never throws. */
  async dispatch(id: string, startAfterSeconds?: number): Promise<void> {
    if (!this.jobs) return;
    try {
      await this.jobs.send('mail', { id }, { startAfterSeconds });
      await this.conn.execute('update mail_message set job_enqueued_at = now() where id = ?', [id]);
    } catch (err) {
      this.opts.logger.warn({ err, mailId: id }, 'could not queue a mail job; the sweep will');
    }
  }

  /**
   * Tries the message now, for a request whose answer should say whether it went (a report
   * e-mail). Waits at most `immediateTimeoutMs`; then, or on a passing failure, the message stays
   * queued and a job retries it. Never throws.
   */
  async deliverNow(id: string): Promise<'sent' | 'failed' | 'queued'> {
    const attempt = this.deliver(id).catch((err) => {
      this.opts.logger.warn({ err, mailId: id }, 'immediate mail try failed');
      return 'queued' as const;
    });
    this.inFlight.add(attempt);
    void attempt.finally(() => this.inFlight.delete(attempt));
    const timeout = new Promise<'queued'>((resolve) => setTimeout(() => resolve('queued'), this.opts.immediateTimeoutMs ?? 8000).unref());
    const result = await Promise.race([attempt, timeout]);
    return result === 'skipped' ? 'queued' : result;
  }

  /** One try at one message; `job` is the pg-boss job when a worker runs it. */
  async deliver(id: string, job?: JobInfo): Promise<'sent' | 'failed' | 'queued' | 'skipped'> {
    const [row] = (await this.conn.execute(
      `update mail_message set status = 'sending', claimed_at = now(), attempts = attempts + 1, updated_at = now()
       where id = ? and status = 'queued' returning *`,
      [id],
    )) as MailRow[];
    // Sent, failed, or being sent by another worker: nothing to do.
    if (!row) return 'skipped';
    try {
      const body = row.body ?? { text: '' };
      const attachments = await this.loadAttachments(body.attachments ?? []);
      const { messageId } = await this.opts.mailer.send({
        shopId: row.shop_id,
        to: row.recipient,
        subject: row.subject,
        text: body.text,
        ...(body.html !== undefined ? { html: body.html } : {}),
        ...(body.fromName ? { fromName: body.fromName } : {}),
        ...(body.replyTo ? { replyTo: body.replyTo } : {}),
        ...(attachments.length ? { attachments } : {}),
        messageId: `<${createHash('sha256').update(row.message_key).digest('hex').slice(0, 32)}@pullbook.mail>`,
      });
      // The body may hold a one-time link: it is not kept once the message is out.
      await this.conn.execute(
        `update mail_message set status = 'sent', sent_at = now(), provider_message_id = ?, body = null, last_error = null, updated_at = now() where id = ? and status = 'sending'`,
        [String(messageId ?? '').slice(0, 300), id],
      );
      if (row.report_delivery_id) await this.conn.execute(`update report_delivery set status = 'sent', message_id = ?, error = null where id = ?`, [String(messageId ?? '').slice(0, 300), row.report_delivery_id]);
      return 'sent';
    } catch (err) {
      const error = describeMailError(err, this.opts.relayNames);
      const final = isPermanentMailError(err) || (job !== undefined && job.retryCount >= job.retryLimit);
      if (final) {
        await this.conn.execute(`update mail_message set status = 'failed', last_error = ?, updated_at = now() where id = ? and status = 'sending'`, [error, id]);
        // A report e-mail that never went carries a link nobody received: it is removed.
        if (row.share_link_id) await this.conn.execute('delete from share_link where id = ?', [row.share_link_id]);
        if (row.report_delivery_id) await this.conn.execute(`update report_delivery set status = 'failed', error = ? where id = ?`, [error, row.report_delivery_id]);
        this.opts.logger.warn({ mailId: id, kind: row.kind, error }, 'mail failed for good');
        return 'failed';
      }
      const retryCount = job?.retryCount ?? 0;
      const waitSeconds = Math.min(3600, (this.opts.retry?.mail?.retryDelay ?? 15) * 2 ** retryCount);
      await this.conn.execute(
        `update mail_message set status = 'queued', last_error = ?, next_attempt_at = now() + make_interval(secs => ?), updated_at = now() where id = ? and status = 'sending'`,
        [error, waitSeconds, id],
      );
      this.opts.logger.warn({ mailId: id, kind: row.kind, error, retryCount }, 'mail try failed; will retry');
      // A worker's job is retried by pg-boss (the throw); an immediate try queues its first job.
      if (job) throw new Error(error);
      await this.dispatch(id, waitSeconds);
      return 'queued';
    }
  }

  private async loadAttachments(list: NonNullable<StoredBody['attachments']>): Promise<MailAttachment[]> {
    const out: MailAttachment[] = [];
    for (const a of list) {
      let content: Buffer;
      if (a.storageKey) {
        content = await this.opts.storage.getBuffer(a.storageKey);
        if (a.sha256 && createHash('sha256').update(content).digest('hex') !== a.sha256) {
          throw Object.assign(new Error(`The stored file for ${a.filename} does not match its recorded hash`), { code: 'EMESSAGE' });
        }
      } else content = Buffer.from(a.content ?? '', 'base64');
      out.push({ filename: a.filename, content, ...(a.contentType ? { contentType: a.contentType } : {}) });
    }
    return out;
  }

  /**
   * Releases claims older than CLAIM_TIMEOUT (a worker died mid-send) and queues a job for every
   * message overdue by more than the grace time (its job was lost). Safe on several instances at
   * once: rows are taken with FOR UPDATE SKIP LOCKED.
   */
  async sweep(): Promise<number> {
    await this.conn.execute(
      `update mail_message set status = 'queued', next_attempt_at = now(), updated_at = now() where status = 'sending' and claimed_at < now() - make_interval(secs => ?)`,
      [CLAIM_TIMEOUT_SECONDS],
    );
    const due = (await this.conn.execute(
      `with due as (select id from mail_message where status = 'queued' and next_attempt_at < now() - make_interval(secs => ?)
                    order by next_attempt_at limit 50 for update skip locked)
       update mail_message m set next_attempt_at = now(), updated_at = now() from due where m.id = due.id returning m.id`,
      [this.opts.sweepGraceSeconds ?? 60],
    )) as { id: string }[];
    for (const { id } of due) await this.dispatch(id);
    return due.length;
  }

  /** The shop's send log, newest first. */
  async list(shopId: string, limit = 200): Promise<MailLogRow[]> {
    const rows = (await this.conn.execute(
      `select id, kind, recipient, subject, status, attempts, last_error, created_at, sent_at, next_attempt_at, report_delivery_id, (body is not null) as has_body
       from mail_message where shop_id = ? order by created_at desc limit ?`,
      [shopId, limit],
    )) as (MailRow & { has_body: boolean })[];
    return rows.map((r) => ({
      id: r.id,
      kind: r.kind,
      to: r.recipient,
      subject: r.subject,
      // "sending" is a moment inside a try; staff see it as still queued.
      status: r.status === 'sending' ? 'queued' : r.status,
      attempts: r.attempts,
      error: r.status === 'sent' ? null : r.last_error,
      createdAt: new Date(r.created_at).toISOString(),
      sentAt: r.sent_at ? new Date(r.sent_at).toISOString() : null,
      nextAttemptAt: r.status === 'queued' ? new Date(r.next_attempt_at).toISOString() : null,
      retryable: r.status === 'failed' && r.has_body && !r.report_delivery_id,
    }));
  }

  /**
   * Queues a failed message again (not a report e-mail: its link was removed; send the report
   * again instead), or asks for a queued one to be tried now. False when the message is neither.
   */
  async retry(shopId: string, id: string): Promise<boolean> {
    const rows = (await this.conn.execute(
      `update mail_message set status = 'queued', next_attempt_at = now(), updated_at = now()
       where id = ? and shop_id = ? and body is not null and report_delivery_id is null and status in ('failed', 'queued') returning id`,
      [id, shopId],
    )) as { id: string }[];
    if (!rows.length) return false;
    await this.dispatch(id);
    return true;
  }
}
