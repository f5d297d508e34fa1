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
  // Words are never split with hyphens (part descriptions, names).
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
