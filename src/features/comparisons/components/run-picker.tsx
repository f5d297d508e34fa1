import { useQuery } from '@tanstack/react-query';
import { MAX_COMPARISON_RUNS } from '@shared/schemas/comparison';
import { Badge, Button, ErrorState, LoadingState, cn, SimpleTable } from '@/components/ui';
import { formatDate, formatNumber } from '@shared/format';
import { comparisonQueries } from '../api/comparison-queries';

export interface RunPickerProps {
  bikeId: string;
  selected: string[];
  baselineRunId: string;
  onToggle: (runId: string, on: boolean) => void;
  onBaseline: (runId: string) => void;
  onRemoveBike?: () => void;
  /** Colour of each selected run in the charts (same order as the preview). */
  colourOf: (runId: string) => string | undefined;
}

const touchTarget = 'inline-flex size-11 cursor-pointer items-center justify-center has-[:disabled]:cursor-not-allowed';

/** A bike's runs with a "compare" checkbox and a "baseline" radio each — native controls, so keyboard and touch work. */
export function RunPicker({ bikeId, selected, baselineRunId, onToggle, onBaseline, onRemoveBike, colourOf }: RunPickerProps) {
  const q = useQuery(comparisonQueries.candidates(bikeId));
  if (q.isPending) return <LoadingState compact message="Loading the bike’s runs…" />;
  if (q.isError) return <ErrorState error={q.error} onRetry={() => q.refetch()} isRetrying={q.isFetching} />;
  const { runs, bikeLabel } = q.data;
  const full = selected.length >= MAX_COMPARISON_RUNS;
  return (
    <fieldset className="rounded-card border border-line bg-paper-raised">
      <legend className="sr-only">Runs of {bikeLabel}</legend>
      <div className="flex items-center justify-between gap-3 border-b border-line px-4 py-2">
        <h3 className="font-semibold">{bikeLabel}</h3>
        {onRemoveBike && (
          <Button size="sm" variant="ghost" onClick={onRemoveBike}>
            Remove bike
          </Button>
        )}
      </div>
      {runs.length === 0 ? (
        <p className="px-4 py-3 text-ink-muted">No runs on file for this bike yet.</p>
      ) : (
        <SimpleTable columns={[{ label: 'Compare', className: 'w-20' }, { label: 'Baseline', className: 'w-20' }, 'Run', 'Stage', { label: 'Peak power', numeric: true }, 'Date']} caption={`Runs of ${bikeLabel}`} className="max-h-80 overflow-auto" minWidth="min-w-[36rem]" stickyHead>
          {runs.map((r) => {
            const on = selected.includes(r.id);
            const ready = r.status === 'ready';
            const colour = colourOf(r.id);
            return (
              <tr key={r.id} className={cn('border-t border-line', on && 'bg-accent-soft/40', !ready && 'text-ink-subtle')}>
                {/* The whole 44 px square around each control takes the tap (bay tablet, gloved hands). */}
                <td className="px-1 py-0">
                  <label className={touchTarget}>
                    <input
                      type="checkbox"
                      className="focus-ring size-6 accent-accent"
                      aria-label={`Compare ${r.name}`}
                      checked={on}
                      disabled={!ready || (!on && full)}
                      onChange={(e) => onToggle(r.id, e.target.checked)}
                    />
                  </label>
                </td>
                <td className="px-1 py-0">
                  <label className={touchTarget}>
                    <input
                      type="radio"
                      name="baseline-run"
                      className="focus-ring size-6 accent-accent"
                      aria-label={`Use ${r.name} as the baseline`}
                      checked={baselineRunId === r.id}
                      disabled={!on}
                      onChange={() => onBaseline(r.id)}
                    />
                  </label>
                </td>
                <th scope="row" className="px-3 py-2 text-left font-medium">
                  <span className="inline-flex items-center gap-2">
                    {colour && <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm" style={{ background: colour }} />}
                    {r.name}
                  </span>
                  <span className="block text-xs font-normal text-ink-muted [overflow-wrap:anywhere]">{r.fileName}</span>
                  {!ready && <span className="block text-xs font-normal">not ready ({r.status})</span>}
                  {r.identityStatus === 'mismatch' && <span className="block text-xs font-normal text-warn">cross-check failed</span>}
                </th>
                <td className="px-3 py-2">
                  {r.stageName ?? <span className="text-ink-subtle">unstaged</span>} {r.isReference && <Badge tone="info">reference</Badge>}
                </td>
                <td className="px-3 py-2 text-right">{r.peakPowerHp === null ? '—' : `${formatNumber(r.peakPowerHp, { decimals: 1 })} hp`}</td>
                <td className="px-3 py-2">{formatDate(r.recordedAt)}</td>
              </tr>
            );
          })}
        </SimpleTable>
      )}
    </fieldset>
  );
}
