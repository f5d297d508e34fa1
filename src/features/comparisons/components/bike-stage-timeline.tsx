import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import type { TimelineGain, TimelineStage } from '@shared/schemas/comparison';
import { Badge, Card, ErrorState, LoadingState } from '@/components/ui';
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

function PerHp({ v }: { v: { peakCents: number | null; averageCents: number | null } | null }) {
  if (!v) return <span className="text-ink-subtle">—</span>;
  return (
    <span>
      {v.peakCents === null ? 'no gain' : `${money(v.peakCents)} / hp at peak`}
      <span className="block text-xs text-ink-muted">{v.averageCents === null ? 'no average gain' : `${money(v.averageCents)} / hp on average`}</span>
    </span>
  );
}

/**
 * A bike's build history for the bike page: each stage's reference figures, gain against the
 * previous stage and in total against the baseline stage, its parts and cost, and cost per hp.
 */
export function BikeStageTimeline({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const isStaff = hasRole(user, STAFF);
  const q = useQuery(comparisonQueries.timeline(bikeId));
  return (
    <Card
      title="Build timeline"
      description="Each stage against the one before it, and in total against the baseline; cost per hp is the stage’s cost ÷ its gain."
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
        <LoadingState compact message="Loading the build timeline…" />
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
          <div className="overflow-x-auto">
            <table className="w-full min-w-[48rem] text-sm">
              <caption className="sr-only">Stages of this bike with gains and costs</caption>
              <thead className="bg-paper-sunk text-left text-ink-muted">
                <tr>
                  <th scope="col" className="px-3 py-2 font-medium">Stage</th>
                  <th scope="col" className="px-3 py-2 font-medium">Reference run</th>
                  <th scope="col" className="px-3 py-2 font-medium">vs previous stage</th>
                  <th scope="col" className="px-3 py-2 font-medium">vs baseline</th>
                  <th scope="col" className="px-3 py-2 font-medium">Parts and cost</th>
                  <th scope="col" className="px-3 py-2 font-medium">Cost per hp</th>
                  <th scope="col" className="px-3 py-2 font-medium">Spread</th>
                </tr>
              </thead>
              <tbody className="num align-top">
                {q.data.stages.map((s: TimelineStage) => (
                  <tr key={s.stageId} className="border-t border-line">
                    <th scope="row" className="px-3 py-2 text-left font-semibold">
                      {s.name}
                      {s.date && <span className="block text-xs font-normal text-ink-muted">{s.date}</span>}
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
                        <span className="text-ink-subtle">none chosen</span>
                      )}
                    </td>
                    <td className="px-3 py-2">
                      <Gain g={s.vsPrevious} />
                    </td>
                    <td className="px-3 py-2">
                      <Gain g={s.vsBaseline} />
                    </td>
                    <td className="px-3 py-2">
                      {s.parts.length ? (
                        <ul>
                          {s.parts.map((p) => (
                            <li key={p.id}>
                              {p.description} <span className="text-ink-muted">{money(p.partCostCents + p.labourCostCents)}</span>
                            </li>
                          ))}
                        </ul>
                      ) : (
                        <span className="text-ink-subtle">no parts</span>
                      )}
                      <span className="mt-1 block text-xs text-ink-muted">
                        stage {money(s.costCents)} · total {money(s.cumulativeCostCents)}
                      </span>
                    </td>
                    <td className="px-3 py-2">
                      <PerHp v={s.costPerHp} />
                      {s.cumulativeCostPerHp && (
                        <span className="mt-1 block text-xs text-ink-muted">
                          overall {s.cumulativeCostPerHp.peakCents === null ? '—' : `${money(s.cumulativeCostPerHp.peakCents)} / hp`}
                        </span>
                      )}
                    </td>
                    <td className="px-3 py-2">
                      {s.repeatability ? `±${formatNumber(s.repeatability.peakPowerSpreadHp, { decimals: 1 })} hp (${s.repeatability.runs} runs)` : <span className="text-ink-subtle">one run</span>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
    </Card>
  );
}
