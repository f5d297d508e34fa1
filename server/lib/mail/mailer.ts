import nodemailer from 'nodemailer';

export interface MailAttachment {
  filename: string;
  content: Buffer;
  contentType?: string;
}

export interface OutgoingMail {
  /** The shop the message is sent for; stamped on it so the local outbox shows each shop only its own mail. */
  shopId: string;
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: MailAttachment[];
  /**
   * The Message-ID header, stable across retries of one queued message (mail-queue.ts), so a
   * receiving system can drop a copy sent again after a crash between the relay's acceptance and
   * the send log's update.
   */
  messageId?: string;
  /** Display name of the sender (e.g. the shop's name) on the configured MAIL_FROM address. */
  fromName?: string;
  /** Where replies go (e.g. the shop's own address). */
  replyTo?: string;
}

/** The address inside a From value such as "Pullbook <no-reply@x.test>" (or the value itself). */
export const fromAddress = (from: string) => /<([^>]+)>/.exec(from)?.[1] ?? from.trim();

/** Header naming the shop a message belongs to (read back by the local outbox). */
export const SHOP_HEADER = 'X-Pullbook-Shop';

/** Sends mail through SMTP_URL, whatever relay that names (the local fake included). */
export interface Mailer {
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
}

export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const url = new URL(smtpUrl);
  const secure = url.protocol === 'smtps:';
  const transport = nodemailer.createTransport({
    host: url.hostname,
    port: Number(url.port || (secure ? 465 : 587)),
    secure,
    auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
    // Plain SMTP to a loopback fake; a real relay on 587 still upgrades with STARTTLS when offered.
    ignoreTLS: url.hostname === '127.0.0.1' || url.hostname === 'localhost',
    // A relay that hangs must not hold a send (or a request waiting for one) for minutes.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send({ shopId, fromName, ...mail }) {
      const sender = fromName ? { name: fromName, address: fromAddress(from) } : from;
      const info = await transport.sendMail({ from: sender, ...mail, headers: { [SHOP_HEADER]: shopId } });
      return { messageId: info.messageId };
    },
  };
}
