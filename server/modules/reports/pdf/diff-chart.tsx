/**
 * The PDF's second chart, under the absolute curves: each run minus the baseline at every rpm
 * (power solid, torque dashed, in the run's colour) around a zero line, from the same stored
 * curves as the screen's difference chart (@shared/curve-difference).
 */
import { Line, Polyline, Svg, Text, View } from '@react-pdf/renderer';
import { LINE_DASHARRAY, LINE_STYLES, runColor } from '@shared/run-style';
import { palette } from '@shared/theme';
import { formatNumber } from '@shared/format';
import { differenceFromBaseline, differenceRange } from '@shared/curve-difference';
import { powerIn, torqueIn, unitLabels } from '../figures';
import type { ReportData } from '../report-data';
import { niceTicks, PlotFrame } from './chart';

const FONT = 'Barlow';

/** The difference chart, titled inside its drawing (it stands beside the absolute chart); nothing without a baseline and another run. */
export function DifferenceChart({ data, width, height }: { data: Pick<ReportData, 'runs' | 'curves' | 'units'>; width: number; height: number }) {
  const baseline = data.runs.find((r) => r.isBaseline);
  const diffs = baseline ? differenceFromBaseline(data.curves, baseline.id) : [];
  if (!baseline || diffs.length === 0) return null;
  const u = data.units;
  const labels = unitLabels(u);
  const m = { left: 30, right: 8, top: 26, bottom: 34 };
  const w = width - m.left - m.right;
  const h = height - m.top - m.bottom;
  // The same rpm axis as the absolute chart above it, so the two read straight down.
  const all = data.curves.filter((c) => c.rpm.length > 1);
  const x = niceTicks(Math.min(...all.map((c) => c.rpm[0])), Math.max(...all.map((c) => c.rpm[c.rpm.length - 1])), 7);
  const range = differenceRange(diffs, (v) => powerIn(v, u), (v) => torqueIn(v, u));
  const y = niceTicks(range.min, range.max === range.min ? range.min + 1 : range.max, 3);
  const sx = (rpm: number) => m.left + ((rpm - x.min) / (x.max - x.min)) * w;
  const sy = (v: number) => m.top + h - ((v - y.min) / (y.max - y.min)) * h;
  const colorOf = new Map(data.runs.map((r) => [r.id, runColor(r.colorIndex)]));
  const pts = (rpm: number[], values: number[]) => rpm.map((r, i) => `${sx(r).toFixed(2)},${sy(values[i]).toFixed(2)}`).join(' ');
  return (
    <View wrap={false}>
      <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
        <PlotFrame left={m.left} top={m.top} width={w} height={h} xTicks={x.ticks} yTicks={y.ticks} sx={sx} sy={sy} formatY={(v) => formatNumber(v, { signed: v !== 0 })} xLabelGap={10} />
        {/* the baseline itself: zero difference */}
        <Line x1={m.left} x2={m.left + w} y1={sy(0)} y2={sy(0)} stroke={palette.ink.DEFAULT} strokeWidth={1} />
        {diffs.map((d) => (
          <Polyline key={`t${d.runId}`} points={pts(d.rpm, d.torqueLbft.map((v) => torqueIn(v, u)))} fill="none" stroke={colorOf.get(d.runId) ?? palette.ink.DEFAULT} strokeWidth={LINE_STYLES.torque.width * 0.55} strokeDasharray={LINE_DASHARRAY.torque} strokeLinejoin="round" />
        ))}
        {diffs.map((d) => (
          <Polyline key={`p${d.runId}`} points={pts(d.rpm, d.powerHp.map((v) => powerIn(v, u)))} fill="none" stroke={colorOf.get(d.runId) ?? palette.ink.DEFAULT} strokeWidth={LINE_STYLES.power.width * 0.55} strokeLinejoin="round" />
        ))}
        {/* Title inside the drawing, so the chart costs the page as little height as it can. */}
        <Text x={m.left} y={9} style={{ fontFamily: FONT, fontSize: 8.5, fontWeight: 600, fill: palette.ink.DEFAULT }}>
          Difference from the baseline
        </Text>
        <Text x={m.left} y={20} style={{ fontFamily: FONT, fontSize: 7.5, fill: palette.ink.muted }}>
          {`above the line more, below less (${labels.power}, ${labels.torque})`}
        </Text>
        <Text x={m.left + w / 2} y={height - 6} textAnchor="middle" style={{ fontFamily: FONT, fontSize: 8.5, fill: palette.ink.muted }}>
          Engine speed (rpm)
        </Text>
      </Svg>
    </View>
  );
}
