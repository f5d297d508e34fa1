import { useEffect, useMemo, useRef } from 'react';
import type { EChartsOption } from 'echarts';
import { ReactECharts } from '@/lib/echarts';
import { CHART_COLORS, CHART_FONT_FAMILY, OKABE_ITO, axisNumber, baseChartOption, whenChartFontReady } from '@/lib/chart-theme';
import { palette } from '@shared/theme';
import { formatMoney, formatNumber } from '@shared/format';
import type { BuildItemDto } from '../api/finder-queries';
import { costGainPoints, gainsByCategory, type CategorySpread, type CostGainPoint } from './finder-figures';

const hp = (v: number) => `${formatNumber(v, { decimals: 1, signed: true })} hp`;
const dollars = (v: number) => formatMoney(v, { wholeUnits: true });

function useFontResize() {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  return ref;
}

/** Peak gain against the build's cost so far: where the money bought the most. */
function CostGainScatter({ points }: { points: CostGainPoint[] }) {
  const ref = useFontResize();
  const description = `Peak power gain against build cost for ${points.length} builds: cost from ${dollars(Math.min(...points.map((p) => p.cost)))} to ${dollars(Math.max(...points.map((p) => p.cost)))}, gain from ${hp(Math.min(...points.map((p) => p.gainHp)))} to ${hp(Math.max(...points.map((p) => p.gainHp)))}.`;
  const option = useMemo<EChartsOption>(() => {
    const base = baseChartOption({ xName: 'Build cost ($)', yName: 'Peak power gain (hp)', legend: false, description });
    return {
      ...base,
      grid: { left: 64, right: 24, top: 16, bottom: 56 },
      xAxis: { ...(base.xAxis as object), scale: false, min: 0 },
      tooltip: {
        ...(base.tooltip as object),
        trigger: 'item',
        formatter: (p: unknown) => {
          const d = (p as { data: { point: CostGainPoint } }).data.point;
          return `${d.label}<br/>${hp(d.gainHp)} · ${dollars(d.cost)}`;
        },
      },
      series: [
        {
          type: 'scatter',
          symbolSize: 12,
          itemStyle: { color: OKABE_ITO.blue, borderColor: palette.ink.DEFAULT, borderWidth: 1, opacity: 0.85 },
          data: points.map((p) => ({ value: [p.cost, p.gainHp], point: p })),
        },
      ],
    };
  }, [points, description]);
  return (
    <figure className="m-0 min-w-0">
      <figcaption className="px-1 text-sm font-semibold text-ink">Peak gain against build cost</figcaption>
      <div>
        <ReactECharts ref={ref} option={option} notMerge style={{ height: 300, width: '100%' }} opts={{ renderer: 'svg' }} />
      </div>
    </figure>
  );
}

/** Spread of peak gains of the builds that include each part category. */
function CategoryBoxPlot({ spreads }: { spreads: CategorySpread[] }) {
  const ref = useFontResize();
  const description = `Gains by part category, peak power gain of the builds that include each category (lowest, quartiles, median, highest): ${spreads.map((s) => `${s.label}, ${s.count} builds, median ${hp(s.median)}, from ${hp(s.min)} to ${hp(s.max)}`).join('; ')}.`;
  const option = useMemo<EChartsOption>(() => {
    const base = baseChartOption({ yName: 'Peak power gain (hp)', legend: false, description });
    return {
      ...base,
      grid: { left: 64, right: 16, top: 16, bottom: 72 },
      xAxis: {
        type: 'category',
        data: spreads.map((s) => `${s.label} (${s.count})`),
        axisLine: { show: true, lineStyle: { color: CHART_COLORS.axisLine } },
        axisLabel: { color: CHART_COLORS.text, fontSize: 12, fontFamily: CHART_FONT_FAMILY, interval: 0, rotate: spreads.length > 4 ? 30 : 0, formatter: (v: string) => v },
      },
      yAxis: { ...(Array.isArray(base.yAxis) ? base.yAxis[0] : {}), axisLabel: { color: CHART_COLORS.mutedText, fontSize: 12, fontFamily: CHART_FONT_FAMILY, formatter: axisNumber } },
      tooltip: {
        ...(base.tooltip as object),
        trigger: 'item',
        formatter: (p: unknown) => {
          const s = spreads[(p as { dataIndex: number }).dataIndex];
          return `${s.label}: ${s.count} builds<br/>median ${hp(s.median)}<br/>middle half ${hp(s.q1)} to ${hp(s.q3)}<br/>all ${hp(s.min)} to ${hp(s.max)}`;
        },
      },
      series: [
        {
          type: 'boxplot',
          itemStyle: { color: palette.gain.soft, borderColor: palette.gain.DEFAULT, borderWidth: 1.5 },
          data: spreads.map((s) => [s.min, s.q1, s.median, s.q3, s.max]),
        },
      ],
    };
  }, [spreads, description]);
  return (
    <figure className="m-0 min-w-0">
      <figcaption className="px-1 text-sm font-semibold text-ink">Gains by part category</figcaption>
      <div>
        <ReactECharts ref={ref} option={option} notMerge style={{ height: 300, width: '100%' }} opts={{ renderer: 'svg' }} />
      </div>
      <p className="m-0 px-1 text-xs text-ink-muted">Box: middle half of the builds with the median; whiskers: lowest and highest. A build counts for every category it has.</p>
    </figure>
  );
}

/** The finder's two pictures of the builds shown, above the table. */
export function FinderCharts({ items }: { items: BuildItemDto[] }) {
  const points = useMemo(() => costGainPoints(items), [items]);
  const spreads = useMemo(() => gainsByCategory(items), [items]);
  if (points.length === 0) return null;
  return (
    <div className="grid min-w-0 gap-4 rounded-card border border-line bg-paper-raised p-3 lg:grid-cols-2">
      <CostGainScatter points={points} />
      {spreads.length > 0 && <CategoryBoxPlot spreads={spreads} />}
    </div>
  );
}
