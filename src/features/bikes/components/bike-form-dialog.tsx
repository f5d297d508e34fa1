import { useId, useState, type ChangeEvent } from 'react';
import { useForm, useWatch, type Control } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { bikeFormSchema, type BikeDto, type BikeFormValues } from '@shared/schemas/bike';
import { cubicInchesToCc, guessDisplacementUnit } from '@shared/displacement';
import type { ShopDto } from '@shared/schemas/shop';
import { FormDialog, NumberField, SearchInput, SelectField, TextAreaField, TextField, cn, useDebouncedValue } from '@/components/ui';
import { useSaveDialogSubmit } from '@/lib/use-form-submit';
import { shopQuery } from '@/lib/shop-query';
import { bikeQueries } from '../api/bike-queries';
import { useCreateBike, type BikeFormData } from '../api/create-bike';
import { useUpdateBike } from '../api/update-bike';
import { formatCc, formatCubicInches } from '@shared/units-display';

export interface BikeFormDialogProps {
  open: boolean;
  onClose: () => void;
  /** Edit this bike; without it the dialog adds a new one. */
  bike?: BikeDto;
  /** Owner to preselect for a new bike (e.g. coming from the customer page). */
  customerId?: string;
  onSaved?: (bike: BikeDto) => void;
}

/** Add or edit a bike. Mounted only while open, so each opening starts from fresh values. */
export function BikeFormDialog(props: BikeFormDialogProps) {
  if (!props.open) return null;
  return <BikeFormDialogBody {...props} />;
}

function BikeFormDialogBody({ onClose, bike, customerId, onSaved }: BikeFormDialogProps) {
  const qc = useQueryClient();
  const create = useCreateBike();
  const update = useUpdateBike(bike?.id ?? '');
  const saving = create.isPending || update.isPending;
  // New bikes start in the shop's preferred unit; an edit shows the stored cm³ exactly.
  const [initialUnit] = useState<'cc' | 'ci'>(() => (!bike && qc.getQueryData<ShopDto>(shopQuery().queryKey)?.units === 'imperial' ? 'ci' : 'cc'));
  const form = useForm<BikeFormValues, unknown, BikeFormData>({
    resolver: zodResolver(bikeFormSchema),
    mode: 'onTouched',
    defaultValues: {
      customerId: bike?.customerId ?? customerId ?? '',
      make: bike?.make ?? '',
      model: bike?.model ?? '',
      year: bike?.year ?? '',
      vin: bike?.vin ?? '',
      engineFamily: bike?.engineFamily ?? '',
      displacement: bike?.displacementCc ?? '',
      displacementUnit: initialUnit,
      cylinders: bike?.cylinders ?? '',
      notes: bike?.notes ?? '',
    },
  });
  const { errors } = form.formState;
  const families = useQuery(bikeQueries.engineFamilies());
  const listId = useId();

  const { onSubmit, alert } = useSaveDialogSubmit(form, {
    editing: Boolean(bike),
    create: create.mutateAsync,
    update: update.mutateAsync,
    noun: 'Bike',
    added: (saved) => `${[saved.make, saved.model].join(' ')} added`,
    onClose,
    onSaved,
  });

  return (
    <FormDialog
      open
      onClose={onClose}
      busy={saving}
      size="lg"
      title={bike ? `Edit ${bike.make} ${bike.model}` : 'New bike'}
      description={bike ? undefined : 'Typed once here, so nobody retypes it at the dyno. Make, model and owner are required.'}
      formId="bike-form"
      onSubmit={onSubmit}
      submitLabel={bike ? 'Save changes' : 'Add bike'}
      busyLabel="Saving…"
      formError={alert}
    >
        <CustomerPicker control={form.control} register={form.register('customerId')} error={errors.customerId?.message} initialName={bike?.customerName} />
        <div className="grid gap-4 md:grid-cols-[1fr_1fr_8rem]">
          <TextField label="Make" required autoComplete="off" error={errors.make} {...form.register('make')} />
          <TextField label="Model" required autoComplete="off" error={errors.model} {...form.register('model')} />
          <NumberField label="Year" inputMode="numeric" step={1} error={errors.year} {...form.register('year')} />
        </div>
        <TextField
          label="VIN"
          autoComplete="off"
          spellCheck={false}
          maxLength={17}
          className="font-mono uppercase tracking-wide"
          hint="Optional. 17 characters, no I, O or Q; the 9th is a check digit, so a typo is caught here."
          error={errors.vin}
          {...form.register('vin')}
        />
        <div className="grid gap-4 md:grid-cols-[1fr_8rem]">
          <TextField
            label="Engine family"
            autoComplete="off"
            list={listId}
            hint="Use the same name for the same engine, so the build finder groups them. Suggestions come from your bikes."
            error={errors.engineFamily}
            {...form.register('engineFamily')}
          />
          <NumberField label="Cylinders" inputMode="numeric" step={1} error={errors.cylinders} {...form.register('cylinders')} />
        </div>
        <datalist id={listId}>
          {families.data?.map((f) => <option key={f} value={f} />)}
        </datalist>
        <DisplacementInput control={form.control} register={form.register} setValue={form.setValue} error={errors.displacement?.message} />
        <TextAreaField label="Notes" rows={3} error={errors.notes} {...form.register('notes')} />
    </FormDialog>
  );
}

