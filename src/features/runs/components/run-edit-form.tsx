import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { runUpdateInput, type RunDetailDto } from '@shared/schemas/run';
import { Button, SelectField, TextAreaField, TextField, useToast } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { stageQueries } from '../api/stages/stage-queries';
import { useUpdateRun } from '../api/runs/update-run';

export function parseTags(text: string): string[] {
  return [...new Set(text.split(',').map((t) => t.trim()).filter(Boolean))];
}

/**
 * The API's runUpdateInput in the shape the form holds: the stage as "" for none and the tags as
 * one comma-separated line. The tag rules are the API's; the message names them in plain words.
 */
const runEditSchema = z.object({
  stageId: z.preprocess((v) => (v === '' ? null : v), runUpdateInput.shape.stageId),
  label: runUpdateInput.shape.label,
  tags: z
    .string()
    .transform(parseTags)
    .superRefine((tags, ctx) => {
      if (!runUpdateInput.shape.tags.safeParse(tags).success) ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'Each tag is at most 40 characters, and a run has at most 30 tags' });
    }),
  note: runUpdateInput.shape.note,
});
type RunEditInput = z.input<typeof runEditSchema>;
type RunEditOutput = z.output<typeof runEditSchema>;

/** Stage, label, tags and note of a run. */
export function RunEditForm({ run }: { run: RunDetailDto }) {
  const toast = useToast();
  const stages = useQuery(stageQueries.list(run.bikeId));
  const update = useUpdateRun();
  const form = useForm<RunEditInput, unknown, RunEditOutput>({ resolver: zodResolver(runEditSchema), mode: 'onTouched', defaultValues: { stageId: run.stageId ?? '', label: run.label ?? '', tags: run.tags.join(', '), note: run.note ?? '' } });
  useEffect(() => {
    form.reset({ stageId: run.stageId ?? '', label: run.label ?? '', tags: run.tags.join(', '), note: run.note ?? '' });
  }, [run, form]);
  // The select is uncontrolled: a value set before its option exists shows "No stage". Once the
  // stage list has rendered, give the select its value again (keeping what is typed elsewhere).
  useEffect(() => {
    if (stages.data) form.setValue('stageId', form.getValues('stageId'));
  }, [stages.data, form]);
  // Until the list arrives, the run's own stage is an option, so it shows from the first paint.
  const stageOptions = (stages.data ?? []).map((s) => ({ value: s.id, label: s.name }));
  if (run.stageId && !stageOptions.some((o) => o.value === run.stageId)) stageOptions.unshift({ value: run.stageId, label: run.stageName ?? 'Loading…' });
  const submit = form.handleSubmit(async (v) => {
    try {
      await update.mutateAsync({ id: run.id, ...v });
      toast.success('Run saved');
    } catch (e) {
      if (!applyFieldErrors(e, form.setError)) toast.error('The run was not saved', { description: e instanceof Error ? e.message : undefined });
    }
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Edit run">
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField
          label="Stage"
          placeholder="No stage"
          options={stageOptions}
          {...form.register('stageId')}
          error={form.formState.errors.stageId}
        />
        <TextField label="Label" maxLength={200} {...form.register('label')} error={form.formState.errors.label} hint="e.g. “Pull 3, after fuel trim”" />
      </div>
      <TextField label="Tags" {...form.register('tags')} error={form.formState.errors.tags} hint="Separate with commas, e.g. baseline, hot day" />
      <TextAreaField label="Note" {...form.register('note')} error={form.formState.errors.note} />
      <Button type="submit" variant="primary" loading={update.isPending} disabled={!form.formState.isDirty}>
        Save changes
      </Button>
    </form>
  );
}
