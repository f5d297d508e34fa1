/**
 * One look for every chart: run-trace colours, line styles for power and torque, gain and loss
 * fills, and a base ECharts option that each chart extends.
 *
 * Canvas text cannot switch on tabular figures, so axis and tooltip numbers are formatted with
 * fixed decimals instead (see `axisNumber`); the HTML tooltip uses the `num` utility's CSS.
 */
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { fontStack, palette } from '@shared/theme';
import { LINE_STYLES, RUN_PALETTE, runColor, runSymbol, type TraceQuantity } from '@shared/run-style';

export { LINE_DASHARRAY, LINE_STYLES, OKABE_ITO, RUN_PALETTE, RUN_SYMBOLS, runColor, runColorMap, runSymbol, type TraceQuantity } from '@shared/run-style';
import { formatNumber } from '@shared/format';

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
