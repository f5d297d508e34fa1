/**
 * Pure helpers of the mail queue: subject lengths, and what a failed send may tell staff. Nothing
 * here touches the network or the database.
 */

/**
 * Longest subject Pullbook writes. RFC 5322 §2.1.1 asks that header lines stay within 78
 * characters and allows folding, so a longer subject is legal; 150 keeps it readable in a mail
 * list and well inside the send log's column (300). The 150 itself is our choice (common practice,
 * no published source).
 */
export const SUBJECT_MAX = 150;

/** `text` cut to at most `max` characters, at a word boundary when one is near, ending in "…". */
export function clip(text: string, max: number): string {
  const clean = text.replace(/\s+/g, ' ').trim();
  if (clean.length <= max) return clean;
  const room = clean.slice(0, max - 1);
  const space = room.lastIndexOf(' ');
  // Cut at the last space only when it keeps most of the room (a long unbroken word is cut mid-word).
  const cut = space >= max * 0.6 ? room.slice(0, space) : room;
  return `${cut.trimEnd()}…`;
}

/** A subject within SUBJECT_MAX, single-line (a CR or LF in a subject would start a new header). */
export function fitSubject(subject: string, max = SUBJECT_MAX): string {
  return clip(subject.replace(/[\r\n]+/g, ' '), max);
}

interface MailErrorLike {
  code?: string;
  responseCode?: number;
  response?: string;
  message?: string;
}

/**
 * True when retrying cannot help: the relay answered with a permanent (5xx) reply (RFC 5321
 * §4.2.1: 5yz is a permanent negative completion reply), or the message itself was refused.
 */
export function isPermanentMailError(err: unknown): boolean {
  const e = (err ?? {}) as MailErrorLike;
  if (typeof e.responseCode === 'number') return e.responseCode >= 500 && e.responseCode < 600;
  if (e.code === 'EENVELOPE' || e.code === 'EMESSAGE') return true;
  return /^5\d\d\b/.test(String(e.message ?? ''));
}

/** Codes nodemailer and Node give when the relay cannot be reached or refuses us. */
const REACH_CODES: Record<string, string> = {
  ECONNREFUSED: 'The mail relay refused the connection; the message will be tried again',
  ECONNECTION: 'The mail relay could not be reached; the message will be tried again',
  ETIMEDOUT: 'The mail relay did not answer in time; the message will be tried again',
  ESOCKET: 'The connection to the mail relay failed; the message will be tried again',
  ECONNRESET: 'The mail relay closed the connection; the message will be tried again',
  EDNS: 'The mail relay’s name could not be resolved; the message will be tried again',
  ENOTFOUND: 'The mail relay’s name could not be resolved; the message will be tried again',
  EAUTH: 'The mail relay refused Pullbook’s sign-in; an administrator must check the mail settings',
  ETLS: 'A secure connection to the mail relay failed; an administrator must check the mail settings',
};

/**
 * A failed send described for staff, never naming the relay: no host, address, port, user or URL
 * (a relay's reply text is kept, minus any of those). At most 500 characters.
 */
export function describeMailError(err: unknown, relayNames: readonly string[] = []): string {
  const e = (err ?? {}) as MailErrorLike;
  const code = e.code ?? /\b(E[A-Z]{3,})\b/.exec(String(e.message ?? ''))?.[1];
  if (code && REACH_CODES[code] && !(typeof e.responseCode === 'number')) return REACH_CODES[code];
  let text = String(e.response ?? e.message ?? err ?? 'The message could not be sent');
  for (const name of relayNames.filter((n) => n.length >= 3)) text = text.split(name).join('[relay]');
  text = text
    .replace(/\b[a-z][a-z0-9+.-]*:\/\/\S+/gi, '[relay]')
    .replace(/\[?\b(?:\d{1,3}\.){3}\d{1,3}\b\]?(?::\d+)?/g, '[relay]')
    .replace(/\[?(?:[0-9a-f]{0,4}:){3,}[0-9a-f]{0,4}\]?(?::\d+)?/gi, '[relay]')
    // Host names, but not the domain of an e-mail address (the recipient is the sender's own input).
    .replace(/(?<![@\w.-])(?:[a-z0-9-]+\.)+[a-z]{2,}(?::\d+)?\b/gi, '[relay]')
    .replace(/\s+/g, ' ')
    .trim();
  return clip(text, 500);
}
