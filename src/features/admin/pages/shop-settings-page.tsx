import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { formatDateTime } from '@shared/format';
import { timeZoneNames } from '@shared/time-zone';
import { shopSettingsInput, type CorrectionStandard, type ShopDto } from '@shared/schemas/shop';
import { Button, Card, ErrorState, FormError, LoadingState, NumberField, PageHeader, SelectField, type SelectOption, TextAreaField, TextField, useToast, fieldProblemsSummary } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { shopQuery } from '@/lib/shop-query';
import { useUpdateShop } from '../api/update-shop';
import { usePageTitle } from '@/lib/page-title';

const CORRECTION_LABELS: Record<CorrectionStandard, string> = {
  none: 'None — observed figures as measured',
  'sae-j1349': 'SAE J1349 (current edition)',
  'sae-j1349-1990': 'SAE J1349 (1990 edition)',
  'iso-1585': 'ISO 1585',
  'din-70020': 'DIN 70020',
  'sae-j607': 'SAE J607',
};

const UNIT_OPTIONS: SelectOption[] = [
  { value: 'imperial', label: 'Imperial (hp, lb·ft)' },
  { value: 'metric', label: 'Metric (kW, N·m)' },
];
const PAPER_OPTIONS: SelectOption[] = [
  { value: 'letter', label: 'Letter (8.5 × 11 in)' },
  { value: 'a4', label: 'A4 (210 × 297 mm)' },
];
const DEPOSIT_OPTIONS: SelectOption[] = [
  { value: 'off', label: 'No deposit' },
  { value: 'percent', label: 'A percentage of the plan' },
  { value: 'fixed', label: 'A fixed amount' },
];
const CORRECTION_SELECT: SelectOption[] = Object.entries(CORRECTION_LABELS).map(([value, label]) => ({ value, label }));
const TIME_ZONE_OPTIONS: SelectOption[] = timeZoneNames().map((name) => ({ value: name, label: name.replaceAll('_', ' ') }));

/** The form takes the fixed deposit in the currency's main unit (250.00), the API in cents. */
const shopSettingsForm = shopSettingsInput.omit({ depositFixedCents: true }).extend({
  depositFixed: z.coerce
    .number({ message: 'Enter an amount, e.g. 250.00' })
    .min(0, 'Not below zero')
    .max(100_000, 'At most 100,000')
    .refine((v) => Math.abs(v * 100 - Math.round(v * 100)) < 1e-6, 'At most two decimals'),
});
type ShopSettingsFormValues = z.input<typeof shopSettingsForm>;
type ShopSettingsFormOutput = z.output<typeof shopSettingsForm>;
const toInput = ({ depositFixed, ...rest }: ShopSettingsFormOutput): z.output<typeof shopSettingsInput> => ({ ...rest, depositFixedCents: Math.round(depositFixed * 100) });

/** Owner only: the guard is the settings layout route (../routes.tsx). */
export default function ShopSettingsPage() {
  usePageTitle('Shop settings');
  const shop = useQuery({ ...shopQuery(), staleTime: 0 });
  return (
    <>
      <PageHeader title="Shop settings" subtitle="How the shop appears on gain reports, and the defaults new work starts from." />
      {shop.isPending ? (
        <LoadingState message="Loading the shop settings…" />
      ) : shop.isError ? (
        <ErrorState error={shop.error} onRetry={() => shop.refetch()} isRetrying={shop.isFetching} />
      ) : (
        <ShopForm shop={shop.data} />
      )}
    </>
  );
}

