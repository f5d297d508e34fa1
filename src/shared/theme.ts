/**
 * Design tokens shared by the client's CSS (tailwind.config.ts), its charts and the server's PDF.
 */

/**
 * Pullbook's palette: warm workshop greys with one burnt-orange accent for actions.
 *
 * Exported on its own so non-CSS consumers (the chart theme) use the very same values.
 * Contrast ratios (WCAG 2.x relative luminance) are noted next to each text colour, measured on
 * `paper.DEFAULT` (#F7F5F2) and `paper.raised` (#FFFFFF). Text colours are all ≥ 4.5:1 on both;
 * `line.strong` (form-control borders) is ≥ 3:1, the WCAG 1.4.11 minimum for UI components.
 */
export const palette = {
  /** Text. */
  ink: {
    DEFAULT: '#1E1C19', // 15.6:1 / 17.0:1
    muted: '#57524C', // 7.1:1 / 7.7:1 — secondary text, labels
    subtle: '#6E6861', // 5.1:1 / 5.5:1 — hints, captions, placeholders
  },
  /** Surfaces. */
  paper: {
    DEFAULT: '#F7F5F2', // page background
    raised: '#FFFFFF', // cards, tables, dialogs
    sunk: '#EEEBE6', // table header, wells, hover rows
  },
  /** Borders and rules. */
  line: {
    DEFAULT: '#DDD8D1', // decorative dividers only
    strong: '#857D74', // 4.1:1 / 3.7:1 — input and control borders
  },
  /** The one action colour. White text on it is 5.5:1. */
  accent: {
    DEFAULT: '#B4470F', // 5.0:1 / 5.5:1 as text
    hover: '#963A0B',
    active: '#7A2F09',
    soft: '#FBEBDF', // accent text on it 4.7:1
  },
  /** Measured gain (more power). */
  gain: {
    DEFAULT: '#1D6B45', // 6.0:1 / 6.5:1
    soft: '#E3F1E8',
  },
  /** Measured loss, destructive actions, errors. White text on it is 7.1:1. */
  loss: {
    DEFAULT: '#A8261B', // 6.5:1 / 7.1:1
    hover: '#8C1F16',
    soft: '#F9E4E1',
  },
  /** Cautions and warnings. */
  warn: {
    DEFAULT: '#855400', // 5.9:1 / 6.4:1
    soft: '#FBF0D9',
  },
  /** Neutral information. */
  info: {
    DEFAULT: '#1F5A8F', // 6.6:1 / 7.2:1
    soft: '#E2ECF6',
  },
  /** Keyboard focus ring: the accent, drawn with an offset so it reads on any surface. */
  focus: '#B4470F',
} as const;

/** The UI typeface, shipped with the app via @fontsource/barlow. */
export const fontStack = ['Barlow', 'ui-sans-serif', 'system-ui', 'sans-serif'];
