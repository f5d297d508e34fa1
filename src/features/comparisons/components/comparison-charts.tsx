import { useEffect, useMemo, useRef } from 'react';
import type { EChartsOption, LineSeriesOption, ECharts } from 'echarts';
import { echarts, ReactECharts } from '@/lib/echarts';
import type { ComparisonPreview } from '@shared/schemas/comparison';
import { CHART_COLORS, LINE_DASHARRAY, baseChartOption, deltaSeries, runColor, runSeries, whenChartFontReady } from '@/lib/chart-theme';
import { formatNumber } from '@shared/format';
import { niceStep, powerTorqueCrossRpm, sharedPowerTorqueRange } from '@shared/chart-scale';
import type { DisplayUnits } from '@shared/units-display';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
const fmt = (v: number | null | undefined, d = 1) => (v === null || v === undefined ? '—' : formatNumber(v, { decimals: d }));

/** Handle the charts hand to their parent for exports. */
export interface ChartHandle {
  instance: () => ECharts | undefined;
  option: EChartsOption;
  height: number;
}

function useChart(onReady?: (h: ChartHandle) => void, option?: EChartsOption, height = 440) {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  useEffect(() => {
    if (option) onReady?.({ instance: () => ref.current?.getEchartsInstance(), option, height });
  }, [onReady, option, height]);
  return ref;
}

const zoom = [
  { type: 'inside' as const, xAxisIndex: 0, filterMode: 'none' as const },
  { type: 'slider' as const, xAxisIndex: 0, height: 18, bottom: 8, filterMode: 'none' as const, labelFormatter: (v: number) => formatNumber(v) },
];

/**
 * Every run's power (solid) and torque (dashed) in the run's colour, on two y axes. One legend
 * entry per run toggles both of its traces; the tooltip lists every run's values at the rpm
 * under the cursor; the rpm axis zooms (wheel, pinch, or the slider).
 */
