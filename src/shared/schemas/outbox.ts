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
