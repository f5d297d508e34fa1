import { useEffect, useMemo, useRef } from 'react';
import type { EChartsOption, LineSeriesOption } from 'echarts';
import type { BayPullDto } from '@shared/schemas/bay';
import { formatNumber, formatRpm } from '@shared/format';
import { niceStep, sharedPowerTorqueRange } from '@shared/chart-scale';
import { ReactECharts } from '@/lib/echarts';
import { baseChartOption, CHART_COLORS, runSeries, whenChartFontReady } from '@/lib/chart-theme';

const pairs = (x: number[], y: number[]): [number, number][] => x.map((v, i) => [v, y[i]]);

/**
 * The session's pulls over the reference run, big enough for a tablet on the wall: the reference
 * in grey, each pull in its own colour (power solid, torque dashed), the newest drawn thickest.
 * Both y axes share one scale, so hp and lb·ft cross at 5,252 rpm. The figures are beside it.
 */
export function BayChart({ pulls, reference, referenceLabel }: { pulls: BayPullDto[]; reference: BayPullDto | null; referenceLabel: string | null }) {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  const option = useMemo<EChartsOption>(() => {
    const drawn = pulls.filter((p) => p.curve && p.run.id !== reference?.run.id);
    const all = [...drawn, ...(reference?.curve ? [reference] : [])];
    const powers = all.flatMap((p) => p.curve!.powerHp);
    const torques = all.flatMap((p) => p.curve!.torqueLbft);
    const range = sharedPowerTorqueRange(Math.max(...powers, 0), Math.max(...torques, 0), Math.min(...powers, 0), Math.min(...torques, 0));
    const base = baseChartOption({
      xName: 'Engine speed (rpm)',
      yName: 'Power (hp)',
      y2Name: 'Torque (lb·ft)',
      legend: false,
      description: `${drawn.length} pull(s) of this session${reference ? ` over ${referenceLabel ?? 'the reference run'}` : ''}; the figures are listed beside the chart.`,
    });
    const yAxes = (Array.isArray(base.yAxis) ? base.yAxis : [base.yAxis]) as Record<string, unknown>[];
    const interval = niceStep(range.max - range.min);
    const series: LineSeriesOption[] = [];
    if (reference?.curve) {
      const grey = { color: CHART_COLORS.mutedText };
      series.push(runSeries(0, 'power', { name: 'Reference power', data: pairs(reference.curve.rpm, reference.curve.powerHp), color: grey.color, lineStyle: { color: grey.color, width: 3 } }));
      series.push(runSeries(0, 'torque', { name: 'Reference torque', data: pairs(reference.curve.rpm, reference.curve.torqueLbft), color: grey.color, lineStyle: { color: grey.color, width: 2, type: [8, 5] } }));
    }
    drawn.forEach((p, i) => {
      const newest = i === drawn.length - 1;
      const colour = i + 1;
      const name = `Pull ${p.run.sequence}`;
      series.push(runSeries(colour, 'power', { name: `${name} power`, data: pairs(p.curve!.rpm, p.curve!.powerHp), lineStyle: { width: newest ? 4 : 2 }, z: newest ? 5 : 2 }));
      series.push(runSeries(colour, 'torque', { name: `${name} torque`, data: pairs(p.curve!.rpm, p.curve!.torqueLbft), lineStyle: { width: newest ? 3 : 1.5, type: [8, 5] }, z: newest ? 5 : 2 }));
    });
    const xAxis = base.xAxis as Record<string, unknown>;
    return {
      ...base,
      animation: false,
      textStyle: { ...(base.textStyle as object), fontSize: 16 },
      xAxis: { ...xAxis, axisLabel: { ...(xAxis.axisLabel as object), fontSize: 15 }, axisPointer: { label: { formatter: ({ value }: { value: unknown }) => formatRpm(Number(value)) } } },
      yAxis: yAxes.map((y) => ({ ...y, scale: false, min: range.min, max: range.max, interval, axisLabel: { ...(y.axisLabel as object), fontSize: 15 } })) as EChartsOption['yAxis'],
      tooltip: { ...(base.tooltip as object), valueFormatter: (v: unknown) => formatNumber(Number(v), { decimals: 1 }) },
      series,
    };
  }, [pulls, reference, referenceLabel]);
  return <ReactECharts ref={ref} option={option} notMerge style={{ height: 460, width: '100%' }} opts={{ renderer: 'canvas' }} />;
}