export function OverlayChart({ preview, units, onReady, height = 440 }: { preview: ComparisonPreview; units: DisplayUnits; onReady?: (h: ChartHandle) => void; height?: number }) {
  const option = useMemo<EChartsOption>(() => {
    // Timing for the bench and the browser test: option built → ECharts reports the frame finished.
    performance.clearMarks('pb:overlay-option');
    performance.clearMeasures('pb:overlay-render');
    performance.clearMeasures('pb:overlay-first-frame');
    performance.mark('pb:overlay-option');
    const { rpm, runs } = preview.curves;
    const names = new Map(preview.runs.map((r) => [r.runId, r.name]));
    const slot = new Map(preview.runs.map((r, i) => [r.runId, r.colorIndex ?? i]));
    const base = baseChartOption({
      xName: 'Engine speed (rpm)',
      yName: `Power (${units.power})`,
      y2Name: `Torque (${units.torque})`,
      description: `Power and torque of ${runs.length} runs against engine speed. ${preview.summary.join(' ')}`,
    });
    const series: LineSeriesOption[] = runs.flatMap((c, i) => {
      const name = names.get(c.runId) ?? `Run ${i + 1}`;
      return [
        runSeries(slot.get(c.runId) ?? i, 'power', { id: `${c.runId}-p`, name, data: rpm.map((r, k) => [r, c.powerHp[k] === null ? null : units.p(c.powerHp[k]!)]), connectNulls: false }),
        runSeries(slot.get(c.runId) ?? i, 'torque', { id: `${c.runId}-t`, name, data: rpm.map((r, k) => [r, c.torqueLbft[k] === null ? null : units.t(c.torqueLbft[k]!)]), connectNulls: false }),
      ];
    });
    const tooltip = {
      ...(base.tooltip as object),
      trigger: 'axis' as const,
      axisPointer: { type: 'cross' as const, lineStyle: { color: CHART_COLORS.crosshair, type: 'dashed' as const } },
      formatter: (params: unknown) => {
        const list = Array.isArray(params) ? params : [params];
        const at = Number((list[0] as { axisValue?: number })?.axisValue);
        if (!Number.isFinite(at) || !rpm.length) return '';
        let k = 0;
        for (let j = 1; j < rpm.length; j++) if (Math.abs(rpm[j] - at) < Math.abs(rpm[k] - at)) k = j;
        const rows = runs
          .map((c, i) => {
            const p = c.powerHp[k];
            const t = c.torqueLbft[k];
            return `<tr><td style="padding-right:8px"><span style="display:inline-block;width:10px;height:10px;border-radius:2px;background:${runColor(slot.get(c.runId) ?? i)};margin-right:6px"></span>${escapeHtml(names.get(c.runId) ?? '')}</td><td style="text-align:right;padding-right:8px">${p === null ? '—' : fmt(units.p(p))}</td><td style="text-align:right">${t === null ? '—' : fmt(units.t(t))}</td></tr>`;
          })
          .join('');
        return `<div data-testid="overlay-tooltip"><div style="font-weight:600;margin-bottom:4px">${formatNumber(rpm[k])} rpm</div><table style="border-collapse:collapse"><thead><tr><th></th><th style="text-align:right;padding-right:8px;font-weight:500">${units.power}</th><th style="text-align:right;font-weight:500">${units.torque}</th></tr></thead><tbody>${rows}</tbody></table></div>`;
      },
    };
    // hp with lb·ft (or kW with N·m): both y axes on one scale so the curves cross where the trade
    // expects them to — 5,252 rpm (hp = lb·ft × rpm / 5252.113), 9,549 rpm in kW and N·m.
    const crosses = powerTorqueCrossRpm(units.power === 'kW' ? 'kw' : 'hp', units.torque === 'N·m' ? 'nm' : 'lbft') !== null;
    const values = (q: 'powerHp' | 'torqueLbft') => runs.flatMap((c) => c[q].filter((v): v is number => v !== null).map(q === 'powerHp' ? units.p : units.t));
    const pw = values('powerHp');
    const tq = values('torqueLbft');
    const shared = crosses && pw.length && tq.length ? sharedPowerTorqueRange(Math.max(...pw), Math.max(...tq), Math.min(...pw), Math.min(...tq)) : null;
    const yAxis = shared && Array.isArray(base.yAxis) ? base.yAxis.map((a) => ({ ...a, min: shared.min, max: shared.max, interval: niceStep(shared.max - shared.min) })) : base.yAxis;
    return {
      ...base,
      // Many runs drawing in at once is noise, and the entry animation alone would hold the
      // finished frame back by its whole duration: above a few runs the overlay appears at once.
      ...(runs.length > OVERLAY_ANIMATED_MAX_RUNS ? { animation: false } : {}),
      yAxis,
      grid: { ...(base.grid as object), bottom: 84 },
      xAxis: { ...(base.xAxis as object), nameGap: 28 },
      legend: { ...(base.legend as object), type: 'scroll' as const },
      tooltip,
      dataZoom: zoom,
      series,
    };
  }, [preview, units]);
  const ref = useChart(onReady, option, height);
  useEffect(() => {
    // Without the entry animation ECharts draws the frame and reports it finished inside
    // setOption (it flushes synchronously), before the chart's event handlers are bound; the
    // chart component has done that by the time this effect runs, so the frame is finished now.
    if (option.animation === false) {
      overlayEvents.rendered();
      overlayEvents.finished();
    }
  }, [option]);
  return (
    <div>
      <ReactECharts ref={ref} option={option} notMerge style={{ height, width: '100%' }} opts={{ renderer: 'canvas' }} onEvents={overlayEvents} />
      <LineKey />
    </div>
  );
}

/** Overlays of more runs than this are drawn without the entry animation. */
const OVERLAY_ANIMATED_MAX_RUNS = 4;

const overlayEvents = {
  // First frame drawn (the bench reports it beside the finished frame).
  rendered: () => {
    if (performance.getEntriesByName('pb:overlay-first-frame').length === 0 && performance.getEntriesByName('pb:overlay-option').length) {
      performance.measure('pb:overlay-first-frame', 'pb:overlay-option');
    }
  },
  finished: () => {
    if (performance.getEntriesByName('pb:overlay-render').length === 0 && performance.getEntriesByName('pb:overlay-option').length) {
      performance.measure('pb:overlay-render', 'pb:overlay-option');
    }
  },
};

