import { useEffect, useMemo, useRef } from 'react';
import ReactECharts from 'echarts-for-react';
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { baseChartOption, runColor, runSeries, whenChartFontReady } from '@/lib/chart-theme';
import { formatNumber } from '@shared/format';
import type { DisplayCurve } from '../lib/display-curve';

function pairs(x: number[], y: number[]): [number, number][] {
  return x.map((v, i) => [v, y[i]]);
}

function useFontResize() {
  const ref = useRef<ReactECharts>(null);
  useEffect(() => {
    void whenChartFontReady().then(() => ref.current?.getEchartsInstance().resize());
  }, []);
  return ref;
}

/**
 * Power (solid) and torque (dashed) of one run, in the run's colour, on two y axes. The numbers
 * themselves are shown beside the chart by the page, so nothing depends on reading the canvas.
 */
export function RunChart({ curve, powerUnit, torqueUnit, title, colorIndex = 0 }: { curve: DisplayCurve; powerUnit: string; torqueUnit: string; title: string; colorIndex?: number }) {
  const ref = useFontResize();
  const option = useMemo<EChartsOption>(() => {
    const base = baseChartOption({
      xName: 'Engine speed (rpm)',
      yName: `Power (${powerUnit})`,
      y2Name: `Torque (${torqueUnit})`,
      description: `${title}: power and torque against engine speed. Peak power ${formatNumber(curve.peakPower?.value, { decimals: 1 })} ${powerUnit} at ${formatNumber(curve.peakPower?.rpm)} rpm; peak torque ${formatNumber(curve.peakTorque?.value, { decimals: 1 })} ${torqueUnit} at ${formatNumber(curve.peakTorque?.rpm)} rpm.`,
    });
    const series: LineSeriesOption[] = [
      runSeries(colorIndex, 'power', { name: `Power (${powerUnit})`, data: pairs(curve.rpm, curve.power) }),
      runSeries(colorIndex, 'torque', { name: `Torque (${torqueUnit})`, data: pairs(curve.rpm, curve.torque) }),
    ];
    // Legend keys drawn as a solid and a dashed stroke, like the lines they name.
    const solid = 'path://M0,4 L24,4 L24,6 L0,6 Z';
    const dashed = 'path://M0,4 L7,4 L7,6 L0,6 Z M10,4 L17,4 L17,6 L10,6 Z M20,4 L24,4 L24,6 L20,6 Z';
    return {
      ...base,
      legend: { ...(base.legend as object), data: [{ name: `Power (${powerUnit})`, icon: solid }, { name: `Torque (${torqueUnit})`, icon: dashed }] },
      tooltip: {
        ...(base.tooltip as object),
        valueFormatter: (v: unknown) => formatNumber(typeof v === 'number' ? v : Number(v), { decimals: 1 }),
      },
      series,
    };
  }, [curve, powerUnit, torqueUnit, title, colorIndex]);
  return <ReactECharts ref={ref} option={option} notMerge style={{ height: 420, width: '100%' }} opts={{ renderer: 'canvas' }} />;
}

/** Mixture channels (AFR) on the same rpm axis, one line per channel. */
export function AfrChart({ curve }: { curve: DisplayCurve }) {
  const ref = useFontResize();
  const option = useMemo<EChartsOption>(() => {
    const names = Object.keys(curve.afr);
    const base = baseChartOption({ xName: 'Engine speed (rpm)', yName: 'AFR', description: `Air–fuel ratio against engine speed, ${names.length} channel(s): ${names.join(', ')}.` });
    const y = (Array.isArray(base.yAxis) ? base.yAxis[0] : base.yAxis) as Record<string, unknown>;
    return {
      ...base,
      // AFR moves in tenths; whole-number ticks would all read "13".
      yAxis: { ...y, axisLabel: { ...(y.axisLabel as object), formatter: (v: number) => formatNumber(v, { decimals: 1 }) } },
      tooltip: { ...(base.tooltip as object), valueFormatter: (v: unknown) => formatNumber(typeof v === 'number' ? v : Number(v), { decimals: 2 }) },
      series: names.map((name, i) => ({
        type: 'line' as const,
        name,
        showSymbol: false,
        sampling: 'lttb' as const,
        // Channels differ by dash as well as colour.
        color: runColor(i + 2),
        lineStyle: { color: runColor(i + 2), width: 2, type: i === 0 ? ('solid' as const) : [2 + i * 2, 3] },
        data: pairs(curve.rpm, curve.afr[name]),
      })),
    };
  }, [curve]);
  return <ReactECharts ref={ref} option={option} notMerge style={{ height: 260, width: '100%' }} />;
}
