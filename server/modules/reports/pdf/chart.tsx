/**
 * The overlay chart drawn as vector graphics with react-pdf's own Svg primitives, from the same
 * corrected curves as the screen. Colours and line styles come from the client's chart theme:
 * one Okabe–Ito colour per run, power solid, torque dashed.
 */
import { G, Line, Polyline, Rect, Svg, Text } from '@react-pdf/renderer';
import { LINE_DASHARRAY, LINE_STYLES, runColor } from '@shared/run-style';
import { palette } from '@shared/theme';
import { formatNumber } from '@shared/format';
import { sharedPowerTorqueRange } from '@shared/chart-scale';
import type { UnitSystem } from '../../shops/shop.entity';
import { powerIn, torqueIn, unitLabels } from '../figures';
import type { ReportCurve, ReportRun } from '../report-data';

/** "Nice" axis ticks (1, 2, 2.5, 5 × 10ⁿ) covering [lo, hi] with about `count` steps. */
export function niceTicks(lo: number, hi: number, count = 5): { min: number; max: number; step: number; ticks: number[] } {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || hi <= lo) {
    const base = Number.isFinite(lo) ? lo : 0;
    return { min: base - 1, max: base + 1, step: 1, ticks: [base - 1, base, base + 1] };
  }
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = ([1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag);
  const min = Math.floor(lo / step) * step;
  const max = Math.ceil(hi / step) * step;
  const ticks: number[] = [];
  for (let v = min; v <= max + step / 1e6; v += step) ticks.push(Number(v.toFixed(6)));
  return { min, max, step, ticks };
}

/** Every n-th point so a polyline stays light (a pull has hundreds of samples). */
function thin<T>(values: T[], max = 240): T[] {
  if (values.length <= max) return values;
  const every = Math.ceil(values.length / max);
  return values.filter((_, i) => i % every === 0 || i === values.length - 1);
}

export interface OverlayChartProps {
  width: number;
  height: number;
  runs: ReportRun[];
  curves: ReportCurve[];
  units: UnitSystem;
}

const FONT = 'Barlow';

export function OverlayChart({ width, height, runs, curves, units }: OverlayChartProps) {
  const labels = unitLabels(units);
  const m = { left: 44, right: 46, top: 10, bottom: 34 };
  const w = width - m.left - m.right;
  const h = height - m.top - m.bottom;
  const all = curves.filter((c) => c.rpm.length > 1);
  const rpmLo = Math.min(...all.map((c) => c.rpm[0]));
  const rpmHi = Math.max(...all.map((c) => c.rpm[c.rpm.length - 1]));
  const pw = all.flatMap((c) => c.powerHp.map((v) => powerIn(v, units)));
  const tq = all.flatMap((c) => c.torqueLbft.map((v) => torqueIn(v, units)));
  const x = niceTicks(rpmLo, rpmHi, 7);
  // One scale for power and torque (same min and max on both axes): in hp and lb·ft the curves then
  // cross at 5,252 rpm, in kW and N·m at 9,549 rpm, as the trade expects (src/shared/chart-scale.ts).
  const shared = sharedPowerTorqueRange(Math.max(...pw), Math.max(...tq), Math.min(...pw), Math.min(...tq));
  const yp = { ...niceTicks(shared.min, shared.max, 5), min: shared.min, max: shared.max };
  yp.ticks = yp.ticks.filter((v) => v >= shared.min - 1e-9 && v <= shared.max + 1e-9);
  const yt = yp;
  const sx = (rpm: number) => m.left + ((rpm - x.min) / (x.max - x.min)) * w;
  const syP = (v: number) => m.top + h - ((v - yp.min) / (yp.max - yp.min)) * h;
  const syT = (v: number) => m.top + h - ((v - yt.min) / (yt.max - yt.min)) * h;
  const colorOf = new Map(runs.map((r) => [r.id, runColor(r.colorIndex)]));
  const ink = palette.ink;
  const tick = { fontFamily: FONT, fontSize: 7.5, fill: ink.muted } as const;

  const pts = (c: ReportCurve, q: 'power' | 'torque') =>
    thin(c.rpm.map((r, i) => [r, i] as const))
      .map(([r, i]) => (q === 'power' ? `${sx(r).toFixed(2)},${syP(powerIn(c.powerHp[i], units)).toFixed(2)}` : `${sx(r).toFixed(2)},${syT(torqueIn(c.torqueLbft[i], units)).toFixed(2)}`))
      .join(' ');

  return (
    <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
      <Rect x={m.left} y={m.top} width={w} height={h} fill="#FFFFFF" stroke={palette.line.DEFAULT} strokeWidth={0.6} />
      {/* grid lines from the power axis, and vertical rpm lines */}
      {yp.ticks.map((v) => (
        <Line key={`gp${v}`} x1={m.left} x2={m.left + w} y1={syP(v)} y2={syP(v)} stroke={palette.line.DEFAULT} strokeWidth={0.5} />
      ))}
      {x.ticks.map((v) => (
        <Line key={`gx${v}`} x1={sx(v)} x2={sx(v)} y1={m.top} y2={m.top + h} stroke={palette.line.DEFAULT} strokeWidth={0.5} strokeDasharray="2 2" />
      ))}
      {/* axes */}
      <Line x1={m.left} x2={m.left} y1={m.top} y2={m.top + h} stroke={palette.line.strong} strokeWidth={0.8} />
      <Line x1={m.left + w} x2={m.left + w} y1={m.top} y2={m.top + h} stroke={palette.line.strong} strokeWidth={0.8} />
      <Line x1={m.left} x2={m.left + w} y1={m.top + h} y2={m.top + h} stroke={palette.line.strong} strokeWidth={0.8} />
      {x.ticks.map((v) => (
        <G key={`tx${v}`}>
          <Line x1={sx(v)} x2={sx(v)} y1={m.top + h} y2={m.top + h + 3} stroke={palette.line.strong} strokeWidth={0.8} />
          <Text x={sx(v)} y={m.top + h + 12} textAnchor="middle" style={tick}>
            {formatNumber(v)}
          </Text>
        </G>
      ))}
      {yp.ticks.map((v) => (
        <G key={`tp${v}`}>
          <Line x1={m.left - 3} x2={m.left} y1={syP(v)} y2={syP(v)} stroke={palette.line.strong} strokeWidth={0.8} />
          <Text x={m.left - 5} y={syP(v) + 2.6} textAnchor="end" style={tick}>
            {formatNumber(v)}
          </Text>
        </G>
      ))}
      {yt.ticks.map((v) => (
        <G key={`tt${v}`}>
          <Line x1={m.left + w} x2={m.left + w + 3} y1={syT(v)} y2={syT(v)} stroke={palette.line.strong} strokeWidth={0.8} />
          <Text x={m.left + w + 5} y={syT(v) + 2.6} textAnchor="start" style={tick}>
            {formatNumber(v)}
          </Text>
        </G>
      ))}
      <Text x={m.left + w / 2} y={height - 6} textAnchor="middle" style={{ fontFamily: FONT, fontSize: 8.5, fill: ink.muted }}>
        Engine speed (rpm)
      </Text>
      {/* traces: torque first so power lines sit on top */}
      {all.map((c) => (
        <Polyline key={`t${c.runId}`} points={pts(c, 'torque')} fill="none" stroke={colorOf.get(c.runId) ?? ink.DEFAULT} strokeWidth={LINE_STYLES.torque.width * 0.55} strokeDasharray={LINE_DASHARRAY.torque} strokeLinejoin="round" />
      ))}
      {all.map((c) => (
        <Polyline key={`p${c.runId}`} points={pts(c, 'power')} fill="none" stroke={colorOf.get(c.runId) ?? ink.DEFAULT} strokeWidth={LINE_STYLES.power.width * 0.55} strokeLinejoin="round" />
      ))}
      <Text x={m.left - 34} y={m.top + h / 2} style={{ fontFamily: FONT, fontSize: 8.5, fill: ink.muted }} transform={`rotate(-90 ${m.left - 34} ${m.top + h / 2})`} textAnchor="middle">
        {`Power (${labels.power}) — solid`}
      </Text>
      <Text x={m.left + w + 38} y={m.top + h / 2} style={{ fontFamily: FONT, fontSize: 8.5, fill: ink.muted }} transform={`rotate(90 ${m.left + w + 38} ${m.top + h / 2})`} textAnchor="middle">
        {`Torque (${labels.torque}) — dashed`}
      </Text>
    </Svg>
  );
}

