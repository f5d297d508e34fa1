/**
 * How a run is drawn, the same in the browser charts and the PDF: its colour (Okabe–Ito), its
 * marker, and power as a solid line with torque dashed in the same colour.
 */

/**
 * The Okabe–Ito qualitative palette, in its published order — eight colours that stay
 * distinguishable under the common forms of colour-vision deficiency.
 * Source: Okabe & Ito 2008, "Color Universal Design (CUD): How to make figures and presentations
 * that are friendly to colorblind people".
 */
export const OKABE_ITO = {
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
  black: '#000000',
} as const;

/**
 * The order runs take colours in. The same eight Okabe–Ito colours, reordered so the first runs
 * of a comparison get the colours with the most contrast on a white plot (blue 5.2:1, vermillion
 * 3.9:1, …) and yellow (1.3:1) is used only when eight runs are on one chart.
 */
export const RUN_PALETTE: readonly string[] = [
  OKABE_ITO.blue,
  OKABE_ITO.vermillion,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.black,
  OKABE_ITO.orange,
  OKABE_ITO.skyBlue,
  OKABE_ITO.yellow,
];

/** Marker shapes that tell runs apart once colours repeat (run 9 onwards) and in greyscale print. */
export const RUN_SYMBOLS = ['circle', 'rect', 'triangle', 'diamond', 'pin', 'arrow', 'roundRect'] as const;

/**
 * The colour of the run at `index` in its comparison (0 = baseline). Stable: the same index
 * always gives the same colour, so a run keeps its colour in the chart, the legend, the table
 * and the PDF. Negative or fractional indexes are folded into range rather than failing.
 */
export function runColor(index: number): string {
  const n = RUN_PALETTE.length;
  const i = Number.isFinite(index) ? Math.trunc(index) : 0;
  return RUN_PALETTE[((i % n) + n) % n];
}

/** Marker for the run at `index`: changes only after each full cycle of colours. */
export function runSymbol(index: number): (typeof RUN_SYMBOLS)[number] {
  const i = Number.isFinite(index) ? Math.max(0, Math.trunc(index)) : 0;
  return RUN_SYMBOLS[Math.floor(i / RUN_PALETTE.length) % RUN_SYMBOLS.length];
}

/**
 * Colours for a list of run ids, in the order given (put the baseline first). Use this when
 * the same set of runs appears in several places so every view agrees.
 */
export function runColorMap(runIds: readonly string[]): Map<string, string> {
  return new Map(runIds.map((id, i) => [id, runColor(i)]));
}

export type TraceQuantity = 'power' | 'torque';

/** Power is a solid line; torque is a dashed line in the same colour as its run. */
export const LINE_STYLES = {
  power: { type: 'solid', width: 2.5 },
  torque: { type: [6, 4], width: 2 },
} as const satisfies Record<TraceQuantity, { type: 'solid' | number[]; width: number }>;

/** SVG dash pattern for legends and keys drawn outside ECharts (matches `LINE_STYLES`). */
export const LINE_DASHARRAY: Record<TraceQuantity, string | undefined> = {
  power: undefined,
  torque: '6 4',
};
