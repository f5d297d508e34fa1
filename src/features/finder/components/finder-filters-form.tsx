import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { buildSearchForm, type BuildSearchFormValues } from '@shared/schemas/builds';
import { HEAD_WORK_LEVELS, PART_CATEGORIES, type PartCategory } from '@shared/parts';
import { Button, FormError, SelectField, TextField, errorMessage } from '@/components/ui';
import type { FinderFilters } from '../api/finder-queries';
import { categoryLabel, headLabel } from './format-build';

export interface FinderFiltersFormProps {
  initial: FinderFilters;
  onSearch: (filters: FinderFilters) => void;
  busy?: boolean;
}

const TEXT_KEYS = ['q', 'engine', 'partText', 'make', 'model', 'cylinders', 'tag', 'from', 'to', 'headLevel'] as const;

/** The URL's filters (strings) as form values. */
function toFormValues(f: FinderFilters): BuildSearchFormValues {
  const ci = Boolean(f.ciMin || f.ciMax);
  const parts = (f.parts ?? '').split(',').filter((p): p is PartCategory => (PART_CATEGORIES as readonly string[]).includes(p));
  const headLevel = (HEAD_WORK_LEVELS as readonly string[]).includes(f.headLevel ?? '') ? (f.headLevel as BuildSearchFormValues['headLevel']) : '';
  return {
    q: f.q ?? '',
    engine: f.engine ?? '',
    partText: f.partText ?? '',
    make: f.make ?? '',
    model: f.model ?? '',
    cylinders: f.cylinders ?? '',
    dMin: (ci ? f.ciMin : f.ccMin) ?? '',
    dMax: (ci ? f.ciMax : f.ccMax) ?? '',
    unit: ci ? 'ci' : 'cc',
    tag: f.tag ?? '',
    from: f.from ?? '',
    to: f.to ?? '',
    parts,
    headLevel,
  };
}

/** Checked form values as the URL and GET /api/builds/search carry them (blank values left out). */
function toFilters(v: BuildSearchFormValues, sort: string | undefined): FinderFilters {
  const out: FinderFilters = {};
  for (const key of TEXT_KEYS) {
    const value = v[key].trim();
    if (value) out[key] = value;
  }
  if (v.dMin.trim()) out[v.unit === 'ci' ? 'ciMin' : 'ccMin'] = v.dMin.trim();
  if (v.dMax.trim()) out[v.unit === 'ci' ? 'ciMax' : 'ccMax'] = v.dMax.trim();
  if (v.parts.length) out.parts = v.parts.join(',');
  if (sort) out.sort = sort;
  return out;
}

const EMPTY = toFormValues({});

const DISPLACEMENT_UNITS = [
  { value: 'cc', label: 'cm³' },
  { value: 'ci', label: 'in³' },
];

/**
 * The finder's filters (react-hook-form + the shared `buildSearchForm` schema): Enter submits
 * from any field, every control is labelled, a wrong value is marked at its field and summed up
 * in an alert above the form. Displacement is entered in cm³ or in³ and sent as ccMin/ccMax or ciMin/ciMax.
 */
export function FinderFiltersForm({ initial, onSearch, busy }: FinderFiltersFormProps) {
  const form = useForm<BuildSearchFormValues>({ resolver: zodResolver(buildSearchForm), mode: 'onSubmit', reValidateMode: 'onChange', defaultValues: toFormValues(initial) });
  const { errors, isSubmitted } = form.formState;
  const problems = Object.values(errors)
    .map((e) => errorMessage(e))
    .filter(Boolean);

  const onSubmit = form.handleSubmit((values) => onSearch(toFilters(values, initial.sort)));

  return (
    <form onSubmit={onSubmit} noValidate className="grid min-w-0 gap-4 rounded-card border border-line bg-paper-raised p-4" aria-label="Search past builds">
      <FormError error={isSubmitted && problems.length ? `Check the filters marked below: ${problems.join('; ')}.` : null} title="The search was not run" />
      <div className="grid min-w-0 gap-4 md:grid-cols-2 xl:grid-cols-3">
        <TextField label="Words in notes and parts" hint="e.g. valve job, pinging" error={errors.q} {...form.register('q')} />
        <TextField label="Engine family" hint="Close spellings match too" error={errors.engine} {...form.register('engine')} />
        <TextField label="Part description contains" error={errors.partText} {...form.register('partText')} />
        <TextField label="Make" error={errors.make} {...form.register('make')} />
        <TextField label="Model" error={errors.model} {...form.register('model')} />
        <TextField label="Cylinders" type="number" min={1} max={16} inputMode="numeric" error={errors.cylinders} {...form.register('cylinders')} />
        <div className="grid grid-cols-[1fr_1fr_auto] items-start gap-2">
          <TextField label="Displacement from" type="number" min={0} step="any" inputMode="decimal" error={errors.dMin} {...form.register('dMin')} />
          <TextField label="to" type="number" min={0} step="any" inputMode="decimal" error={errors.dMax} {...form.register('dMax')} />
          <SelectField
            label="Unit"
            containerClassName="min-w-24"
            options={DISPLACEMENT_UNITS}
            error={errors.unit}
            {...form.register('unit')}
          />
        </div>
        <TextField label="Tag on a run" error={errors.tag} {...form.register('tag')} />
        <div className="grid grid-cols-2 items-start gap-2">
          <TextField label="From date" type="date" error={errors.from} {...form.register('from')} />
          <TextField label="To date" type="date" error={errors.to} {...form.register('to')} />
        </div>
      </div>
      <fieldset className="grid gap-2">
        <legend className="mb-1 text-sm font-semibold text-ink">The build has (all of)</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-2">
          {PART_CATEGORIES.map((c) => (
            <label key={c} className="inline-flex min-h-11 items-center gap-2 text-sm text-ink">
              <input type="checkbox" value={c} className="size-5 accent-accent" {...form.register('parts')} />
              {categoryLabel(c)}
            </label>
          ))}
        </div>
        <div className="max-w-xs">
          <SelectField
            label="Cylinder-head work at least"
            options={[{ value: '', label: 'Any (or none)' }, ...HEAD_WORK_LEVELS.filter((l) => l !== 'stock').map((l) => ({ value: l, label: `${headLabel(l)} or more` }))]}
            error={errors.headLevel}
            {...form.register('headLevel')}
          />
        </div>
      </fieldset>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" loading={busy}>
          Search builds
        </Button>
        <Button
          type="button"
          variant="secondary"
          onClick={() => {
            form.reset(EMPTY);
            onSearch({});
          }}
        >
          Clear
        </Button>
      </div>
    </form>
  );
}
