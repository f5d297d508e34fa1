import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';

/** The newest message the SMTP fake captured for an address (and passing `accept`); waits briefly for delivery. */
export async function latestMailTo(address: string, timeoutMs = 5000, accept: (m: { text: string }) => boolean = () => true): Promise<ParsedMail & { text: string }> {
  const dir = process.env.MAIL_CAPTURE_DIR;
  if (!dir) throw new Error('MAIL_CAPTURE_DIR is not set (run with npm test)');
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const files = (await fs.readdir(dir).catch(() => [] as string[])).filter((f) => f.endsWith('.eml')).sort().reverse();
    for (const f of files) {
      const parsed = await simpleParser(await fs.readFile(path.join(dir, f)));
      const to = Array.isArray(parsed.to) ? parsed.to.map((x) => x.text).join(',') : (parsed.to?.text ?? '');
      if (to.toLowerCase().includes(address.toLowerCase()) && accept({ text: parsed.text ?? '' })) return Object.assign(parsed, { text: parsed.text ?? '' });
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${address} within ${timeoutMs} ms`);
}

/** The token after `marker` in the first link of a mail body. */
export function linkIn(text: string, marker: string): string {
  const m = text.match(new RegExp(`${marker.replace(/[/.]/g, '\\$&')}([A-Za-z0-9_-]+)`));
  if (!m) throw new Error(`no link with ${marker} in: ${text}`);
  return m[1];
}
