import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import type { TimelineGain, TimelineStage } from '@shared/schemas/comparison';
import { Badge, Card, ErrorState, LoadingState, SimpleTable } from '@/components/ui';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { formatMoney, formatNumber, formatRpm } from '@shared/format';
import { paths } from '@/config/paths';
import { comparisonQueries } from '../api/comparison-queries';

const signed = (v: number) => formatNumber(v, { decimals: 1, signed: true });
const money = (cents: number | null | undefined) => (cents === null || cents === undefined ? '—' : formatMoney(cents, { minorUnits: true, wholeUnits: true }));

function Gain({ g }: { g: TimelineGain | null }) {
  if (!g) return <span className="text-ink-subtle">—</span>;
  return (
    <span>
      <span className={g.peakPowerHp < 0 ? 'text-loss' : undefined}>{signed(g.peakPowerHp)} hp</span> at peak
      <span className="block text-xs text-ink-muted">
        {signed(g.averagePowerHp)} hp average · {signed(g.peakTorqueLbft)} lb·ft
      </span>
      {g.withinRepeatability.peakPower === true && <Badge tone="neutral">within repeatability</Badge>}
    </span>
  );
}

/** "Stage 1 and Stage 2" for a sentence. */
const joinNames = (names: string[]) => (names.length <= 1 ? (names[0] ?? '') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`);

/**
 * Cost per hp with what it divides, spelled out so it cannot be misread:
 * "$1,600 ÷ +4.0 hp = $400 per hp at peak".
 */
function PerHp({ cents, gain, v, what }: { cents: number; gain: TimelineGain | null; v: { peakCents: number | null; averageCents: number | null } | null; what: string }) {
  if (!v || !gain) return <span className="text-ink-subtle">—</span>;
  return (
    <span>
      <span className="block text-xs text-ink-muted">{what}</span>
      {v.peakCents === null ? (
        <span>no peak gain to divide by</span>
      ) : (
        <span>
          {money(cents)} ÷ {signed(gain.peakPowerHp)} hp = <strong className="font-semibold">{money(v.peakCents)} per hp</strong> at peak
        </span>
      )}
      <span className="block text-xs text-ink-muted">{v.averageCents === null ? 'no average gain' : `${money(v.averageCents)} per hp of average gain (${signed(gain.averagePowerHp)} hp)`}</span>
    </span>
  );
}

/** For each stage: which stages' cost buys its gain over the previous measured stage, and since the baseline. */
function costSpans(stages: TimelineStage[]) {
  const measured = stages.map((s, i) => (s.reference ? i : -1)).filter((i) => i >= 0);
  const base = measured[0];
  return stages.map((s, i) => {
    const prev = [...measured].reverse().find((m) => m < i);
    const since = (from: number | undefined) => (from === undefined ? null : { names: stages.slice(from + 1, i + 1).map((x) => x.name), cents: s.cumulativeCostCents - stages[from].cumulativeCostCents });
    return { previous: since(prev), baseline: base === undefined || base >= i ? null : since(base), previousName: prev === undefined ? null : stages[prev].name, baselineName: base === undefined ? null : stages[base].name };
  });
}

/**
 * The one place for a bike's gains and cost per hp (the runs feature's "Stages and parts" is for
 * editing): each stage's reference figures, its gain over the previous measured stage with that
 * stage's cost ÷ that gain, and the total gain since the baseline with all cost since the baseline
 * ÷ that gain. Stages without a reference run are counted in the next measured stage's cost.
 */
export function BikeStageTimeline({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const isStaff = hasRole(user, STAFF);
  const q = useQuery(comparisonQueries.timeline(bikeId));
  const spans = q.data ? costSpans(q.data.stages) : [];
  return (
    <Card
      title="Gains by stage"
      description="What each stage added over the one before it and what that cost per hp; and the total since the baseline with the total cost per hp. Peak power from each stage’s reference run."
      actions={
        isStaff && (
          <Link to={`${paths.newComparison}?bikeId=${bikeId}`} className="focus-ring rounded-control font-semibold text-accent underline-offset-2 hover:underline">
            Compare runs
          </Link>
        )
      }
      flush
    >
      {q.isPending ? (
        <LoadingState compact message="Loading the gains by stage…" />
      ) : q.isError ? (
        <ErrorState error={q.error} onRetry={() => q.refetch()} isRetrying={q.isFetching} />
      ) : q.data.stages.length === 0 ? (
        <p className="px-4 py-3 text-ink-muted md:px-5">No stages recorded for this bike yet.</p>
      ) : (
        <>
          {q.data.warnings.filter((w) => w.code !== 'SEVERAL_BIKES').length > 0 && (
            <ul className="border-b border-line bg-warn-soft px-4 py-2 text-sm md:px-5">
              {q.data.warnings.map((w, i) => (
                <li key={i}>{w.message}</li>
              ))}
            </ul>
          )}
          <SimpleTable columns={['Stage', 'Reference run', 'Gain over the previous stage', 'This stage’s cost per hp', 'Total gain since baseline', 'Total cost per hp since baseline', 'Spread']} caption="Gains and cost per hp of each stage of this bike" className="overflow-x-auto" minWidth="min-w-[56rem]" bodyClassName="num align-top">
            {q.data.stages.map((s: TimelineStage, i) => {
              const span = spans[i];
              return (
                <tr key={s.stageId} className="border-t border-line">
                  <th scope="row" className="px-3 py-2 text-left font-semibold">
                    {s.name}
                    {s.date && <span className="block text-xs font-normal text-ink-muted">{s.date}</span>}
                    <span className="block text-xs font-normal text-ink-muted">work {money(s.costCents)}</span>
                  </th>
                  <td className="px-3 py-2">
                    {s.reference ? (
                      <>
                        {formatNumber(s.reference.peakPowerHp, { decimals: 1 })} hp <span className="text-ink-muted">@ {formatRpm(s.reference.peakPowerRpm)}</span>
                        <span className="block text-xs text-ink-muted">
                          {formatNumber(s.reference.peakTorqueLbft, { decimals: 1 })} lb·ft @ {formatRpm(s.reference.peakTorqueRpm)}
                        </span>
                      </>
                    ) : (
                      <span className="text-ink-subtle">none chosen — its cost counts towards the next measured stage</span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    {s.vsPrevious && span.previousName ? <span className="block text-xs text-ink-muted">over {span.previousName}</span> : null}
                    <Gain g={s.vsPrevious} />
                  </td>
                  <td className="px-3 py-2">
                    <PerHp cents={span.previous?.cents ?? s.costCents} gain={s.vsPrevious} v={s.costPerHp} what={`cost of ${joinNames(span.previous?.names ?? [s.name])} ÷ gain over ${span.previousName ?? 'the previous stage'}`} />
                  </td>
                  <td className="px-3 py-2">
                    {s.vsBaseline && span.baselineName ? <span className="block text-xs text-ink-muted">over {span.baselineName}</span> : null}
                    <Gain g={s.vsBaseline} />
                  </td>
                  <td className="px-3 py-2">
                    <PerHp cents={span.baseline?.cents ?? 0} gain={s.vsBaseline} v={s.cumulativeCostPerHp} what={`all cost since ${span.baselineName ?? 'the baseline'} ÷ total gain`} />
                  </td>
                  <td className="px-3 py-2">
                    {s.repeatability ? `±${formatNumber(s.repeatability.peakPowerSpreadHp, { decimals: 1 })} hp (${s.repeatability.runs} runs)` : <span className="text-ink-subtle">one run</span>}
                  </td>
                </tr>
              );
            })}
          </SimpleTable>
        </>
      )}
    </Card>
  );
}
