import { useState, type FormEvent } from 'react';
import { Button, SelectField, TextField } from '@/components/ui';
import { HEAD_WORK_LEVELS, PART_CATEGORIES } from '@shared/parts';
import type { FinderFilters } from '../api/finder-queries';
import { categoryLabel, headLabel } from './format-build';

export interface FinderFiltersFormProps {
  initial: FinderFilters;
  onSearch: (filters: FinderFilters) => void;
  busy?: boolean;
}

const TEXT_FIELDS = ['q', 'engine', 'make', 'model', 'partText', 'tag', 'from', 'to', 'cylinders', 'headLevel', 'dMin', 'dMax', 'unit'] as const;

/**
 * The finder's filters: a plain form (Enter submits from any field, every control labelled).
 * Displacement is entered in cm³ or cubic inches and sent as ccMin/ccMax or ciMin/ciMax.
 */
export function FinderFiltersForm({ initial, onSearch, busy }: FinderFiltersFormProps) {
  const unitInitial = initial.ciMin || initial.ciMax ? 'ci' : 'cc';
  const [unit, setUnit] = useState(unitInitial);
  const [parts, setParts] = useState<string[]>(initial.parts ? initial.parts.split(',') : []);

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const out: FinderFilters = {};
    for (const name of TEXT_FIELDS) {
      const v = String(data.get(name) ?? '').trim();
      if (v) out[name] = v;
    }
    const { dMin, dMax } = out;
    delete out.dMin;
    delete out.dMax;
    delete out.unit;
    if (dMin) out[unit === 'ci' ? 'ciMin' : 'ccMin'] = dMin;
    if (dMax) out[unit === 'ci' ? 'ciMax' : 'ccMax'] = dMax;
    if (parts.length) out.parts = parts.join(',');
    if (initial.sort) out.sort = initial.sort;
    onSearch(out);
  }

  const dMinInitial = initial.ciMin ?? initial.ccMin ?? '';
  const dMaxInitial = initial.ciMax ?? initial.ccMax ?? '';
  return (
    <form onSubmit={submit} className="grid min-w-0 gap-4 rounded-card border border-line bg-paper-raised p-4" aria-label="Search past builds">
      <div className="grid min-w-0 gap-4 md:grid-cols-2 xl:grid-cols-3">
        <TextField label="Words in notes and parts" name="q" defaultValue={initial.q ?? ''} hint="e.g. valve job, pinging" />
        <TextField label="Engine family" name="engine" defaultValue={initial.engine ?? ''} hint="Close spellings match too" />
        <TextField label="Part description contains" name="partText" defaultValue={initial.partText ?? ''} />
        <TextField label="Make" name="make" defaultValue={initial.make ?? ''} />
        <TextField label="Model" name="model" defaultValue={initial.model ?? ''} />
        <TextField label="Cylinders" name="cylinders" type="number" min={1} max={16} inputMode="numeric" defaultValue={initial.cylinders ?? ''} />
        <div className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
          <TextField label="Displacement from" name="dMin" type="number" min={0} step="any" inputMode="decimal" defaultValue={dMinInitial} />
          <TextField label="to" name="dMax" type="number" min={0} step="any" inputMode="decimal" defaultValue={dMaxInitial} />
          <SelectField
            label="Unit"
            name="unit"
            value={unit}
            onChange={(e) => setUnit(e.target.value)}
            options={[{ value: 'cc', label: 'cm³' }, { value: 'ci', label: 'in³' }]}
          />
        </div>
        <TextField label="Tag on a run" name="tag" defaultValue={initial.tag ?? ''} />
        <div className="grid grid-cols-2 gap-2">
          <TextField label="From date" name="from" type="date" defaultValue={initial.from ?? ''} />
          <TextField label="To date" name="to" type="date" defaultValue={initial.to ?? ''} />
        </div>
      </div>
      <fieldset className="grid gap-2">
        <legend className="mb-1 text-sm font-semibold text-ink">The build has (all of)</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-2">
          {PART_CATEGORIES.map((c) => (
            <label key={c} className="inline-flex min-h-10 items-center gap-2 text-sm text-ink">
              <input
                type="checkbox"
                name="parts"
                value={c}
                checked={parts.includes(c)}
                onChange={(e) => setParts((p) => (e.target.checked ? [...p, c] : p.filter((x) => x !== c)))}
                className="size-4 accent-accent"
              />
              {categoryLabel(c)}
            </label>
          ))}
        </div>
        <div className="max-w-xs">
          <SelectField
            label="Cylinder-head work at least"
            name="headLevel"
            defaultValue={initial.headLevel ?? ''}
            options={[{ value: '', label: 'Any (or none)' }, ...HEAD_WORK_LEVELS.filter((l) => l !== 'stock').map((l) => ({ value: l, label: `${headLabel(l)} or more` }))]}
          />
        </div>
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" loading={busy}>
          Search builds
        </Button>
        <Button type="reset" variant="secondary" onClick={() => { setParts([]); setUnit('cc'); onSearch({}); }}>
          Clear
        </Button>
      </div>
    </form>
  );
}
