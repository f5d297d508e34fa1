import { useEffect } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import { HEAD_WORK_LABELS, HEAD_WORK_LEVELS, PART_CATEGORIES, PART_CATEGORY_LABELS, type HeadWorkLevel, type PartCategory } from '@shared/parts';
import type { StageDto } from '@shared/schemas/run';
import { partInput, stageInput } from '@shared/schemas/run';
import { Button, Dialog, FormError, Icon, IconButton, NumberField, SelectField, TextAreaField, TextField, useToast } from '@/components/ui';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { useCreateStage } from '../../api/stages/create-stage';
import { useUpdateStage } from '../../api/stages/update-stage';

interface PartValues {
  category: PartCategory;
  description: string;
  partCost: string;
  labourCost: string;
  headWorkLevel: HeadWorkLevel | '';
}
interface Values {
  name: string;
  date: string;
  description: string;
  parts: PartValues[];
}

/**
 * The API's stage schema (stageInput / partInput) in the shape the form holds: the date and the
 * head-work level as text ("" for none), money as typed. Output is the API's body without bikeId.
 */
const stageFormSchema = stageInput.omit({ bikeId: true }).extend({
  date: z.preprocess((v) => (v === '' ? null : v), stageInput.shape.date),
  parts: z
    .array(
      partInput.extend({
        headWorkLevel: z.preprocess((v) => (v === '' ? null : v), partInput.shape.headWorkLevel),
      }),
    )
    .max(100),
});
type StageFormInput = z.input<typeof stageFormSchema>;
type StageFormOutput = z.output<typeof stageFormSchema>;

const emptyPart: PartValues = { category: 'exhaust', description: '', partCost: '', labourCost: '', headWorkLevel: '' };
const money = (cents: number) => (cents ? String(cents / 100) : '');

function toValues(stage: StageDto | null): Values {
  if (!stage) return { name: '', date: '', description: '', parts: [] };
  return {
    name: stage.name,
    date: stage.date ?? '',
    description: stage.description ?? '',
    parts: stage.parts.map((p) => ({ category: p.category, description: p.description, partCost: money(p.partCostCents), labourCost: money(p.labourCostCents), headWorkLevel: p.headWorkLevel ?? '' })),
  };
}

/** Add or edit a stage of the build, with the parts and work it included and what they cost. */
export function StageFormDialog({ bikeId, stage, open, onClose }: { bikeId: string; stage: StageDto | null; open: boolean; onClose: () => void }) {
  const toast = useToast();
  const create = useCreateStage();
  const update = useUpdateStage();
  // Field errors show as soon as a field is left, and again on submit.
  const form = useForm<StageFormInput, unknown, StageFormOutput>({ resolver: zodResolver(stageFormSchema), mode: 'onTouched', defaultValues: toValues(stage) });
  const parts = useFieldArray({ control: form.control, name: 'parts' });
  const busy = create.isPending || update.isPending;
  const error = create.error ?? update.error;

  useEffect(() => {
    if (open) {
      form.reset(toValues(stage));
      create.reset();
      update.reset();
    }
    // Reset when the dialog opens for another stage.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open, stage]);

  const submit = form.handleSubmit(async (v) => {
    // Head work is recorded only for cylinder-head parts.
    const changes = { ...v, parts: v.parts.map((p) => ({ ...p, headWorkLevel: p.category === 'cylinder-heads' ? (p.headWorkLevel ?? null) : null })) };
    try {
      if (stage) await update.mutateAsync({ id: stage.id, ...changes });
      else await create.mutateAsync({ bikeId, ...changes });
      toast.success(stage ? `Saved ${v.name}` : `Added ${v.name}`);
      onClose();
    } catch (e) {
      applyFieldErrors(e, form.setError);
    }
  });
  const errors = form.formState.errors;
  const watched = form.watch('parts');

  return (
    <Dialog
      open={open}
      onClose={onClose}
      busy={busy}
      size="xl"
      title={stage ? `Edit ${stage.name}` : 'Add a stage'}
      description="A stage is one state of the build: what was on the bike, and what it cost."
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={busy}>
            Cancel
          </Button>
          <Button variant="primary" type="submit" form="stage-form" loading={busy}>
            {stage ? 'Save stage' : 'Add stage'}
          </Button>
        </>
      }
    >
      <form id="stage-form" onSubmit={submit} noValidate className="space-y-4">
        <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
          <TextField label="Name" required {...form.register('name')} error={errors.name} hint="e.g. “Baseline”, “Stage 1”, “Cam + ported heads”" />
          <TextField label="Date" type="date" {...form.register('date')} error={errors.date} />
        </div>
        <TextAreaField label="Description" rows={2} {...form.register('description')} error={errors.description} />
        <fieldset className="space-y-3">
          <legend className="font-semibold text-ink">Parts and work</legend>
          {parts.fields.length === 0 && <p className="text-sm text-ink-muted">No parts yet. A baseline usually has none.</p>}
          {parts.fields.map((field, i) => (
            <div key={field.id} className="grid gap-3 rounded-card border border-line p-3 md:grid-cols-[12rem_1fr_8rem_8rem_auto]">
              <SelectField
                label="Category"
                options={PART_CATEGORIES.map((c) => ({ value: c, label: PART_CATEGORY_LABELS[c] }))}
                {...form.register(`parts.${i}.category`)}
                error={errors.parts?.[i]?.category}
              />
              <TextField label="Part or job" {...form.register(`parts.${i}.description`)} error={errors.parts?.[i]?.description} />
              <NumberField label="Part cost" unit="$" min={0} {...form.register(`parts.${i}.partCost`)} error={errors.parts?.[i]?.partCost} />
              <NumberField label="Labour" unit="$" min={0} {...form.register(`parts.${i}.labourCost`)} error={errors.parts?.[i]?.labourCost} />
              <div className="flex items-end">
                <IconButton label={`Remove part ${i + 1}`} icon={<Icon name="x" size={18} />} onClick={() => parts.remove(i)} />
              </div>
              {watched?.[i]?.category === 'cylinder-heads' && (
                <SelectField
                  label="Head work"
                  containerClassName="md:col-span-2"
                  placeholder="Choose the extent…"
                  options={HEAD_WORK_LEVELS.map((h) => ({ value: h, label: HEAD_WORK_LABELS[h] }))}
                  {...form.register(`parts.${i}.headWorkLevel`)}
                  hint="The build finder searches by this."
                />
              )}
            </div>
          ))}
          <Button size="sm" icon={<Icon name="plus" size={16} />} onClick={() => parts.append({ ...emptyPart })}>
            Add a part
          </Button>
        </fieldset>
        <FormError error={error instanceof ApiError && error.fields.length ? null : error} />
      </form>
    </Dialog>
  );
}
