import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { CORRECTION_IDS, sessionInput, type SessionDto } from '@shared/schemas/run';
import { CORRECTION_STANDARDS } from '@server/analysis/correction';
import { Button, FormError, NumberField, SelectField, TextAreaField, TextField } from '@/components/ui';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { sessionQueries } from '../api/session-queries';
import { useCreateSession, type SessionInput } from '../api/create-session';

export const CORRECTION_OPTIONS = CORRECTION_IDS.map((id) => ({ value: id, label: CORRECTION_STANDARDS.find((s) => s.id === id)?.label ?? id }));

function localNow(): string {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
}

/** The API's schema, with the two fields a form holds as text (a local date-time, an optional dyno). */
const sessionFormSchema = sessionInput.extend({ startedAt: z.string().optional(), dynoId: z.string().optional() });
type FormValues = z.input<typeof sessionFormSchema>;

/** A new dyno session for a bike, with the air conditions that correction needs. */
export function SessionForm({ bikeId, onCreated, onCancel }: { bikeId: string; onCreated: (s: SessionDto) => void; onCancel?: () => void }) {
  const dynos = useQuery(sessionQueries.dynos());
  const create = useCreateSession();
  const form = useForm<FormValues>({
    resolver: zodResolver(sessionFormSchema),
    defaultValues: { bikeId, startedAt: localNow(), dynoId: '', correctionStandard: 'sae-j1349', notes: '' },
  });
  const errors = form.formState.errors;
  const submit = form.handleSubmit(async (v) => {
    try {
      const s = await create.mutateAsync({
        ...v,
        bikeId,
        dynoId: v.dynoId || null,
        startedAt: v.startedAt ? new Date(v.startedAt).toISOString() : undefined,
      } as SessionInput);
      onCreated(s);
    } catch (e) {
      applyFieldErrors(e, form.setError);
    }
  });
  const dynoOptions = (dynos.data ?? []).map((d) => ({ value: d.id, label: d.name }));
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="New session">
      <div className="grid gap-4 md:grid-cols-3">
        <TextField label="Date and time" type="datetime-local" {...form.register('startedAt')} error={errors.startedAt} />
        <SelectField
          label="Dyno"
          placeholder={dynos.isLoading ? 'Loading dynos…' : dynoOptions.length ? 'Choose a dyno…' : 'No dynos set up'}
          options={dynoOptions}
          {...form.register('dynoId')}
          error={errors.dynoId}
        />
        <SelectField label="Correction standard" options={CORRECTION_OPTIONS} {...form.register('correctionStandard')} error={errors.correctionStandard} />
        <NumberField label="Ambient temperature" unit="°C" {...form.register('ambientTempC', { valueAsNumber: true })} error={errors.ambientTempC} />
        <NumberField label="Barometric pressure" unit="kPa" {...form.register('baroKpa', { valueAsNumber: true })} error={errors.baroKpa} hint="Station pressure, not sea-level." />
        <NumberField label="Relative humidity" unit="%" {...form.register('humidityPct', { valueAsNumber: true })} error={errors.humidityPct} />
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
