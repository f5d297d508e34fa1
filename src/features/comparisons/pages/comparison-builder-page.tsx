import { useEffect, useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { COMPARISON_UNITS, MAX_COMPARISON_RUNS, type ComparisonOptions, type ComparisonPreviewInput, type ComparisonUnits } from '@shared/schemas/comparison';
import type { CorrectionId } from '@shared/schemas/run';
import { CORRECTION_STANDARDS } from '@shared/analysis/correction';
import { correctionOptions } from '@shared/labels-display';
import { Button, Card, EmptyState, ErrorState, Icon, LoadingState, NumberField, PageHeader, SearchInput, SelectField, useDebouncedValue } from '@/components/ui';
import { runColor } from '@/lib/chart-theme';
import { paths } from '@/config/paths';
import { comparisonQueries } from '../api/comparison-queries';
import { ComparisonView } from '../components/comparison-view';
import { RunPicker } from '../components/run-picker';
import { SaveComparisonDialog } from '../components/save-comparison-dialog';
import { bikeLabel } from '@shared/labels';
import { usePageTitle } from '@/lib/page-title';

const UNIT_LABELS: Record<ComparisonUnits, string> = { 'hp-lbft': 'hp and lb·ft', 'kw-nm': 'kW and N·m' };
const BAND_WIDTHS = [250, 500, 1000, 1500, 2000];
const list = (v: string | null) => (v ? v.split(',').map((s) => s.trim()).filter(Boolean) : []);

/**
 * Build a comparison: pick runs of one bike or several, mark the baseline, choose the options,
 * watch the figures update, save with a name. Opens with `?bikeId=` (one or more) and/or
 * `?runIds=a,b&baselineRunId=a`; with only a bike it suggests the previous stage's reference run
 * against the latest stage's.
 */
export default function ComparisonBuilderPage() {
  usePageTitle('New comparison');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const presetRuns = list(params.get('runIds'));
  const [bikeIds, setBikeIds] = useState<string[]>(() => [...new Set(params.getAll('bikeId').flatMap((v) => list(v)))]);
  const [selected, setSelected] = useState<string[]>(presetRuns);
  const [baseline, setBaseline] = useState(params.get('baselineRunId') ?? presetRuns[0] ?? '');
  const [suggestionDone, setSuggestionDone] = useState(presetRuns.length > 0);
  const [correction, setCorrection] = useState<CorrectionId | ''>('sae-j1349');
  const [smooth, setSmooth] = useState<number | null>(0);
  const [units, setUnits] = useState<ComparisonUnits>('hp-lbft');
  const [rpmFrom, setRpmFrom] = useState<number | null>(null);
  const [rpmTo, setRpmTo] = useState<number | null>(null);
  const [band, setBand] = useState(1000);
  const [bikeSearch, setBikeSearch] = useState('');
  const [saving, setSaving] = useState(false);
  const q = useDebouncedValue(bikeSearch.trim(), 250);
  const bikeOptions = useQuery({ ...comparisonQueries.bikeOptions(q), enabled: q.length > 0 });
  const firstCandidates = useQuery({ ...comparisonQueries.candidates(bikeIds[0] ?? ''), enabled: !!bikeIds[0] });

  // Default suggestion: previous stage's reference run against the current stage's.
  useEffect(() => {
    if (suggestionDone || !firstCandidates.data) return;
    const s = firstCandidates.data.suggestion;
    if (s) {
      setSelected(s.runIds);
      setBaseline(s.baselineRunId);
    }
    setSuggestionDone(true);
  }, [suggestionDone, firstCandidates.data]);

  const rangeError = rpmFrom !== null && rpmTo !== null && rpmTo <= rpmFrom ? 'The upper rpm must be above the lower rpm' : undefined;
  const options = useMemo<ComparisonOptions>(
    () => ({
      ...(correction ? { correction } : {}),
      ...(smooth ? { smooth } : {}),
      units,
      ...(rpmFrom !== null && rpmTo !== null && !rangeError ? { rpmRange: [rpmFrom, rpmTo] as [number, number] } : {}),
      bandWidthRpm: band,
    }),
    [correction, smooth, units, rpmFrom, rpmTo, rangeError, band],
  );
  const input = useMemo<ComparisonPreviewInput>(() => ({ runIds: selected, baselineRunId: baseline, options }), [selected, baseline, options]);
  const debounced = useDebouncedValue(input, 250);
  const ready = debounced.runIds.length >= 2 && debounced.runIds.includes(debounced.baselineRunId);
  const preview = useQuery({ ...comparisonQueries.preview(debounced), enabled: ready });

  // Runs given by id only: show their bikes' pickers once the preview names them.
  useEffect(() => {
    if (!preview.data) return;
    const fromRuns = preview.data.runs.map((r) => r.bikeId).filter((id) => !bikeIds.includes(id));
    if (fromRuns.length) setBikeIds((b) => [...new Set([...b, ...fromRuns])]);
  }, [preview.data, bikeIds]);

  // The run's own colour (its place in the bike's archive, set by the server) once the preview
  // names it; no colour before, so a picked run never shows a colour it will not keep.
  const colourOf = (id: string) => {
    if (!selected.includes(id)) return undefined;
    const r = preview.data?.runs.find((x) => x.runId === id);
    return r ? runColor(r.colorIndex) : undefined;
  };
  const toggle = (id: string, on: boolean) => {
    setSelected((s) => {
      const next = on ? (s.length >= MAX_COMPARISON_RUNS || s.includes(id) ? s : [...s, id]) : s.filter((x) => x !== id);
      if (!next.includes(baseline)) setBaseline(next[0] ?? '');
      return next;
    });
  };
  // Keep the baseline first in the list.
  const chooseBaseline = (id: string) => {
    setBaseline(id);
    setSelected((s) => [id, ...s.filter((x) => x !== id)]);
  };

  const p = preview.data;
  const defaultName = p ? `${p.baseline.bikeLabel}: ${p.runs.map((r) => r.name).join(' vs ')}`.slice(0, 200) : '';

  return (
    <>
      <PageHeader
        back={
          <Link to={paths.comparisons} className="focus-ring inline-flex items-center gap-1 rounded-control text-ink-muted hover:text-ink">
            <Icon name="chevron-left" size={16} /> Comparisons
          </Link>
        }
        title="New comparison"
        subtitle="Pick the runs, mark the baseline, and read what changed across the whole rpm range."
        action={
          <Button variant="primary" disabled={!p || preview.isError || selected.length < 2} onClick={() => setSaving(true)}>
            Save comparison
          </Button>
        }
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <section aria-labelledby="pick-runs" className="space-y-4">
          <h2 id="pick-runs" className="text-lg font-semibold">
            Runs <span className="font-normal text-ink-muted">({selected.length} of at most {MAX_COMPARISON_RUNS} chosen)</span>
          </h2>
          {bikeIds.map((id) => (
            <RunPicker
              key={id}
              bikeId={id}
              selected={selected}
              baselineRunId={baseline}
              onToggle={toggle}
              onBaseline={chooseBaseline}
              colourOf={colourOf}
              onRemoveBike={bikeIds.length > 1 ? () => setBikeIds((b) => b.filter((x) => x !== id)) : undefined}
            />
          ))}
          <div className="rounded-card border border-dashed border-line-strong p-4">
            <SearchInput
              label={bikeIds.length ? 'Add another bike' : 'Find a bike'}
              showLabel
              placeholder="Make, model, VIN or owner"
              value={bikeSearch}
              onValueChange={setBikeSearch}
              containerClassName="max-w-md"
            />
            {q && bikeOptions.data && (
              <ul className="mt-2 divide-y divide-line" aria-label="Matching bikes">
                {bikeOptions.data.items.length === 0 && <li className="py-2 text-ink-muted">No bike matches “{q}”.</li>}
                {bikeOptions.data.items.map((b) => (
                  <li key={b.id} className="flex items-center justify-between gap-3 py-2">
                    <span>
                      {bikeLabel(b)} <span className="text-ink-muted">· {b.customerName}</span>
                    </span>
                    <Button
                      size="sm"
                      disabled={bikeIds.includes(b.id)}
                      onClick={() => {
                        setBikeIds((x) => [...x, b.id]);
                        setBikeSearch('');
                      }}
                    >
                      {bikeIds.includes(b.id) ? 'Added' : 'Add'}
                    </Button>
                  </li>
                ))}
              </ul>
            )}
          </div>
        </section>

        <Card title="Options" level={2} className="h-fit">
          <div className="space-y-4">
            <SelectField
              label="Correction standard"
              hint="Each run is re-corrected from its uncorrected curve and its air conditions."
              value={correction}
              onChange={(e) => setCorrection(e.target.value as CorrectionId | '')}
              options={[{ value: '', label: 'Each run’s own (as uploaded)' }, ...correctionOptions(CORRECTION_STANDARDS.map((s) => s.id))]}
            />
            <NumberField label="Extra smoothing" unit="points" hint="0 = as stored; odd windows of 3–51 points." min={0} max={51} step={2} value={smooth ?? ''} onChange={(e) => setSmooth(e.target.value === '' ? null : Number(e.target.value))} />
            <SelectField label="Units" value={units} onChange={(e) => setUnits(e.target.value as ComparisonUnits)} options={COMPARISON_UNITS.map((u) => ({ value: u, label: UNIT_LABELS[u] }))} />
            <fieldset>
              <legend className="mb-1 text-sm font-medium text-ink">rpm range</legend>
              <div className="grid grid-cols-2 gap-2">
                <NumberField label="From" unit="rpm" min={0} step={100} value={rpmFrom ?? ''} onChange={(e) => setRpmFrom(e.target.value === '' ? null : Number(e.target.value))} />
                <NumberField label="To" unit="rpm" min={0} step={100} value={rpmTo ?? ''} onChange={(e) => setRpmTo(e.target.value === '' ? null : Number(e.target.value))} error={rangeError} />
              </div>
              <p className="mt-1 text-sm text-ink-subtle">Leave empty for the runs’ common range.</p>
            </fieldset>
            <SelectField label="Band width" value={String(band)} onChange={(e) => setBand(Number(e.target.value))} options={BAND_WIDTHS.map((w) => ({ value: String(w), label: `${w.toLocaleString('en-US')} rpm` }))} />
          </div>
        </Card>
      </div>

      <section aria-labelledby="preview-heading" aria-live="polite" aria-busy={preview.isFetching} className="mt-8">
        <h2 id="preview-heading" className="mb-3 text-xl font-semibold">
          Preview {preview.isFetching && p && <span className="text-sm font-normal text-ink-muted">updating…</span>}
        </h2>
        {!ready ? (
          <EmptyState title="Choose at least two runs" message={bikeIds.length ? 'Tick two or more runs and mark one as the baseline.' : 'Find a bike above to see its runs.'} icon="search" />
        ) : preview.isError ? (
          <ErrorState title="These runs cannot be compared" error={preview.error} onRetry={() => preview.refetch()} isRetrying={preview.isFetching} />
        ) : !p ? (
          <LoadingState message="Comparing the runs…" />
        ) : (
          <ComparisonView preview={p} name={defaultName || 'comparison'} />
        )}
      </section>

      <SaveComparisonDialog
        open={saving}
        onClose={() => setSaving(false)}
        defaultName={defaultName}
        runIds={selected}
        baselineRunId={baseline}
        options={options}
        onSaved={(c) => navigate(paths.comparison(c.id))}
      />
    </>
  );
}
