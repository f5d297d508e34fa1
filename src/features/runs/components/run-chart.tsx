import { useEffect, useMemo, useRef } from 'react';
import { ReactECharts } from '@/lib/echarts';
import type { EChartsOption, LineSeriesOption } from 'echarts';
import { baseChartOption, runColor, runSeries, whenChartFontReady } from '@/lib/chart-theme';
import { formatNumber, formatRpm } from '@shared/format';
import { niceStep, sharedPowerTorqueRange } from '@shared/chart-scale';
import { mixtureChannels, type DisplayCurve, type MixtureChoice } from '../lib/display-curve';

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

function finite(values: number[]): number[] {
  return values.filter((v) => Number.isFinite(v));
}

interface TooltipParam {
  marker?: string;
  seriesName?: string;
  value?: unknown;
  axisValue?: unknown;
}

/** Axis tooltip: "4,450 rpm" on top, then one line per series with the value to `decimals`. */
function rpmTooltip(decimals: number, unitOf: (seriesName: string) => string = () => '') {
  return (raw: unknown) => {
    const params = (Array.isArray(raw) ? raw : [raw]) as TooltipParam[];
    if (!params.length) return '';
    const value = (p: TooltipParam) => (Array.isArray(p.value) ? Number(p.value[1]) : Number(p.value));
    const first = params[0];
    const rpm = Array.isArray(first.value) ? Number(first.value[0]) : Number(first.axisValue);
    const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;');
    const lines = params.map((p) => {
      const unit = unitOf(p.seriesName ?? '');
      return `<div>${p.marker ?? ''}${esc(p.seriesName ?? '')}: <strong>${formatNumber(value(p), { decimals })}${unit ? ` ${esc(unit)}` : ''}</strong></div>`;
    });
    return `<div style="font-weight:600;margin-bottom:2px">${formatRpm(rpm)}</div>${lines.join('')}`;
  };
}

/**
 * Power (solid) and torque (dashed) of one run, in the run's colour, on two y axes that share one
 * scale (same min and max, from sharedPowerTorqueRange), so in hp and lb·ft the curves cross at
 * 5,252 rpm as they must. The numbers themselves are shown beside the chart by the page, so nothing
 * depends on reading the canvas.
 */
export function RunChart({ curve, powerUnit, torqueUnit, title, colorIndex = 0 }: { curve: DisplayCurve; powerUnit: string; torqueUnit: string; title: string; colorIndex?: number }) {
  const ref = useFontResize();
  const option = useMemo<EChartsOption>(() => {
    const base = baseChartOption({
      xName: 'Engine speed (rpm)',
      yName: `Power (${powerUnit})`,
      y2Name: `Torque (${torqueUnit})`,
      description: `${title}: power and torque against engine speed, both on one scale. Peak power ${formatNumber(curve.peakPower?.value, { decimals: 1 })} ${powerUnit} at ${formatNumber(curve.peakPower?.rpm)} rpm; peak torque ${formatNumber(curve.peakTorque?.value, { decimals: 1 })} ${torqueUnit} at ${formatNumber(curve.peakTorque?.rpm)} rpm.`,
    });
    const p = finite(curve.power);
    const t = finite(curve.torque);
    const range = sharedPowerTorqueRange(Math.max(...p, 0), Math.max(...t, 0), Math.min(...p, 0), Math.min(...t, 0));
    const interval = niceStep(range.max - range.min);
    const yAxes = (Array.isArray(base.yAxis) ? base.yAxis : [base.yAxis]) as Record<string, unknown>[];
    // One scale for both: no per-axis "scale" fitting, identical bounds and ticks.
    const yAxis = yAxes.map((y) => ({ ...y, scale: false, min: range.min, max: range.max, interval }));
    const powerName = `Power (${powerUnit})`;
    const torqueName = `Torque (${torqueUnit})`;
    const series: LineSeriesOption[] = [
      runSeries(colorIndex, 'power', { name: powerName, data: pairs(curve.rpm, curve.power) }),
      runSeries(colorIndex, 'torque', { name: torqueName, data: pairs(curve.rpm, curve.torque) }),
    ];
    // Legend keys drawn as a solid and a dashed stroke, like the lines they name.
    const solid = 'path://M0,4 L24,4 L24,6 L0,6 Z';
    const dashed = 'path://M0,4 L7,4 L7,6 L0,6 Z M10,4 L17,4 L17,6 L10,6 Z M20,4 L24,4 L24,6 L20,6 Z';
    const xAxis = base.xAxis as Record<string, unknown>;
    return {
      ...base,
      xAxis: { ...xAxis, axisPointer: { label: { formatter: ({ value }: { value: unknown }) => formatRpm(Number(value)) } } },
      yAxis: yAxis as EChartsOption['yAxis'],
      legend: { ...(base.legend as object), data: [{ name: powerName, icon: solid }, { name: torqueName, icon: dashed }] },
      tooltip: {
        ...(base.tooltip as object),
        formatter: rpmTooltip(1, (name) => (name === powerName ? powerUnit : torqueUnit)),
      },
      series,
    };
  }, [curve, powerUnit, torqueUnit, title, colorIndex]);
  return <ReactECharts ref={ref} option={option} notMerge style={{ height: 420, width: '100%' }} opts={{ renderer: 'canvas' }} />;
}

/** Mixture channels on the same rpm axis, one line per channel, as AFR or as lambda. */
export function AfrChart({ curve, mode = 'afr' }: { curve: DisplayCurve; mode?: MixtureChoice }) {
  const ref = useFontResize();
  const option = useMemo<EChartsOption>(() => {
    const channels = mixtureChannels(curve.afr, mode);
    const quantity = mode === 'afr' ? 'AFR' : 'Lambda';
    const base = baseChartOption({
      xName: 'Engine speed (rpm)',
      yName: quantity,
      description: `${mode === 'afr' ? 'Air–fuel ratio' : 'Lambda'} against engine speed, ${channels.length} channel(s): ${channels.map((c) => c.label).join(', ')}.`,
    });
    const y = (Array.isArray(base.yAxis) ? base.yAxis[0] : base.yAxis) as Record<string, unknown>;
    const decimals = mode === 'afr' ? 1 : 2;
    const xAxis = base.xAxis as Record<string, unknown>;
    return {
      ...base,
      xAxis: { ...xAxis, axisPointer: { label: { formatter: ({ value }: { value: unknown }) => formatRpm(Number(value)) } } },
      // AFR moves in tenths and lambda in hundredths; whole-number ticks would all read "13" or "1".
      yAxis: { ...y, minInterval: decimals === 1 ? 0.1 : 0.01, axisLabel: { ...(y.axisLabel as object), formatter: (v: number) => formatNumber(v, { decimals }) } },
      tooltip: { ...(base.tooltip as object), formatter: rpmTooltip(mode === 'afr' ? 2 : 3) },
      series: channels.map((c, i) => ({
        type: 'line' as const,
        name: c.label,
        showSymbol: false,
        sampling: 'lttb' as const,
        // Channels differ by dash as well as colour.
        color: runColor(i + 2),
        lineStyle: { color: runColor(i + 2), width: 2, type: i === 0 ? ('solid' as const) : [2 + i * 2, 3] },
        data: pairs(curve.rpm, c.values),
      })),
    };
  }, [curve, mode]);
  return <ReactECharts ref={ref} option={option} notMerge style={{ height: 260, width: '100%' }} />;
}
