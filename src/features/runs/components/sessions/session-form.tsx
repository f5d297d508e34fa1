import { useEffect, useId, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { sessionInput, type SessionDto } from '@shared/schemas/run';
import { cTo, kpaTo, pressureToKpa, temperatureToC } from '@shared/analysis/units';
import { Button, FormError, NumberField, SelectField, TextAreaField, TextField } from '@/components/ui';
import { formatNumber } from '@shared/format';
import { UNIT_SYSTEMS, type UnitSystem } from '@shared/units-display';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { sessionQueries } from '../../api/sessions/session-queries';
import { useCreateSession, type SessionInput } from '../../api/sessions/create-session';
import { CORRECTION_HINT, CORRECTION_OPTIONS } from '../../lib/correction';


function localNow(): string {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
}

/** What the form shows for each unit system. The API always takes °C and kPa. */
const UNIT_TEXT = {
  imperial: { temperature: '°F', pressure: 'inHg' },
  metric: { temperature: '°C', pressure: 'kPa' },
} as const;

/** The entered value in the API's units (°C, kPa); 1 inHg = 3.38638 kPa (NIST SP 811). */
export function toApiConditions(units: UnitSystem, temperature: number | null, pressure: number | null): { ambientTempC: number | null; baroKpa: number | null } {
  const imperial = units === 'imperial';
  return {
    ambientTempC: temperature === null ? null : imperial ? temperatureToC(temperature, 'f') : temperature,
    baroKpa: pressure === null ? null : imperial ? pressureToKpa(pressure, 'inhg') : pressure,
  };
}

/**
 * Station pressure on earth lies between about 60 and 110 kPa (17.7–32.5 inHg), so the two ranges
 * never overlap: a number inside one while the other unit is selected was typed in the other unit.
 */
export function pressureLooksLike(units: UnitSystem, value: number | null | undefined): UnitSystem | null {
  if (typeof value !== 'number' || !Number.isFinite(value)) return null;
  const asKpa = pressureToKpa(value, 'inhg');
  if (units === 'metric' && (value < 60 || value > 110) && asKpa >= 60 && asKpa <= 110) return 'imperial';
  if (units === 'imperial' && (asKpa < 60 || asKpa > 110) && value >= 60 && value <= 110) return 'metric';
  return null;
}

const blankNumber = z.preprocess(
  (v) => (v === '' || v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v)) ? null : typeof v === 'string' ? Number(v) : v),
  z.number({ invalid_type_error: 'Enter a number' }).nullable(),
);

/**
 * The API's session schema in the shape the form holds: a local date-time as text, an optional
 * dyno, and temperature and pressure in the shop's units. The ranges are the API's own (checked
 * with sessionInput after conversion) and the messages speak the units on screen.
 */
const sessionFormSchema = z
  .object({
    units: z.enum(UNIT_SYSTEMS),
    startedAt: z.string().optional(),
    dynoId: z.string().optional(),
    ambientTemp: blankNumber,
    baro: blankNumber,
    humidityPct: sessionInput.shape.humidityPct,
    correctionStandard: sessionInput.shape.correctionStandard,
    notes: sessionInput.shape.notes,
  })
  .superRefine((v, ctx) => {
    const api = toApiConditions(v.units, v.ambientTemp, v.baro);
    const u = UNIT_TEXT[v.units];
    const range = (minC: number, maxC: number, to: (x: number) => number) => `${formatNumber(to(minC), { decimals: 1 })} and ${formatNumber(to(maxC), { decimals: 1 })}`;
    if (!sessionInput.shape.ambientTempC.safeParse(api.ambientTempC).success) {
      const text = v.units === 'imperial' ? range(-40, 60, (c) => cTo(c, 'f')) : range(-40, 60, (c) => c);
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['ambientTemp'], message: `Ambient temperature must be between ${text} ${u.temperature}` });
    }
    if (!sessionInput.shape.baroKpa.safeParse(api.baroKpa).success) {
      const other = pressureLooksLike(v.units, v.baro);
      const text = v.units === 'imperial' ? range(60, 110, (k) => kpaTo(k, 'inhg')) : range(60, 110, (k) => k);
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['baro'],
        message: other ? `That looks like ${UNIT_TEXT[other].pressure}, not ${u.pressure} — switch units?` : `Barometric pressure must be between ${text} ${u.pressure}`,
      });
    }
  });
type FormValues = z.input<typeof sessionFormSchema>;
type FormOutput = z.output<typeof sessionFormSchema>;