/** A short key sample for one run: solid power and dashed torque in the run's colour. */
export function LegendSwatch({ colorIndex }: { colorIndex: number }) {
  const color = runColor(colorIndex);
  return (
    <Svg width={34} height={8} viewBox="0 0 34 8">
      <Line x1={0} x2={14} y1={4} y2={4} stroke={color} strokeWidth={1.6} />
      <Line x1={18} x2={34} y1={4} y2={4} stroke={color} strokeWidth={1.2} strokeDasharray={LINE_DASHARRAY.torque} />
    </Svg>
  );
}

export interface PlotFrameProps {
  /** Plot area: left and top edge, width and height, in points. */
  left: number;
  top: number;
  width: number;
  height: number;
  xTicks: number[];
  yTicks: number[];
  sx: (v: number) => number;
  sy: (v: number) => number;
  /** How a y tick reads (default: the number as is). */
  formatY?: (v: number) => string;
  /** Distance from the plot's bottom edge to the rpm labels' baseline. */
  xLabelGap?: number;
}

/**
 * The frame the single-axis PDF charts share (the build plan's expected-gain band, the report's
 * difference chart): white plot area, horizontal grid with y labels on the left, dashed rpm grid
 * with labels below.
 */
export function PlotFrame({ left, top, width, height, xTicks, yTicks, sx, sy, formatY = (v) => formatNumber(v), xLabelGap = 12 }: PlotFrameProps) {
  const tick = { fontFamily: FONT, fontSize: 7.5, fill: palette.ink.muted } as const;
  return (
    <G>
      <Rect x={left} y={top} width={width} height={height} fill="#FFFFFF" stroke={palette.line.DEFAULT} strokeWidth={0.6} />
      {yTicks.map((v) => (
        <G key={`y${v}`}>
          <Line x1={left} x2={left + width} y1={sy(v)} y2={sy(v)} stroke={palette.line.DEFAULT} strokeWidth={0.5} />
          <Text x={left - 5} y={sy(v) + 2.6} textAnchor="end" style={tick}>
            {formatY(v)}
          </Text>
        </G>
      ))}
      {xTicks.map((v) => (
        <G key={`x${v}`}>
          <Line x1={sx(v)} x2={sx(v)} y1={top} y2={top + height} stroke={palette.line.DEFAULT} strokeWidth={0.5} strokeDasharray="2 2" />
          <Text x={sx(v)} y={top + height + xLabelGap} textAnchor="middle" style={tick}>
            {formatNumber(v)}
          </Text>
        </G>
      ))}
    </G>
  );
}
