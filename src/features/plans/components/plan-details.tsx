import { HEAD_WORK_LABELS, PART_CATEGORY_LABELS } from '@shared/parts';
import { formatDate, formatGain, formatMoney } from '@shared/format';
import type { PlanDto } from '@shared/schemas/plans';
import { Card, Caution, Stat } from '@/components/ui';
import { BandChart } from './band-chart';

export const money = (plan: Pick<PlanDto, 'currency'>, cents: number) => formatMoney(cents, { minorUnits: true, currency: plan.currency.toUpperCase() });

/** Items and totals of a plan. */
export function PlanItems({ plan }: { plan: PlanDto }) {
  return (
    <Card title="Parts and labour">
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead className="border-b border-line-strong text-ink-subtle">
            <tr>
              <th scope="col" className="py-2 pr-3 font-semibold">Work</th>
              <th scope="col" className="py-2 pr-3 text-right font-semibold">Parts</th>
              <th scope="col" className="py-2 pr-3 text-right font-semibold">Labour</th>
              <th scope="col" className="py-2 text-right font-semibold">Line total</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {plan.items.map((i, k) => (
              <tr key={k}>
                <td className="py-2 pr-3">
                  <span className="font-medium">{PART_CATEGORY_LABELS[i.category]}</span>
                  {i.headWork ? ` (${HEAD_WORK_LABELS[i.headWork]})` : ''}: {i.description}
                </td>
                <td className="num py-2 pr-3 text-right">{money(plan, i.partCostCents)}</td>
                <td className="num py-2 pr-3 text-right">{money(plan, i.labourCostCents)}</td>
                <td className="num py-2 text-right">{money(plan, i.partCostCents + i.labourCostCents)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr className="border-t border-line-strong">
              <th scope="row" colSpan={3} className="py-2 pr-3 text-right">Total</th>
              <td className="num py-2 text-right font-semibold">{money(plan, plan.totalCostCents)}</td>
            </tr>
          </tfoot>
        </table>
      </div>
      {plan.note ? <p className="mt-3 whitespace-pre-line text-ink-muted">{plan.note}</p> : null}
    </Card>
  );
}

/** What similar builds added, the band chart, cost per hp and the cautions; always worded as past results. */
export function PlanPrediction({ plan }: { plan: PlanDto }) {
  const p = plan.prediction;
  const median = p.peakPowerGainHp?.median ?? p.estimate?.peakPowerGainHp ?? null;
  return (
    <Card title="What this work added on similar builds" description={`Similar builds: ${p.criteria}.`}>
      <div className="grid gap-4 sm:grid-cols-3">
        <Stat label={p.kind === 'estimate' ? 'Estimated peak gain' : 'Median peak gain, past builds'} value={median !== null ? formatGain(median, 'hp') : null} detail={p.peakPowerGainHp ? `middle half ${formatGain(p.peakPowerGainHp.q1, 'hp')} to ${formatGain(p.peakPowerGainHp.q3, 'hp')}` : undefined} />
        <Stat label="Builds it rests on" value={String(p.count)} detail={p.kind === 'estimate' ? 'that added all of it together' : undefined} />
        <Stat label="Cost per hp" value={p.costPerHpCents !== null ? money(plan, p.costPerHpCents) : null} detail="total ÷ median peak gain" />
      </div>
      <p className="mt-4">{p.message}</p>
      {p.lowConfidence && p.kind !== 'none' ? (
        <Caution kind="notice" title="Low confidence" className="mt-3">
          Fewer than 5 similar builds: treat the figures as a rough guide.
        </Caution>
      ) : null}
      {p.band ? (
        <div className="mt-4">
          <BandChart band={p.band} />
        </div>
      ) : (
        <p className="mt-3 text-sm text-ink-muted">No expected-gain curve: the bike has no reference run yet, or too few similar builds have measured curves.</p>
      )}
      <p className="mt-3 text-sm italic text-ink-muted">{p.disclaimer}</p>
      <Caution kind="notice" title="Before the work" className="mt-3">
        Modifications may affect emissions compliance, noise limits, the maker’s warranty and insurance; road use is governed by local law. More power and leaner mixtures raise engine temperatures: follow the engine maker’s specifications and licensed practice.
      </Caution>
    </Card>
  );
}

/** Predicted against measured, once the converted stage has been measured. */
export function PlanOutcome({ plan }: { plan: PlanDto }) {
  const o = plan.outcome;
  if (!o) return null;
  const words = {
    below: 'below the middle half of past builds',
    within: 'within the middle half of past builds',
    above: 'above the middle half of past builds',
    'no-prediction': 'with no spread to compare it with',
    'not-measured': '',
  }[o.position];
  return (
    <Card title="Predicted against measured" description={`Stage “${o.stageName}”.`}>
      {o.position === 'not-measured' ? (
        <p className="text-ink-muted">The stage has no measured gain yet: choose its reference run once the pulls are in.</p>
      ) : (
        <div className="grid gap-4 sm:grid-cols-3">
          <Stat label="Predicted (median)" value={o.predictedMedianPeakHp !== null ? formatGain(o.predictedMedianPeakHp, 'hp') : null} detail={o.predictedQ1PeakHp !== null && o.predictedQ3PeakHp !== null ? `middle half ${formatGain(o.predictedQ1PeakHp, 'hp')} to ${formatGain(o.predictedQ3PeakHp, 'hp')}` : undefined} />
          <Stat label="Measured step" value={o.measuredPeakPowerGainHp !== null ? formatGain(o.measuredPeakPowerGainHp, 'hp') : null} detail={words} />
          <Stat label="Difference" value={o.measuredPeakPowerGainHp !== null && o.predictedMedianPeakHp !== null ? formatGain(o.measuredPeakPowerGainHp - o.predictedMedianPeakHp, 'hp') : null} />
        </div>
      )}
    </Card>
  );
}

/** Status facts in one line each: sent, open until, accepted by, deposit. */
export function PlanFacts({ plan }: { plan: PlanDto }) {
  const facts: [string, string][] = [];
  if (plan.sentAt) facts.push(['Sent', `${formatDate(plan.sentAt)} (version ${plan.version})`]);
  if (plan.validUntil && (plan.status === 'sent' || plan.status === 'expired')) facts.push(['Open until', formatDate(plan.validUntil)]);
  if (plan.acceptedAt) facts.push(['Accepted', `${formatDate(plan.acceptedAt)} by ${plan.acceptedName} (version ${plan.acceptedVersion})`]);
  if (plan.declinedAt) facts.push(['Declined', `${formatDate(plan.declinedAt)}${plan.declineReason ? `: ${plan.declineReason}` : ''}`]);
  if (plan.depositCents) facts.push(['Deposit', `${money(plan, plan.depositCents)} asked · ${money(plan, plan.depositPaidCents)} paid${plan.depositRefundedCents ? ` · ${money(plan, plan.depositRefundedCents)} refunded` : ''}`]);
  if (!facts.length) return null;
  return (
    <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
      {facts.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="font-medium text-ink-muted">{k}</dt>
          <dd className="num m-0">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
