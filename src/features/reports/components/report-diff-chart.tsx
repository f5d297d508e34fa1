import { useEffect, useMemo, useRef } from 'react';
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { ReactECharts } from '@/lib/echarts';
import { CHART_COLORS, baseChartOption, runSeries, whenChartFontReady } from '@/lib/chart-theme';
import { differenceFromBaseline, differenceRange } from '@shared/curve-difference';
import { niceStep } from '@shared/chart-scale';
import { formatGain } from '@shared/format';
import type { DisplayUnits } from '@shared/units-display';
import type { ReportCurveView, ReportGainView, ReportRunView } from '../api/types';

/**
 * The second chart beside the absolute curves: each run minus the baseline at every rpm, power
 * solid and torque dashed in the run's colour, around a zero line — where the gain is, and where
 * nothing changed or power was lost.
 */
export function ReportDiffChart({ runs, curves, gains, units, height = 380 }: { runs: ReportRunView[]; curves: ReportCurveView[]; gains: ReportGainView[]; units: DisplayUnits; height?: number }) {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  const baseline = runs.find((r) => r.isBaseline);
  const diffs = useMemo(() => (baseline ? differenceFromBaseline(curves, baseline.id) : []), [curves, baseline]);
  const byId = useMemo(() => new Map(runs.map((r) => [r.id, r])), [runs]);
  const description = `Difference from the baseline${baseline ? ` (${baseline.label})` : ''} at each engine speed, power (${units.power}) solid and torque (${units.torque}) dashed: ${gains
    .map((g) => `${byId.get(g.runId)?.label ?? 'run'} largest gain ${formatGain(units.p(g.largestGain.hp), units.power)} at ${g.largestGain.rpm} rpm, largest loss ${formatGain(units.p(g.largestLoss.hp), units.power)} at ${g.largestLoss.rpm} rpm`)
    .join('; ')}.`;
  const option = useMemo<EChartsOption>(() => {
    const base = baseChartOption({ xName: 'Engine speed (rpm)', yName: `Difference (${units.power}; ${units.torque})`, description });
    const series: LineSeriesOption[] = diffs.flatMap((d, k) => {
      const run = byId.get(d.runId);
      const i = run?.colorIndex ?? 0;
      const name = run?.label ?? 'Run';
      return [
        runSeries(i, 'power', {
          id: `${d.runId}-dp`,
          name,
          yAxisIndex: 0,
          data: d.rpm.map((r, j) => [r, units.p(d.powerHp[j])]),
          // The zero line once, on the first series.
          ...(k === 0 ? { markLine: { silent: true, symbol: 'none', label: { show: false }, lineStyle: { color: CHART_COLORS.text, width: 1.5, type: 'solid' }, data: [{ yAxis: 0 }] } } : {}),
        }),
        runSeries(i, 'torque', { id: `${d.runId}-dt`, name, yAxisIndex: 0, data: d.rpm.map((r, j) => [r, units.t(d.torqueLbft[j])]) }),
      ];
    });
    const range = differenceRange(diffs, units.p, units.t);
    const step = niceStep(range.max - range.min || 1);
    const yAxis = Array.isArray(base.yAxis) ? { ...base.yAxis[0], scale: false, min: Math.floor(range.min / step) * step, max: Math.ceil(range.max / step) * step, interval: step } : base.yAxis;
    // The same rpm axis as the absolute chart beside it (whole curves, round figures).
    const rpms = curves.flatMap((c) => (c.rpm.length ? [c.rpm[0], c.rpm[c.rpm.length - 1]] : []));
    const lo = Math.min(...rpms);
    const hi = Math.max(...rpms);
    const xStep = niceStep(hi - lo);
    const xAxis = rpms.length ? { ...(base.xAxis as object), min: Math.floor(lo / xStep) * xStep, max: Math.ceil(hi / xStep) * xStep } : base.xAxis;
    return { ...base, xAxis, yAxis, grid: { ...(base.grid as object), right: 24, bottom: 56 }, series };
  }, [diffs, byId, units, description, curves]);
  if (diffs.length === 0) return null;
  return (
    <div className="min-w-0">
      <ReactECharts ref={ref} option={option} notMerge style={{ height, width: '100%' }} opts={{ renderer: 'canvas' }} />
    </div>
  );
}
