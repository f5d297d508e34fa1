import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import type { RunDetailDto } from '@shared/schemas/run';
import { Button, SelectField, TextAreaField, TextField, useToast } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { stageQueries } from '../api/stage-queries';
import { useUpdateRun } from '../api/update-run';

interface Values {
  stageId: string;
  label: string;
  tags: string;
  note: string;
}

export function parseTags(text: string): string[] {
  return [...new Set(text.split(',').map((t) => t.trim()).filter(Boolean))];
}

/** Stage, label, tags and note of a run. */
export function RunEditForm({ run }: { run: RunDetailDto }) {
  const toast = useToast();
  const stages = useQuery(stageQueries.list(run.bikeId));
  const update = useUpdateRun();
  const form = useForm<Values>({ defaultValues: { stageId: run.stageId ?? '', label: run.label ?? '', tags: run.tags.join(', '), note: run.note ?? '' } });
  useEffect(() => {
    form.reset({ stageId: run.stageId ?? '', label: run.label ?? '', tags: run.tags.join(', '), note: run.note ?? '' });
  }, [run, form]);
  const submit = form.handleSubmit(async (v) => {
    const tags = parseTags(v.tags);
    if (tags.some((t) => t.length > 40)) {
      form.setError('tags', { message: 'Each tag is at most 40 characters' });
      return;
    }
    try {
      await update.mutateAsync({ id: run.id, stageId: v.stageId || null, label: v.label, tags, note: v.note });
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
          options={(stages.data ?? []).map((s) => ({ value: s.id, label: s.name }))}
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
