import { useEffect, useMemo, useRef } from 'react';
import type { BarSeriesOption, EChartsOption } from 'echarts';
import { ReactECharts } from '@/lib/echarts';
import { CHART_COLORS, CHART_FONT_FAMILY, axisNumber, baseChartOption, lossDecal, whenChartFontReady } from '@/lib/chart-theme';
import { palette } from '@shared/theme';
import { formatMoney, formatNumber } from '@shared/format';
import { niceStep } from '@shared/chart-scale';
import type { GainBar } from './stage-gains-figures';

const money = (cents: number) => formatMoney(cents, { minorUnits: true, wholeUnits: true });

/** "+6.1 hp · $205 per hp" (or "no gain to divide by"): what each bar's label says. */
export function gainBarLabel(bar: GainBar): string {
  const gain = `${formatNumber(bar.gainHp, { decimals: 1, signed: true })} hp`;
  const cost = bar.costPerHpCents === null ? 'no gain to price' : `${money(bar.costPerHpCents)} per hp`;
  return `${gain} · ${cost}${bar.withinSpread ? ' (within spread)' : ''}`;
}

/**
 * Gain of each stage over the one before it, as horizontal bars (stage names read in full), each
 * labelled with the gain and its cost per hp; the last bar is the whole build since the baseline.
 * Losses are muted and hatched, and every bar carries its signed figure, so nothing is told by
 * colour alone.
 */
export function StageGainsChart({ bars }: { bars: GainBar[] }) {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  const description = `Gain of each stage over the one before it, in hp at peak, with its cost per hp: ${bars.map((b) => `${b.label} ${gainBarLabel(b)}`).join('; ')}.`;
  const option = useMemo<EChartsOption>(() => {
    const base = baseChartOption({ legend: false, description });
    // Top to bottom in build order: ECharts draws a category y axis from the bottom, so reverse.
    const ordered = [...bars].reverse();
    const series: BarSeriesOption = {
      type: 'bar',
      barMaxWidth: 28,
      data: ordered.map((b) => ({
        value: b.gainHp,
        itemStyle:
          b.gainHp < 0
            ? { color: palette.paper.sunk, borderColor: palette.ink.subtle, borderWidth: 1, borderType: 'dashed', decal: lossDecal() }
            : b.isTotal
              ? { color: palette.ink.muted }
              : { color: palette.gain.DEFAULT, opacity: b.withinSpread ? 0.45 : 0.85 },
        label: {
          show: true,
          position: b.gainHp < 0 ? 'left' : 'right',
          formatter: gainBarLabel(b),
          color: CHART_COLORS.text,
          fontFamily: CHART_FONT_FAMILY,
          fontSize: 13,
          fontWeight: b.isTotal ? 600 : 500,
        },
      })),
    };
    // Room beyond the longest bar for its label, on a round figure.
    const maxAbs = Math.max(1, ...bars.map((b) => Math.abs(b.gainHp)));
    const step = niceStep(maxAbs * 1.8);
    const edge = Math.ceil((maxAbs * 1.8) / step) * step;
    const hasLoss = bars.some((b) => b.gainHp < 0);
    return {
      ...base,
      tooltip: { show: false },
      // Room on the right for the labels (and on the left for a loss's label).
      grid: { left: 16, right: 16, top: 12, bottom: 44, containLabel: true },
      xAxis: {
        ...(base.xAxis as object),
        type: 'value',
        name: 'Peak power gain (hp)',
        scale: false,
        min: hasLoss ? -edge : 0,
        max: edge,
        interval: step,
        axisLabel: { color: CHART_COLORS.mutedText, fontSize: 12, fontFamily: CHART_FONT_FAMILY, formatter: axisNumber },
      },
      yAxis: {
        type: 'category',
        data: ordered.map((b) => b.label),
        axisLine: { show: true, lineStyle: { color: CHART_COLORS.axisLine } },
        axisTick: { show: false },
        axisLabel: { color: CHART_COLORS.text, fontSize: 13, fontFamily: CHART_FONT_FAMILY, width: 180, overflow: 'truncate' },
      },
      series: [series],
    };
  }, [bars, description]);
  const height = Math.max(140, bars.length * 48 + 64);
  return (
    <div className="min-w-0">
      <ReactECharts ref={ref} option={option} notMerge style={{ height, width: '100%' }} opts={{ renderer: 'svg' }} />
    </div>
  );
}
