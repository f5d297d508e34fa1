import { useEffect, useMemo, useRef } from 'react';
import { ReactECharts } from '@/lib/echarts';
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { LINE_DASHARRAY, baseChartOption, runSeries, whenChartFontReady } from '@/lib/chart-theme';
import type { ReportCurveView, ReportRunView } from '../api/types';
import type { DisplayUnits } from '@shared/units-display';
import { niceStep, sharedPowerTorqueRange } from '@shared/chart-scale';

/** The report's overlay chart on screen: the same curves, colours and line styles as the PDF. */
export function ReportChart({ runs, curves, units, summary, height = 380 }: { runs: ReportRunView[]; curves: ReportCurveView[]; units: DisplayUnits; summary: string; height?: number }) {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  const option = useMemo<EChartsOption>(() => {
    const byId = new Map(runs.map((r) => [r.id, r]));
    const base = baseChartOption({ xName: 'Engine speed (rpm)', yName: `Power (${units.power})`, y2Name: `Torque (${units.torque})`, description: `Power and torque of ${runs.length} runs against engine speed. ${summary}` });
    const series: LineSeriesOption[] = curves.flatMap((c) => {
      const run = byId.get(c.runId);
      const i = run?.colorIndex ?? 0;
      const name = run ? `${run.label}${run.isBaseline ? ' (baseline)' : ''}` : 'Run';
      return [
        runSeries(i, 'power', { id: `${c.runId}-p`, name, data: c.rpm.map((r, k) => [r, units.p(c.powerHp[k])]) }),
        runSeries(i, 'torque', { id: `${c.runId}-t`, name, data: c.rpm.map((r, k) => [r, units.t(c.torqueLbft[k])]) }),
      ];
    });
    // One scale for power and torque so the curves cross at 5,252 rpm (hp, lb·ft) or 9,549 rpm (kW, N·m).
    const pw = curves.flatMap((c) => c.powerHp.map(units.p));
    const tq = curves.flatMap((c) => c.torqueLbft.map(units.t));
    const shared = pw.length && tq.length ? sharedPowerTorqueRange(Math.max(...pw), Math.max(...tq), Math.min(...pw), Math.min(...tq)) : null;
    const yAxis = shared && Array.isArray(base.yAxis) ? base.yAxis.map((a) => ({ ...a, min: shared.min, max: shared.max, interval: niceStep(shared.max - shared.min) })) : base.yAxis;
    return { ...base, yAxis, grid: { ...(base.grid as object), bottom: 56 }, series };
  }, [runs, curves, units, summary]);
  return (
    <figure className="m-0">
      <ReactECharts ref={ref} option={option} notMerge style={{ height, width: '100%' }} opts={{ renderer: 'canvas' }} />
      <figcaption className="mt-1 flex flex-wrap items-center justify-center gap-4 text-sm text-ink-muted">
        <span className="inline-flex items-center gap-2">
          <svg width="28" height="6" aria-hidden="true">
            <line x1="0" x2="28" y1="3" y2="3" stroke="currentColor" strokeWidth="2.5" />
          </svg>
          power ({units.power}), solid
        </span>
        <span className="inline-flex items-center gap-2">
          <svg width="28" height="6" aria-hidden="true">
            <line x1="0" x2="28" y1="3" y2="3" stroke="currentColor" strokeWidth="2" strokeDasharray={LINE_DASHARRAY.torque} />
          </svg>
          torque ({units.torque}), dashed
        </span>
      </figcaption>
    </figure>
  );
}
