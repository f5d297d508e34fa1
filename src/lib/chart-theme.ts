/**
 * One look for every chart: run-trace colours, line styles for power and torque, gain and loss
 * fills, and a base ECharts option that each chart extends.
 *
 * Canvas text cannot switch on tabular figures, so axis and tooltip numbers are formatted with
 * fixed decimals instead (see `axisNumber`); the HTML tooltip uses the `num` utility's CSS.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { fontStack, palette } from '../../tailwind.config';
import { formatNumber } from '@shared/format';

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

/** ECharts lineStyle for one run's power or torque trace. */
export function runLineStyle(index: number, quantity: TraceQuantity): NonNullable<LineSeriesOption['lineStyle']> {
  const style = LINE_STYLES[quantity];
  return { color: runColor(index), width: style.width, type: style.type === 'solid' ? 'solid' : [...style.type] };
}

/**
 * A ready line series for one run's trace: colour, dash, no per-point markers (a pull has
 * hundreds of samples) but a marker shape in the legend so runs differ by more than colour.
 */
export function runSeries(
  index: number,
  quantity: TraceQuantity,
  series: Omit<LineSeriesOption, 'type'> = {},
): LineSeriesOption {
  return {
    type: 'line',
    showSymbol: false,
    symbol: runSymbol(index),
    symbolSize: 7,
    sampling: 'lttb',
    smooth: false,
    color: runColor(index),
    lineStyle: runLineStyle(index, quantity),
    emphasis: { focus: 'series', lineStyle: { width: 'bolder' } },
    yAxisIndex: quantity === 'torque' ? 1 : 0,
    ...series,
  };
}

type DecalObject = Exclude<NonNullable<NonNullable<LineSeriesOption['itemStyle']>['decal']>, 'none'>;

/**
 * Hatch for losses: thin diagonal lines over the fill. ECharts draws a series' `itemStyle.decal`
 * on line areas too, with or without `aria.decal.show`.
 */
export function lossDecal(): DecalObject {
  return {
    symbol: 'rect',
    symbolSize: 1,
    color: 'rgba(87, 82, 76, 0.55)', // ink.muted at 55 %
    dashArrayX: [1, 0],
    dashArrayY: [2, 5],
    rotation: Math.PI / 4,
  };
}

/**
 * How the region between a run and its baseline is drawn. Gains are shaded in the gain colour
 * with a solid edge; losses are muted grey, hatched, with a dotted edge — so the two differ in
 * texture and line as well as colour.
 */
export const DELTA_STYLE = {
  gain: { color: palette.gain.DEFAULT, fillOpacity: 0.18, hatched: false, edge: 'solid' },
  loss: { color: palette.ink.subtle, fillOpacity: 0.14, hatched: true, edge: [2, 3] },
} as const;

/** A line series with an area fill styled as a gain or a loss band. */
export function deltaSeries(kind: 'gain' | 'loss', series: Omit<LineSeriesOption, 'type'> = {}): LineSeriesOption {
  const style = DELTA_STYLE[kind];
  return {
    type: 'line',
    showSymbol: false,
    silent: true,
    color: style.color,
    areaStyle: { color: style.color, opacity: style.fillOpacity },
    // Gains carry no decal at all: the string 'none' breaks ECharts 6 on chart updates.
    itemStyle: style.hatched ? { color: style.color, decal: lossDecal() } : { color: style.color },
    lineStyle: { color: style.color, width: 1.5, type: style.edge === 'solid' ? 'solid' : [...style.edge] },
    ...series,
  };
}

/** Neutral chart colours, from the app palette. */
export const CHART_COLORS = {
  text: palette.ink.DEFAULT,
  mutedText: palette.ink.muted,
  axisLine: palette.line.strong,
  gridLine: palette.line.DEFAULT,
  background: palette.paper.raised,
  tooltipBackground: palette.paper.raised,
  tooltipBorder: palette.line.strong,
  crosshair: palette.ink.subtle,
} as const;

export const CHART_FONT_FAMILY = fontStack.join(', ');

/** Axis tick labels with thousands separators: 4800 → "4,800". */
export function axisNumber(value: number | string): string {
  return formatNumber(typeof value === 'number' ? value : Number(value));
}

