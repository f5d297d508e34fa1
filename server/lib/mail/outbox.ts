import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { AppError } from '../errors';
import { SHOP_HEADER } from './mailer';
import type { CapturedMessage } from '@shared/schemas/outbox';

/**
 * Reads the messages the local SMTP fake kept (one .eml file each), newest first. Only
 * available when MAIL_CAPTURE_DIR is set, i.e. when mail goes to the fake, not a real relay.
 */
export function createOutbox(dir: string | undefined) {
  const requireDir = () => {
    if (!dir) throw new AppError('OUTBOX_DISABLED', 'Mail goes to a real relay; there is no local outbox to show', 404);
    return dir;
  };
  const safeName = (id: string) => {
    if (!/^[\w.-]+\.eml$/.test(id)) throw new AppError('NOT_FOUND', 'Message not found', 404);
    return id;
  };
  async function parse(file: string): Promise<CapturedMessage & { raw: Buffer; parsed: Awaited<ReturnType<typeof simpleParser>> }> {
    const raw = await fs.readFile(path.join(requireDir(), file));
    const parsed = await simpleParser(raw);
    const stat = await fs.stat(path.join(requireDir(), file));
    const addr = (a: unknown) => (Array.isArray(a) ? a.map((x) => x.text).join(', ') : ((a as { text?: string })?.text ?? ''));
    const shopHeader = parsed.headers.get(SHOP_HEADER.toLowerCase());
    return {
      id: file,
      shopId: typeof shopHeader === 'string' ? shopHeader : null,
      receivedAt: stat.mtime.toISOString(),
      from: addr(parsed.from),
      to: addr(parsed.to),
      subject: parsed.subject ?? '',
      text: parsed.text ?? '',
      attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? 'attachment', contentType: a.contentType, size: a.size })),
      raw,
      parsed,
    };
  }
  return {
    enabled: Boolean(dir),
    /** The newest messages sent for one shop. */
    async list(shopId: string, limit = 100): Promise<CapturedMessage[]> {
      const files = (await fs.readdir(requireDir()).catch(() => [])).filter((f) => f.endsWith('.eml')).sort().reverse();
      const out: CapturedMessage[] = [];
      for (const f of files) {
        if (out.length >= limit) break;
        const { raw: _raw, parsed: _parsed, ...msg } = await parse(f);
        if (msg.shopId === shopId) out.push(msg);
      }
      return out;
    },
    /** One message, only if it was sent for that shop (otherwise the same 404 as a missing one). */
    async get(shopId: string, id: string) {
      const msg = await parse(safeName(id)).catch(() => null);
      if (!msg || msg.shopId !== shopId) throw new AppError('NOT_FOUND', 'Message not found', 404);
      return msg;
    },
  };
}
export type Outbox = ReturnType<typeof createOutbox>;
