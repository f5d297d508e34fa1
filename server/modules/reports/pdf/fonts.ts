/**
 * Barlow for the PDF, registered from the .woff files @fontsource/barlow ships (the app's own
 * typeface). The .woff2 files crash react-pdf's font engine on some characters, so only .woff.
 * The latin subset covers what the report prints (°, ·, ³, −, –, —); it has no arrows or Greek.
 */
import { createRequire } from 'node:module';
import { Font } from '@react-pdf/renderer';

const require = createRequire(import.meta.url);
let registered = false;

export const PDF_FONT = 'Barlow';

/** Words up to this many characters stay whole; longer ones may break between pieces of LONG_WORD_PIECE. */
const LONG_WORD = 24;
const LONG_WORD_PIECE = 8;

/** The places a word may break at, as react-pdf's hyphenation callback wants them (its pieces in order). */
export function breakableParts(word: string): string[] {
  const chars = Array.from(word);
  if (chars.length <= LONG_WORD) return [word];
  const parts: string[] = [];
  for (let i = 0; i < chars.length; i += LONG_WORD_PIECE) parts.push(chars.slice(i, i + LONG_WORD_PIECE).join(''));
  return parts;
}

export function registerReportFonts(): void {
  if (registered) return;
  const file = (weight: number, style: 'normal' | 'italic' = 'normal') => require.resolve(`@fontsource/barlow/files/barlow-latin-${weight}-${style}.woff`);
  Font.register({
    family: PDF_FONT,
    fonts: [
      { src: file(400), fontWeight: 400 },
      { src: file(400, 'italic'), fontWeight: 400, fontStyle: 'italic' },
      { src: file(500), fontWeight: 500 },
      { src: file(600), fontWeight: 600 },
      { src: file(700), fontWeight: 700 },
    ],
  });
  // Ordinary words are never split (part descriptions, names); a long unbroken one (a pasted
  // reference, an address typed without spaces) may break every few letters instead of running
  // off the page.
  Font.registerHyphenationCallback(breakableParts);
  registered = true;
}
