import { formatNumber } from '@shared/format';
import type { PredictionBandDto } from '@shared/schemas/plans';
import { palette } from '@shared/theme';

/** "Nice" ticks (1, 2, 2.5, 5 × 10ⁿ) from at or below lo to at or above hi. */
function ticks(lo: number, hi: number, count: number) {
  const raw = (hi - lo) / count || 1;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  const end = Math.ceil(hi / step - 1e-9) * step;
  for (let v = Math.floor(lo / step) * step; v <= end + step / 1e6; v += step) out.push(Number(v.toFixed(6)));
  return out;
}

/**
 * The expected-gain band over this bike's latest reference run: its power solid, the middle half
 * of past gains shaded, their median dashed (shape and line style, not colour alone). A summary
 * sentence is the image's text alternative.
 */
export function BandChart({ band, height = 260 }: { band: PredictionBandDto; height?: number }) {
  const width = 720;
  const m = { left: 48, right: 16, top: 12, bottom: 36 };
  const w = width - m.left - m.right;
  const h = height - m.top - m.bottom;
  const hi = band.basePowerHp.map((v, i) => v + band.gainQ3Hp[i]);
  const lo = band.basePowerHp.map((v, i) => v + band.gainQ1Hp[i]);
  const med = band.basePowerHp.map((v, i) => v + band.gainMedianHp[i]);
  const xt = ticks(band.rpm[0], band.rpm[band.rpm.length - 1], 7);
  const yt = ticks(Math.min(...band.basePowerHp, ...lo), Math.max(...hi, ...med), 5);
  const [x0, x1, y0, y1] = [xt[0], xt[xt.length - 1], yt[0], yt[yt.length - 1]];
  const sx = (r: number) => m.left + ((r - x0) / (x1 - x0 || 1)) * w;
  const sy = (v: number) => m.top + h - ((v - y0) / (y1 - y0 || 1)) * h;
  const path = (vs: number[]) => band.rpm.map((r, i) => `${i ? 'L' : 'M'}${sx(r).toFixed(1)},${sy(vs[i]).toFixed(1)}`).join(' ');
  const area = `${path(hi)} ${[...band.rpm].reverse().map((r, k) => `L${sx(r).toFixed(1)},${sy(lo[band.rpm.length - 1 - k]).toFixed(1)}`).join(' ')} Z`;
  const last = band.rpm.length - 1;
  const summary = `Chart: ${band.baseLabel} with the expected gain. At ${formatNumber(band.rpm[last])} rpm past builds gained ${formatNumber(band.gainQ1Hp[last], { decimals: 1 })} to ${formatNumber(band.gainQ3Hp[last], { decimals: 1 })} hp (middle half), median ${formatNumber(band.gainMedianHp[last], { decimals: 1 })} hp.`;
  return (
    <figure className="m-0">
      <svg viewBox={`0 0 ${width} ${height}`} className="h-auto w-full" role="img" aria-label={summary}>
        {yt.map((v) => (
          <g key={`y${v}`}>
            <line x1={m.left} x2={m.left + w} y1={sy(v)} y2={sy(v)} stroke={palette.line.DEFAULT} />
            <text x={m.left - 6} y={sy(v) + 4} textAnchor="end" fontSize="11" fill={palette.ink.muted} className="num">
              {formatNumber(v)}
            </text>
          </g>
        ))}
        {xt.map((v) => (
          <text key={`x${v}`} x={sx(v)} y={m.top + h + 16} textAnchor="middle" fontSize="11" fill={palette.ink.muted} className="num">
            {formatNumber(v)}
          </text>
        ))}
        <path d={area} fill={palette.gain.DEFAULT} fillOpacity={0.2} />
        <path d={path(band.basePowerHp)} fill="none" stroke={palette.ink.DEFAULT} strokeWidth={2} />
        <path d={path(med)} fill="none" stroke={palette.gain.DEFAULT} strokeWidth={2} strokeDasharray="6 4" />
        <text x={m.left + w / 2} y={height - 4} textAnchor="middle" fontSize="12" fill={palette.ink.muted}>
          Engine speed (rpm) · power (hp)
        </text>
      </svg>
      <figcaption className="mt-1 text-sm text-ink-muted">
        Solid line: {band.baseLabel} (this bike today). Shaded: the middle half of the gains similar builds measured at each rpm; dashed: their median.
      </figcaption>
    </figure>
  );
}
