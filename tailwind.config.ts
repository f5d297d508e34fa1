import type { Config } from 'tailwindcss';
import { fontStack, palette } from './src/shared/theme';

/** Tokens live in src/shared/theme.ts so the charts and the PDF use the very same values. */
export { fontStack, palette };

export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: palette,
      fontFamily: {
        sans: fontStack,
      },
      fontSize: {
        // Big scannable numbers for stats and peak figures.
        stat: ['2.25rem', { lineHeight: '2.5rem', fontWeight: '600' }],
        'stat-lg': ['3rem', { lineHeight: '3.25rem', fontWeight: '600' }],
      },
      borderRadius: {
        control: '0.375rem',
        card: '0.5rem',
      },
      boxShadow: {
        card: '0 1px 2px rgb(30 28 25 / 0.06), 0 1px 1px rgb(30 28 25 / 0.04)',
        overlay: '0 12px 32px rgb(30 28 25 / 0.18), 0 2px 6px rgb(30 28 25 / 0.08)',
      },
      minHeight: {
        touch: '2.5rem', // 40 px — smallest touch target we allow
      },
      minWidth: {
        touch: '2.5rem',
      },
      maxWidth: {
        page: '90rem',
      },
      zIndex: {
        toast: '60',
      },
    },
  },
} satisfies Config;
