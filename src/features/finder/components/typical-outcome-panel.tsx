import { useId, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Caution, Card, ErrorState, LoadingState, SelectField } from '@/components/ui';
import { HEAD_WORK_LEVELS, PART_CATEGORIES, type PartCategory } from '@shared/parts';
import { formatCount, formatGain, formatMoney } from '@shared/format';
import { finderQueries, type TypicalOutcomeDto } from '../api/finder-queries';
import { categoryLabel, headLabel } from './format-build';

export interface TypicalOutcomePanelProps {
  bikeId: string;
  /** Starting choice; default cylinder heads at mild port. */
  category?: PartCategory;
}

type Spread = NonNullable<TypicalOutcomeDto['peakPowerGainHp']>;

const money = (cents: number) => formatMoney(cents, { minorUnits: true, wholeUnits: true });
/** "+4.2 hp to +9.4 hp", or one figure when both ends are the same (one build, or identical ones). */
const gainRange = (low: number, high: number) => (formatGain(low) === formatGain(high) ? formatGain(low) : `${formatGain(low)} to ${formatGain(high)}`);

/** The cost sentence: a single figure when every build cost the same, else the range and median. */
function costText(c: NonNullable<TypicalOutcomeDto['costCents']>) {
  if (money(c.min) === money(c.max)) return `Cost of that stage: ${money(c.min)}.`;
  return `Cost of that stage: ${money(c.min)} to ${money(c.max)} (median ${money(c.median)}).`;
}

function SpreadRow({ label, s }: { label: string; s: Spread | null }) {
  return (
    <tr className="border-b border-line">
      <th scope="row" className="py-2 pr-3 text-left font-semibold text-ink">
        {label}
      </th>
      {s ? (
        <>
          <td className="num py-2 text-right">{formatGain(s.median)}</td>
          <td className="num py-2 text-right">{gainRange(s.q1, s.q3)}</td>
          <td className="num py-2 text-right">{gainRange(s.min, s.max)}</td>
        </>
      ) : (
        <td colSpan={3} className="py-2 text-right text-ink-muted">
          No figures
        </td>
      )}
    </tr>
  );
}

/** What a planned modification added on similar builds: count, median, middle half, range and cost. */
export function TypicalOutcomePanel({ bikeId, category: initialCategory = 'cylinder-heads' }: TypicalOutcomePanelProps) {
  const [category, setCategory] = useState<PartCategory>(initialCategory);
  const [level, setLevel] = useState<string>(initialCategory === 'cylinder-heads' ? 'mild-port' : '');
  const query = useQuery(finderQueries.typical(bikeId, category, category === 'cylinder-heads' ? level || undefined : undefined));
  const headingId = useId();
  const d = query.data;
  return (
    <Card title="Typical outcome of a planned change" description="Past results on similar builds in this shop — not a promise." className="self-start">
      <div className="grid gap-4">
        <div className="grid gap-3 md:grid-cols-2">
          <SelectField
            label="Planned change"
            value={category}
            onChange={(e) => setCategory(e.target.value as PartCategory)}
            options={PART_CATEGORIES.map((c) => ({ value: c, label: categoryLabel(c) }))}
          />
          {category === 'cylinder-heads' && (
            <SelectField
              label="Head work"
              value={level}
              onChange={(e) => setLevel(e.target.value)}
              options={[{ value: '', label: 'Any level' }, ...HEAD_WORK_LEVELS.map((l) => ({ value: l, label: headLabel(l) }))]}
            />
          )}
        </div>
        {query.isPending ? (
          <LoadingState compact message="Gathering past results…" />
        ) : query.isError ? (
          <ErrorState error={query.error} onRetry={() => query.refetch()} isRetrying={query.isFetching} />
        ) : d ? (
          <div className="grid gap-3" aria-live="polite">
            {d.count === 0 ? (
              <p className="text-base text-ink">No similar builds have recorded this yet, so there is no past range to quote.</p>
            ) : (
              <p className="text-base text-ink">
                <strong className="num">{formatCount(d.count, 'similar build')}</strong> measured this change. {d.message}
              </p>
            )}
            {d.count > 0 && d.lowConfidence && (
              <Caution kind="caution" title="Few builds behind this figure">
                Fewer than 5 similar builds back it, so the range may not hold for this bike. Quote it as a rough guide only.
              </Caution>
            )}
            {d.count > 0 && (
              <div className="overflow-x-auto" role="region" aria-labelledby={headingId} tabIndex={0}>
                <table className="min-w-full text-sm" aria-labelledby={headingId}>
                  <caption id={headingId} className="sr-only">
                    Gain added by the stage with this change
                  </caption>
                  <thead>
                    <tr className="border-b border-line-strong text-ink-muted">
                      <th scope="col" className="py-2 pr-3 text-left font-semibold">
                        Added by that stage
                      </th>
                      <th scope="col" className="py-2 text-right font-semibold">Median</th>
                      <th scope="col" className="py-2 text-right font-semibold">Middle half</th>
                      <th scope="col" className="py-2 text-right font-semibold">Lowest to highest</th>
                    </tr>
                  </thead>
                  <tbody>
                    <SpreadRow label="Peak power" s={d.peakPowerGainHp} />
                    <SpreadRow label="Average power across the range" s={d.averagePowerGainHp} />
                  </tbody>
                </table>
              </div>
            )}
            {d.count > 0 && d.costCents && <p className="num text-sm text-ink">{costText(d.costCents)}</p>}
            <p className="text-xs text-ink-muted">
              {d.count === 0 ? (
                <>Similar builds: {d.criteria}.</>
              ) : (
                <>
                  {d.disclaimer} Similar builds: {d.criteria}. Gains are what that stage added over the stage measured before it. Quartiles: {d.quantileMethod}.
                </>
              )}
            </p>
          </div>
        ) : null}
      </div>
    </Card>
  );
}