export interface BaseChartOptions {
  /** x axis name, e.g. "Engine speed (rpm)". */
  xName?: string;
  /** Left y axis name, e.g. "Power (hp)". */
  yName?: string;
  /** Right y axis name, e.g. "Torque (lb·ft)"; adds a second y axis. */
  y2Name?: string;
  /** Short description read by screen readers (ECharts aria). */
  description?: string;
  /** Show the legend (default true). */
  legend?: boolean;
}

/**
 * The option every Pullbook chart starts from. Charts spread it and add `series` (and any
 * overrides): `{ ...baseChartOption({ xName: 'Engine speed (rpm)', yName: 'Power (hp)' }), series }`.
 */
export function baseChartOption(options: BaseChartOptions = {}): EChartsOption {
  const { xName, yName, y2Name, description, legend = true } = options;
  const axisName = { color: CHART_COLORS.mutedText, fontSize: 13, fontWeight: 500 as const, fontFamily: CHART_FONT_FAMILY };
  const valueAxis = {
    type: 'value' as const,
    nameLocation: 'middle' as const,
    scale: true,
    axisLine: { show: true, lineStyle: { color: CHART_COLORS.axisLine } },
    axisTick: { show: true, lineStyle: { color: CHART_COLORS.axisLine } },
    axisLabel: { color: CHART_COLORS.mutedText, fontSize: 12, fontFamily: CHART_FONT_FAMILY, formatter: axisNumber },
    splitLine: { show: true, lineStyle: { color: CHART_COLORS.gridLine, width: 1 } },
    nameTextStyle: axisName,
  };
  const yAxes = [
    { ...valueAxis, name: yName, nameGap: 48, position: 'left' as const },
    ...(y2Name
      ? [{ ...valueAxis, name: y2Name, nameGap: 48, position: 'right' as const, splitLine: { show: false } }]
      : []),
  ];
  return {
    color: [...RUN_PALETTE],
    backgroundColor: 'transparent',
    textStyle: { fontFamily: CHART_FONT_FAMILY, color: CHART_COLORS.text, fontSize: 13 },
    animationDuration: 250,
    animationDurationUpdate: 200,
    aria: { enabled: true, ...(description ? { label: { description } } : {}) },
    grid: { left: 64, right: y2Name ? 64 : 24, top: legend ? 48 : 24, bottom: 56, containLabel: false },
    legend: legend
      ? {
          show: true,
          top: 8,
          left: 'center',
          icon: 'path://M0,4 L24,4 L24,6 L0,6 Z',
          itemWidth: 24,
          itemHeight: 6,
          itemGap: 20,
          textStyle: { color: CHART_COLORS.text, fontSize: 13, fontFamily: CHART_FONT_FAMILY },
        }
      : { show: false },
    xAxis: {
      ...valueAxis,
      name: xName,
      nameGap: 32,
      splitLine: { show: true, lineStyle: { color: CHART_COLORS.gridLine, width: 1, type: 'dashed' } },
    },
    yAxis: yAxes,
    tooltip: {
      trigger: 'axis',
      confine: true,
      backgroundColor: CHART_COLORS.tooltipBackground,
      borderColor: CHART_COLORS.tooltipBorder,
      borderWidth: 1,
      padding: [8, 12],
      textStyle: { color: CHART_COLORS.text, fontSize: 13, fontFamily: CHART_FONT_FAMILY },
      extraCssText: 'box-shadow: 0 4px 12px rgb(30 28 25 / 0.15); border-radius: 6px; font-variant-numeric: tabular-nums;',
      axisPointer: {
        type: 'line',
        lineStyle: { color: CHART_COLORS.crosshair, width: 1, type: 'dashed' },
        label: { backgroundColor: palette.ink.DEFAULT, fontFamily: CHART_FONT_FAMILY },
      },
    },
  };
}

/**
 * Resolves once Barlow has loaded, so a chart created before the font arrived can be resized
 * (`chart.resize()`) and redraw its canvas text in the right face.
 */
export function whenChartFontReady(): Promise<void> {
  if (typeof document === 'undefined' || !('fonts' in document)) return Promise.resolve();
  return document.fonts.load('500 13px Barlow').then(
    () => undefined,
    () => undefined,
  );
}
