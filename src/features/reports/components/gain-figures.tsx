import { formatRpm } from '@shared/format';
import type { ReportGainView, ReportRunView } from '../api/types';
import { pctChange, powerGain, powerValue, torqueGain, torqueValue, type DisplayUnits } from '@shared/units-display';

/** Headline figures of the last run against the baseline, large and tabular. */
export function HeadlineFigures({ gain, run, units }: { gain: ReportGainView; run?: ReportRunView; units: DisplayUnits }) {
  const items = [
    { label: 'Peak power', value: powerGain(units, gain.peakPowerGain.hp), sub: `${pctChange(gain.peakPowerGain.pct)}${run ? ` · now ${powerValue(units, run.peakPower.hp)}` : ''}` },
    { label: 'Peak torque', value: torqueGain(units, gain.peakTorqueGain.lbft), sub: `${pctChange(gain.peakTorqueGain.pct)}${run ? ` · now ${torqueValue(units, run.peakTorque.lbft)}` : ''}` },
    { label: 'Area under power', value: pctChange(gain.areaGainPct), sub: 'over the shared rpm range' },
    { label: 'Average gain', value: powerGain(units, gain.averagePowerGainHp), sub: `largest ${powerGain(units, gain.largestGain.hp)} at ${formatRpm(gain.largestGain.rpm)}` },
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 md:grid-cols-4">
      {items.map((it) => (
        <div key={it.label} className="rounded-card bg-paper-sunk/60 px-4 py-3">
          <dt className="text-xs font-semibold uppercase tracking-wide text-ink-subtle">{it.label}</dt>
          <dd className="m-0">
            <span className="num block text-stat">{it.value}</span>
            <span className="num text-sm text-ink-muted">{it.sub}</span>
          </dd>
        </div>
      ))}
    </dl>
  );
}
