import type { Page } from './common';

/**
 * Contract of the local outbox (GET /api/outbox): a message the SMTP fake captured, as the
 * server reads it from its .eml file and the owner's outbox screen lists it.
 */
export interface CapturedMessage {
  id: string;
  /** The shop the message was sent for (from its SHOP_HEADER), null for mail from elsewhere. */
  shopId: string | null;
  receivedAt: string;
  from: string;
  to: string;
  subject: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

/** GET /api/outbox: the shop's captured messages, newest first. */
export interface OutboxPage extends Page<CapturedMessage> {
  /** False when mail goes to a real relay: nothing is captured here then. */
  enabled: boolean;
}

/** GET /api/outbox/:id: one captured message with its HTML body, if it has one. */
export interface CapturedMessageDetail extends CapturedMessage {
  html: string | null;
}

/**
 * One message of the send log (GET /api/outbox/log): every e-mail Pullbook queued for the shop,
 * whatever relay sends it. Never names the relay; `error` is written for staff.
 */
export interface MailLogEntry {
  id: string;
  /** invite, reset, report or notice. */
  kind: string;
  to: string;
  subject: string;
  status: 'queued' | 'sent' | 'failed';
  /** Tries so far. */
  attempts: number;
  /** Why the last try failed (a queued message is retried; a failed one gave up). */
  error: string | null;
  createdAt: string;
  sentAt: string | null;
  /** When a queued message is tried next. */
  nextAttemptAt: string | null;
  /** The owner may queue it again (a failed report e-mail is sent again from its report instead). */
  retryable: boolean;
}