type Register = ReturnType<typeof useForm<BikeFormValues, unknown, BikeFormData>>['register'];
type SetValue = ReturnType<typeof useForm<BikeFormValues, unknown, BikeFormData>>['setValue'];

/** Search box plus a native select, so a shop with hundreds of customers still finds one fast. */
function CustomerPicker({ control, register, error, initialName }: { control: Control<BikeFormValues, unknown, BikeFormData>; register: ReturnType<Register>; error?: string; initialName?: string }) {
  const [search, setSearch] = useState('');
  const q = useDebouncedValue(search.trim(), 250);
  const selected = useWatch({ control, name: 'customerId' });
  const options = useQuery(bikeQueries.customerOptions(q));
  const items = options.data?.items ?? [];
  // Keep the chosen customer in the list even when the search does not match them, so the
  // select never silently shows something other than the value that will be saved.
  const missing = Boolean(selected) && !items.some((c) => c.id === selected);
  const chosen = useQuery({ ...bikeQueries.customer(selected), enabled: missing });
  const known = missing ? [{ id: selected, name: chosen.data?.name ?? initialName ?? 'Loading…' }, ...items] : items;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <SearchInput label="Search the customer list" showLabel placeholder="Name, e-mail or phone" value={search} onValueChange={setSearch} />
      <SelectField
        label="Owner"
        required
        error={error}
        placeholder={options.isPending ? 'Loading customers…' : items.length === 0 && q ? 'No customer matches' : 'Choose the customer…'}
        options={known.map((c) => ({ value: c.id, label: c.name }))}
        {...register}
      />
    </div>
  );
}

/**
 * The number, a cm³ / in³ switch, and the same size in the other unit so a slip is obvious. A size
 * typed as cubic inches that only makes sense as cm³ (e.g. 1746) switches the unit to cm³ and says so.
 */
function DisplacementInput({ control, register, setValue, error }: { control: Control<BikeFormValues, unknown, BikeFormData>; register: Register; setValue: SetValue; error?: string }) {
  const [value, unit] = useWatch({ control, name: ['displacement', 'displacementUnit'] });
  const [guessed, setGuessed] = useState(false);
  const field = register('displacement');
  const onSizeChange = (e: ChangeEvent<HTMLInputElement>) => {
    const typed = Number(e.target.value);
    const likely = e.target.value.trim() === '' ? unit : guessDisplacementUnit(typed, unit ?? 'cc');
    if (likely !== unit) {
      setValue('displacementUnit', likely);
      setGuessed(true);
    }
    return field.onChange(e);
  };
  const n = typeof value === 'number' ? value : Number(value);
  const cc = value === '' || value == null || !Number.isFinite(n) || n <= 0 ? null : unit === 'ci' ? cubicInchesToCc(n) : n;
  const groupId = useId();
  const radio = (u: 'cc' | 'ci', text: string) => (
    <label
      className={cn(
        'flex min-h-11 cursor-pointer items-center gap-2 px-3 text-sm font-semibold',
        'has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-focus',
        unit === u ? 'bg-accent-soft text-accent' : 'bg-paper-raised text-ink hover:bg-paper-sunk',
      )}
    >
      <input type="radio" value={u} className="size-4 accent-accent" {...register('displacementUnit')} />
      {text}
    </label>
  );
  return (
    <div className="grid items-start gap-4 md:grid-cols-[1fr_auto]">
      <NumberField
        label="Displacement"
        unit={unit === 'ci' ? 'in³' : 'cm³'}
        error={error}
        hint={cc !== null ? `${guessed && unit === 'cc' ? 'Read as cm³ (too large for cubic inches): ' : ''}= ${formatCc(cc)} = ${formatCubicInches(cc)}` : 'Enter it as the maker quotes it; Pullbook stores cm³.'}
        {...field}
        onChange={onSizeChange}
      />
      <fieldset aria-describedby={`${groupId}-hint`}>
        <legend className="mb-1.5 text-sm font-semibold text-ink">Unit</legend>
        <div className="flex overflow-hidden rounded-control border border-line-strong">
          {radio('cc', 'cm³ (cc)')}
          <span aria-hidden className="w-px bg-line-strong" />
          {radio('ci', 'cubic inches')}
        </div>
        <p id={`${groupId}-hint`} className="sr-only">
          1 cubic inch is 16.387064 cm³.
        </p>
      </fieldset>
    </div>
  );
}