function ShopForm({ shop }: { shop: ShopDto }) {
  const toast = useToast();
  const save = useUpdateShop();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<ShopSettingsFormValues, unknown, ShopSettingsFormOutput>({
    resolver: zodResolver(shopSettingsForm),
    mode: 'onTouched',
    defaultValues: {
      name: shop.name,
      address: shop.address ?? '',
      phone: shop.phone ?? '',
      email: shop.email ?? '',
      units: shop.units,
      paperSize: shop.paperSize,
      defaultCorrection: shop.defaultCorrection,
      timeZone: shop.timeZone,
      currency: shop.currency.toUpperCase(),
      depositMode: shop.depositMode,
      depositPercent: shop.depositPercent,
      depositFixed: shop.depositFixedCents / 100,
    },
  });
  const depositMode = form.watch('depositMode');
  const timeZone = form.watch('timeZone');
  const currency = (form.watch('currency') || shop.currency).toUpperCase();
  const { errors, isDirty, isSubmitted } = form.formState;
  // After a submit, every field problem is also summed up in the form's alert, so it is announced.
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      const saved = await save.mutateAsync(toInput(values));
      form.reset({ ...values, address: saved.address ?? '', phone: saved.phone ?? '', email: saved.email ?? '', currency: saved.currency.toUpperCase() });
      toast.success('Shop settings saved');
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
      toast.error('The settings were not saved');
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-5xl gap-6 lg:grid-cols-2">
      <FormError error={formError ?? fieldProblems} className="lg:col-span-2" />
      <Card title="On reports and e-mails" description="Printed in the header of every gain report.">
        <div className="space-y-4">
          <TextField label="Shop name" required error={errors.name} {...form.register('name')} />
          <TextAreaField label="Address" rows={3} error={errors.address} {...form.register('address')} />
          <div className="grid gap-4 md:grid-cols-2">
            <TextField label="Phone" type="tel" error={errors.phone} {...form.register('phone')} />
            <TextField label="E-mail" type="email" error={errors.email} {...form.register('email')} />
          </div>
        </div>
      </Card>
      <Card title="Defaults" description="Each comparison and report can still choose otherwise.">
        <div className="space-y-4">
          <SelectField
            label="Units"
            hint="Imperial: hp, lb·ft, °F, inHg. Metric: kW, N·m, °C, kPa."
            options={UNIT_OPTIONS}
            error={errors.units}
            {...form.register('units')}
          />
          <SelectField
            label="Report paper size"
            options={PAPER_OPTIONS}
            error={errors.paperSize}
            {...form.register('paperSize')}
          />
          <SelectField
            label="Default correction standard"
            hint={
              <>
                Corrects measured figures to standard air, so runs from different days compare fairly. Compare only runs corrected the same way. Motorcycle engine test practice is covered by
                ISO 4106; shops choose the standard their customers expect.
              </>
            }
            options={CORRECTION_SELECT}
            error={errors.defaultCorrection}
            {...form.register('defaultCorrection')}
          />
          <SelectField
            label="Time zone"
            hint={`The shop's calendar day: today's session on each dyno, and the dates printed on reports and quotes.${timeZone ? ` Now ${formatDateTime(new Date(), { timeZone })} there.` : ''}`}
            options={TIME_ZONE_OPTIONS}
            error={errors.timeZone}
            {...form.register('timeZone')}
          />
        </div>
      </Card>
      <Card title="Build plan deposits" description="Asked when a customer accepts a build plan, paid online through the payment service.">
        <div className="space-y-4">
          <TextField label="Currency" hint="Three-letter code, e.g. USD, EUR, GBP." maxLength={3} error={errors.currency} {...form.register('currency')} />
          <SelectField label="Deposit" options={DEPOSIT_OPTIONS} error={errors.depositMode} {...form.register('depositMode')} />
          {depositMode === 'percent' && <NumberField label="Deposit percentage" unit="%" min={0} max={100} step={1} error={errors.depositPercent} {...form.register('depositPercent')} />}
          {depositMode === 'fixed' && (
            <NumberField
              label="Fixed deposit"
              unit={currency}
              hint="For example 250.00. Never more than the plan's total."
              min={0}
              step={0.01}
              error={errors.depositFixed}
              {...form.register('depositFixed')}
            />
          )}
        </div>
      </Card>
      <div className="flex items-center justify-end gap-3 lg:col-span-2">
        {isDirty && <span className="text-sm text-ink-muted">Unsaved changes</span>}
        <Button type="button" variant="ghost" disabled={!isDirty || save.isPending} onClick={() => form.reset()}>
          Undo changes
        </Button>
        <Button type="submit" variant="primary" loading={save.isPending} loadingText="Saving…">
          Save settings
        </Button>
      </div>
    </form>
  );
}
