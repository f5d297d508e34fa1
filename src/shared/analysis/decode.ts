/**
 * Text decoding: UTF-8 with or without BOM, UTF-16 LE/BE with BOM (or clearly UTF-16 without
 * one), and a Latin-1 (Windows-1252) fallback for files that are not valid UTF-8. Binary files are
 * refused. Browser-safe (TextDecoder only).
 */
import { AnalysisError } from './errors.js';

/** Encodings the reader understands. */
export type TextEncodingName = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

/** What {@link detectEncoding} found at the start of the bytes. */
export interface EncodingGuess {
  encoding: TextEncodingName;
  /** Bytes of byte-order mark to skip. */
  bomLength: number;
}

/** How much of the start of a file is inspected to decide the encoding. */
export const SNIFF_BYTES = 64 * 1024;

/**
 * Decides the encoding from the first bytes of a file (pass at least {@link SNIFF_BYTES} when
 * available). Throws `EMPTY_FILE` or `BINARY_FILE`.
 */
export function detectEncoding(head: Uint8Array): EncodingGuess {
  if (head.length === 0) throw new AnalysisError('EMPTY_FILE', 'The file is empty.');
  if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) return { encoding: 'utf-8', bomLength: 3 };
  if (head[0] === 0xff && head[1] === 0xfe) return { encoding: 'utf-16le', bomLength: 2 };
  if (head[0] === 0xfe && head[1] === 0xff) return { encoding: 'utf-16be', bomLength: 2 };

  const sample = head.subarray(0, SNIFF_BYTES);
  let zeroEven = 0;
  let zeroOdd = 0;
  for (let i = 0; i < sample.length; i++) {
    if (sample[i] === 0) {
      if (i % 2 === 0) zeroEven++;
      else zeroOdd++;
    }
  }
  const pairs = Math.floor(sample.length / 2);
  if (pairs >= 4) {
    // ASCII text in UTF-16 has a zero in every other byte.
    if (zeroOdd > 0.4 * pairs && zeroEven < 0.02 * pairs) return { encoding: 'utf-16le', bomLength: 0 };
    if (zeroEven > 0.4 * pairs && zeroOdd < 0.02 * pairs) return { encoding: 'utf-16be', bomLength: 0 };
  }
  if (zeroEven + zeroOdd > 0) throw new AnalysisError('BINARY_FILE', 'The file is binary, not text (it contains NUL bytes).');

  try {
    // stream: true so a multi-byte character cut at the end of the sample is not an error.
    new TextDecoder('utf-8', { fatal: true }).decode(sample, { stream: true });
    return { encoding: 'utf-8', bomLength: 0 };
  } catch {
    return { encoding: 'windows-1252', bomLength: 0 };
  }
}

/**
 * Refuses decoded text that is mostly control characters (binary data that happened to contain
 * no NUL bytes). Checks only the first {@link SNIFF_BYTES} characters.
 */
export function assertLooksLikeText(text: string): void {
  const n = Math.min(text.length, SNIFF_BYTES);
  if (n === 0) return;
  let bad = 0;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) || c === 0xfffd || c === 0x7f) bad++;
  }
  if (bad > Math.max(2, n * 0.01)) throw new AnalysisError('BINARY_FILE', 'The file is binary, not text.');
}

/** Incremental decoder for streamed input; the BOM is skipped by the caller via bomLength. */
export interface StreamDecoder {
  write(chunk: Uint8Array): string;
  end(): string;
}

/** Creates an incremental decoder for one of the supported encodings. */
export function createStreamDecoder(encoding: TextEncodingName): StreamDecoder {
  const decoder = new TextDecoder(encoding, { fatal: false, ignoreBOM: true });
  return {
    write: (chunk) => decoder.decode(chunk, { stream: true }),
    end: () => decoder.decode(),
  };
}

/** Decodes a whole buffer to text (encoding detected, BOM removed). */
export function decodeBytes(bytes: Uint8Array): string {
  const guess = detectEncoding(bytes);
  const text = new TextDecoder(guess.encoding, { fatal: false, ignoreBOM: true }).decode(bytes.subarray(guess.bomLength));
  assertLooksLikeText(text);
  return text;
}