/** A new dyno session for a bike, with the air conditions that correction needs, in the shop's units. */
export function SessionForm({ bikeId, units: shopUnits, onCreated, onCancel }: { bikeId: string; units: UnitSystem; onCreated: (s: SessionDto) => void; onCancel?: () => void }) {
  const dynos = useQuery(sessionQueries.dynos());
  const create = useCreateSession();
  const form = useForm<FormValues, unknown, FormOutput>({
    resolver: zodResolver(sessionFormSchema),
    mode: 'onTouched',
    defaultValues: { units: shopUnits, startedAt: localNow(), dynoId: '', correctionStandard: 'sae-j1349', notes: '' },
  });
  // The shop's units arrive after the first render; follow them until the user picks.
  const picked = useRef(false);
  useEffect(() => {
    if (!picked.current) form.setValue('units', shopUnits);
  }, [shopUnits, form]);

  const conditionsNoteId = useId();
  const errors = form.formState.errors;
  const units = form.watch('units');
  const baro = form.watch('baro');
  const u = UNIT_TEXT[units];
  const suggestion = pressureLooksLike(units, typeof baro === 'number' ? baro : Number(baro));

  const unitsChanged = () => {
    picked.current = true;
    // Re-check the numbers as typed, now read in the other units.
    const { touchedFields, isSubmitted } = form.formState;
    if (touchedFields.ambientTemp || touchedFields.baro || isSubmitted) void form.trigger(['ambientTemp', 'baro']);
  };
  const switchUnits = (next: UnitSystem) => {
    form.setValue('units', next);
    unitsChanged();
  };

  const submit = form.handleSubmit(async (v) => {
    const conditions = toApiConditions(v.units, v.ambientTemp, v.baro);
    try {
      const s = await create.mutateAsync({
        bikeId,
        dynoId: v.dynoId || null,
        startedAt: v.startedAt ? new Date(v.startedAt).toISOString() : undefined,
        ...conditions,
        humidityPct: v.humidityPct,
        correctionStandard: v.correctionStandard,
        notes: v.notes,
      } as SessionInput);
      onCreated(s);
    } catch (e) {
      // The API names its fields in °C and kPa; point them at the fields on screen.
      applyFieldErrors(e, (name: string, err: { message: string }) =>
        form.setError((name === 'ambientTempC' ? 'ambientTemp' : name === 'baroKpa' ? 'baro' : name) as never, err),
      );
    }
  });
  const dynoOptions = (dynos.data ?? []).map((d) => ({ value: d.id, label: d.name }));
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="New session">
      <div className="grid items-start gap-4 md:grid-cols-3">
        <TextField label="Date and time" type="datetime-local" {...form.register('startedAt')} error={errors.startedAt} />
        <SelectField
          label="Dyno"
          placeholder={dynos.isLoading ? 'Loading dynos…' : dynoOptions.length ? 'Choose a dyno…' : 'No dynos set up'}
          options={dynoOptions}
          {...form.register('dynoId')}
          error={errors.dynoId}
        />
        <SelectField
          label="Units for the conditions"
          options={[
            { value: 'imperial', label: '°F and inHg' },
            { value: 'metric', label: '°C and kPa' },
          ]}
          {...form.register('units', { onChange: () => unitsChanged() })}
          aria-describedby={conditionsNoteId}
        />
        {/* The date is filled in already: the air conditions are what the tuner types first. */}
        <NumberField label="Ambient temperature" unit={u.temperature} autoFocus {...form.register('ambientTemp', { valueAsNumber: true })} error={errors.ambientTemp} />
        <div>
          <NumberField label="Barometric pressure" unit={u.pressure} {...form.register('baro', { valueAsNumber: true })} error={errors.baro} aria-describedby={conditionsNoteId} />
          {suggestion && (
            <Button size="sm" variant="secondary" className="mt-2" onClick={() => switchUnits(suggestion)}>
              Switch to {UNIT_TEXT[suggestion].temperature} and {UNIT_TEXT[suggestion].pressure}
            </Button>
          )}
        </div>
        <NumberField label="Relative humidity" unit="%" {...form.register('humidityPct', { valueAsNumber: true })} error={errors.humidityPct} />
        <p id={conditionsNoteId} className="text-sm text-ink-muted md:col-span-3">
          Barometric pressure is station pressure, not sea-level. The shop works in {shopUnits === 'imperial' ? '°F and inHg' : '°C and kPa'}; Pullbook stores °C and kPa.
        </p>
        <SelectField label="Correction standard" containerClassName="md:col-span-1" options={CORRECTION_OPTIONS} {...form.register('correctionStandard')} error={errors.correctionStandard} hint={CORRECTION_HINT} />
      </div>
      <TextAreaField label="Session notes" rows={2} {...form.register('notes')} error={errors.notes} />
      <FormError error={create.error instanceof ApiError && create.error.fields.length ? null : create.error} title="The session was not created" />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" loading={create.isPending}>
          Create session
        </Button>
        {onCancel && (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