function LineKey() {
  const line = (dash: string | undefined) => (
    <svg width="28" height="8" aria-hidden="true">
      <line x1="0" y1="4" x2="28" y2="4" stroke="currentColor" strokeWidth="2.5" strokeDasharray={dash} />
    </svg>
  );
  return (
    <p className="mt-1 flex flex-wrap gap-x-5 gap-y-1 text-sm text-ink-muted">
      <span className="inline-flex items-center gap-2">{line(LINE_DASHARRAY.power)} Power</span>
      <span className="inline-flex items-center gap-2">{line(LINE_DASHARRAY.torque)} Torque</span>
      <span>Click a run in the legend to hide or show it; scroll or drag the slider to zoom the rpm axis.</span>
    </p>
  );
}

/**
 * One run against the baseline: Δpower with gains shaded and losses hatched (texture and edge
 * differ, not only colour), Δpower as a solid line and Δtorque dashed in the run's colour.
 */
export function DifferenceChart({ preview, runId, units, onReady, height = 300 }: { preview: ComparisonPreview; runId: string; units: DisplayUnits; onReady?: (h: ChartHandle) => void; height?: number }) {
  const option = useMemo<EChartsOption>(() => {
    const result = preview.results.find((r) => r.runId === runId) ?? preview.results[0];
    const index = Math.max(0, preview.runs.findIndex((r) => r.runId === result.runId));
    const name = preview.runs[index]?.name ?? 'Run';
    const colorIndex = preview.runs[index]?.colorIndex ?? index;
    const { rpm, powerHp, torqueLbft } = result.delta;
    const dp = powerHp.map(units.p);
    const dt = torqueLbft.map(units.t);
    const base = baseChartOption({
      xName: 'Engine speed (rpm)',
      yName: `Δ power (${units.power})`,
      y2Name: `Δ torque (${units.torque})`,
      description: `${name} minus the baseline ${preview.baseline.name}, by engine speed. Gains are shaded, losses hatched.`,
    });
    // Fill to zero rather than to the axis minimum.
    const origin0 = (s: LineSeriesOption): LineSeriesOption => ({ ...s, areaStyle: { ...(s.areaStyle as object), origin: 0 } });
    return {
      ...base,
      grid: { ...(base.grid as object), bottom: 84 },
      xAxis: { ...(base.xAxis as object), nameGap: 28 },
      tooltip: {
        ...(base.tooltip as object),
        valueFormatter: (v: unknown) => formatNumber(typeof v === 'number' ? v : Number(v), { decimals: 1, signed: true }),
      },
      dataZoom: zoom,
      series: [
        origin0(deltaSeries('gain', { name: 'Gain', data: rpm.map((r, i) => [r, Math.max(0, dp[i])]), tooltip: { show: false } })),
        origin0(deltaSeries('loss', { name: 'Loss', data: rpm.map((r, i) => [r, Math.min(0, dp[i])]), tooltip: { show: false } })),
        runSeries(colorIndex, 'power', { name: `Δ power (${units.power})`, data: rpm.map((r, i) => [r, dp[i]]), markLine: { silent: true, symbol: 'none', label: { show: false }, lineStyle: { color: CHART_COLORS.axisLine, type: 'solid', width: 1 }, data: [{ yAxis: 0 }] } }),
        runSeries(colorIndex, 'torque', { name: `Δ torque (${units.torque})`, data: rpm.map((r, i) => [r, dt[i]]) }),
      ],
    };
  }, [preview, runId, units]);
  const ref = useChart(onReady, option, height);
  return <ReactECharts ref={ref} option={option} notMerge style={{ height, width: '100%' }} opts={{ renderer: 'canvas' }} />;
}

/** PNG of the chart as drawn (2× for print), on white. */
export function chartPng(h: ChartHandle): string | undefined {
  return h.instance()?.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#ffffff' });
}

/** An SVG copy of the chart: the same option rendered once by ECharts' SVG renderer, off screen. */
export function chartSvg(h: ChartHandle): string {
  const width = h.instance()?.getWidth() ?? 1000;
  const div = document.createElement('div');
  div.style.cssText = `position:fixed;left:-10000px;top:0;width:${width}px;height:${h.height}px`;
  document.body.appendChild(div);
  const chart = echarts.init(div, undefined, { renderer: 'svg', width, height: h.height });
  try {
    chart.setOption({ ...h.option, animation: false, backgroundColor: '#ffffff', dataZoom: [] });
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
    div.remove();
  }
}
