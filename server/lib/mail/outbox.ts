import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { AppError } from '../errors';

export interface CapturedMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string;
  subject: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

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
    return {
      id: file,
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
    async list(limit = 100): Promise<CapturedMessage[]> {
      const files = (await fs.readdir(requireDir()).catch(() => [])).filter((f) => f.endsWith('.eml')).sort().reverse().slice(0, limit);
      const out: CapturedMessage[] = [];
      for (const f of files) {
        const { raw: _raw, parsed: _parsed, ...msg } = await parse(f);
        out.push(msg);
      }
      return out;
    },
    async get(id: string) {
      return parse(safeName(id));
    },
  };
}
export type Outbox = ReturnType<typeof createOutbox>;
