import { useId, useState } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { HEAD_WORK_LABELS, HEAD_WORK_LEVELS, PART_CATEGORIES, PART_CATEGORY_LABELS } from '@shared/parts';
import { planFormInput, type PlanDto, type PlanEditorValues } from '@shared/schemas/plans';
import { Button, FormDialog, NumberField, SelectField, TextAreaField, TextField, fieldProblemsSummary, useToast, type SelectOption } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { useSavePlan } from '../api/save-plan';

const CATEGORY_OPTIONS: SelectOption[] = PART_CATEGORIES.map((c) => ({ value: c, label: PART_CATEGORY_LABELS[c] }));
const HEAD_OPTIONS: SelectOption[] = [{ value: '', label: 'Not stated' }, ...HEAD_WORK_LEVELS.map((l) => ({ value: l, label: HEAD_WORK_LABELS[l] }))];
const EMPTY_ITEM = { category: 'exhaust', description: '', partCost: '', labourCost: '', headWork: '' } as const;

export interface PlanEditorProps {
  open: boolean;
  onClose: () => void;
  bikeId: string;
  /** Edit this draft; without it the dialog drafts a new plan. */
  plan?: PlanDto;
  onSaved?: (plan: PlanDto) => void;
}

/** Draft or edit a build plan: a title, items with their category, part and labour cost. Mounted only while open. */
export function PlanEditor(props: PlanEditorProps) {
  if (!props.open) return null;
  return <PlanEditorBody {...props} />;
}

function PlanEditorBody({ onClose, bikeId, plan, onSaved }: PlanEditorProps) {
  const formId = useId();
  const toast = useToast();
  const save = useSavePlan(bikeId, plan?.id);
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<PlanEditorValues, unknown, z.output<typeof planFormInput>>({
    resolver: zodResolver(planFormInput),
    mode: 'onTouched',
    defaultValues: {
      title: plan?.title ?? '',
      note: plan?.note ?? '',
      items: plan?.items.map((i) => ({ category: i.category, description: i.description, partCost: i.partCostCents / 100, labourCost: i.labourCostCents / 100, headWork: i.headWork ?? '' })) ?? [{ ...EMPTY_ITEM }],
    },
  });
  const items = useFieldArray({ control: form.control, name: 'items' });
  const { errors, isSubmitted } = form.formState;
  const watched = form.watch('items');

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      const saved = await save.mutateAsync(values);
      toast.success(plan ? 'Plan saved' : 'Plan drafted');
      onSaved?.(saved);
      onClose();
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
    }
  });

  return (
    <FormDialog
      open
      onClose={onClose}
      size="xl"
      title={plan ? 'Edit plan' : 'New build plan'}
      description="Parts and labour for the next stage. The expected gain comes from similar builds in the archive."
      formId={formId}
      onSubmit={onSubmit}
      busy={save.isPending}
      submitLabel={plan ? 'Save plan' : 'Draft plan'}
      busyLabel="Saving…"
      formError={formError ?? fieldProblemsSummary(isSubmitted, errors)}
    >
      <TextField label="Title" required placeholder="e.g. Cam and mild head port" error={errors.title} {...form.register('title')} />
      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold text-ink">Items</legend>
        {items.fields.map((field, i) => (
          <div key={field.id} className="grid gap-3 rounded-card border border-line p-3 md:grid-cols-12" role="group" aria-label={`Item ${i + 1}`}>
            <SelectField className="md:col-span-3" label="Category" options={CATEGORY_OPTIONS} error={errors.items?.[i]?.category} {...form.register(`items.${i}.category`)} />
            <TextField className="md:col-span-5" label="Description" required error={errors.items?.[i]?.description} {...form.register(`items.${i}.description`)} />
            <NumberField className="md:col-span-2" label="Parts" min={0} step="0.01" error={errors.items?.[i]?.partCost} {...form.register(`items.${i}.partCost`)} />
            <NumberField className="md:col-span-2" label="Labour" min={0} step="0.01" error={errors.items?.[i]?.labourCost} {...form.register(`items.${i}.labourCost`)} />
            {watched?.[i]?.category === 'cylinder-heads' && (
              <SelectField className="md:col-span-4" label="Head work" options={HEAD_OPTIONS} error={errors.items?.[i]?.headWork} {...form.register(`items.${i}.headWork`)} />
            )}
            <div className="flex items-end justify-end md:col-span-12">
              <Button type="button" size="sm" variant="ghost" disabled={items.fields.length === 1} onClick={() => items.remove(i)}>
                Remove<span className="sr-only"> item {i + 1}</span>
              </Button>
            </div>
          </div>
        ))}
        {errors.items?.root?.message || errors.items?.message ? <p className="text-sm text-loss">{errors.items?.root?.message ?? errors.items?.message}</p> : null}
        <Button type="button" size="sm" onClick={() => items.append({ ...EMPTY_ITEM })} disabled={items.fields.length >= 50}>
          Add item
        </Button>
      </fieldset>
      <TextAreaField label="Note for the customer" rows={3} error={errors.note} {...form.register('note')} />
    </FormDialog>
  );
}
