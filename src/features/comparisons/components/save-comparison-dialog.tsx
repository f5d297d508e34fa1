import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { ComparisonDto, ComparisonOptions } from '@shared/schemas/comparison';
import { Button, Dialog, FormError, TextAreaField, TextField, useToast } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { useSaveComparison } from '../api/save-comparison';

/** The name and note fields of a saved comparison (same limits as the server's `comparisonInput`). */
const saveForm = z.object({
  name: z.string().trim().min(1, 'Name is required').max(200, 'At most 200 characters'),
  note: z.string().trim().max(5000, 'At most 5,000 characters').optional(),
});
type SaveForm = z.infer<typeof saveForm>;

export interface SaveComparisonDialogProps {
  open: boolean;
  onClose: () => void;
  defaultName: string;
  runIds: string[];
  baselineRunId: string;
  options: ComparisonOptions;
  onSaved: (c: ComparisonDto) => void;
}

export function SaveComparisonDialog(props: SaveComparisonDialogProps) {
  if (!props.open) return null;
  return <Body {...props} />;
}

function Body({ onClose, defaultName, runIds, baselineRunId, options, onSaved }: SaveComparisonDialogProps) {
  const save = useSaveComparison();
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<SaveForm>({ resolver: zodResolver(saveForm), mode: 'onTouched', defaultValues: { name: defaultName, note: '' } });
  const onSubmit = form.handleSubmit(async (data) => {
    setFormError(null);
    try {
      const saved = await save.mutateAsync({ name: data.name, note: data.note || null, runIds, baselineRunId, options });
      toast.success(`Saved “${saved.name}”`);
      onSaved(saved);
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
    }
  });
  return (
    <Dialog
      open
      onClose={onClose}
      busy={save.isPending}
      title="Save comparison"
      description="Saved comparisons are what gain reports are made from."
      footer={
        <>
          <Button onClick={onClose} disabled={save.isPending}>
            Cancel
          </Button>
          <Button variant="primary" type="submit" form="save-comparison" loading={save.isPending} loadingText="Saving…">
            Save
          </Button>
        </>
      }
    >
      <form id="save-comparison" onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError error={formError} />
        <TextField label="Name" required autoFocus {...form.register('name')} error={form.formState.errors.name} />
        <TextAreaField label="Note" hint="Optional; shown with the comparison." rows={3} {...form.register('note')} error={form.formState.errors.note} />
      </form>
    </Dialog>
  );
}
