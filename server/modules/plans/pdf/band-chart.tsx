/**
 * The expected-gain band drawn over the bike's latest reference run, as vectors in the gain
 * report's chart style: the run's power solid, the middle half of past gains shaded, the median
 * gain dashed. Axis ticks by the report chart's niceTicks.
 */
import { Polygon, Polyline, Svg, Text } from '@react-pdf/renderer';
import { palette } from '@shared/theme';
import type { PredictionBandDto } from '@shared/schemas/plans';
import type { UnitSystem } from '../../shops/shop.entity';
import { powerIn, unitLabels } from '../../reports/figures';
import { niceTicks, PlotFrame } from '../../reports/pdf/chart';
import { PDF_FONT } from '../../reports/pdf/fonts';

export function BandChart({ band, width, height, units }: { band: PredictionBandDto; width: number; height: number; units: UnitSystem }) {
  const m = { left: 44, right: 14, top: 10, bottom: 30 };
  const w = width - m.left - m.right;
  const h = height - m.top - m.bottom;
  const base = band.basePowerHp.map((v) => powerIn(v, units));
  const lo = band.basePowerHp.map((v, i) => powerIn(v + band.gainQ1Hp[i], units));
  const hi = band.basePowerHp.map((v, i) => powerIn(v + band.gainQ3Hp[i], units));
  const med = band.basePowerHp.map((v, i) => powerIn(v + band.gainMedianHp[i], units));
  const x = niceTicks(band.rpm[0], band.rpm[band.rpm.length - 1], 7);
  const y = niceTicks(Math.min(...base, ...lo), Math.max(...hi, ...med), 5);
  const sx = (r: number) => m.left + ((r - x.min) / (x.max - x.min)) * w;
  const sy = (v: number) => m.top + h - ((v - y.min) / (y.max - y.min)) * h;
  const line = (vs: number[]) => band.rpm.map((r, i) => `${sx(r).toFixed(2)},${sy(vs[i]).toFixed(2)}`).join(' ');
  const area = [...band.rpm.map((r, i) => `${sx(r).toFixed(2)},${sy(hi[i]).toFixed(2)}`), ...band.rpm.map((r, i) => `${sx(r).toFixed(2)},${sy(lo[i]).toFixed(2)}`).reverse()].join(' ');
  return (
    <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
      <PlotFrame left={m.left} top={m.top} width={w} height={h} xTicks={x.ticks} yTicks={y.ticks} sx={sx} sy={sy} />
      <Polygon points={area} fill={palette.gain.DEFAULT} fillOpacity={0.22} stroke="none" />
      <Polyline points={line(base)} fill="none" stroke={palette.ink.DEFAULT} strokeWidth={1.3} strokeLinejoin="round" />
      <Polyline points={line(med)} fill="none" stroke={palette.gain.DEFAULT} strokeWidth={1.1} strokeDasharray="4 2" strokeLinejoin="round" />
      <Text x={m.left + w / 2} y={height - 4} textAnchor="middle" style={{ fontFamily: PDF_FONT, fontSize: 8.5, fill: palette.ink.muted }}>
        {`Engine speed (rpm) · power (${unitLabels(units).power})`}
      </Text>
    </Svg>
  );
}
