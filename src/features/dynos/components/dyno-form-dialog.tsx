import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { dynoInput, type DynoDto } from '@shared/schemas/run';
import { Button, Dialog, FormError, SelectField, TextAreaField, TextField, useToast } from '@/components/ui';
import { ApiError, applyFieldErrors } from '@/lib/api-client';
import { DYNO_KIND_LABELS } from '../api/dyno-queries';
import { useSaveDyno, type DynoInput } from '../api/save-dyno';

const KIND_OPTIONS = (Object.keys(DYNO_KIND_LABELS) as DynoDto['kind'][]).map((k) => ({ value: k, label: DYNO_KIND_LABELS[k] }));

export function DynoFormDialog({ open, dyno, onClose }: { open: boolean; dyno: DynoDto | null; onClose: () => void }) {
  const toast = useToast();
  const save = useSaveDyno();
  const form = useForm<DynoInput>({ resolver: zodResolver(dynoInput), defaultValues: { name: '', kind: 'inertia', notes: '' } });
  useEffect(() => {
    if (open) form.reset({ name: dyno?.name ?? '', kind: dyno?.kind ?? 'inertia', notes: dyno?.notes ?? '' });
    save.reset();
    // Reset only when the dialog opens for another dyno.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open, dyno]);

  const submit = form.handleSubmit(async (values) => {
    try {
      await save.mutateAsync({ ...values, id: dyno?.id });
      toast.success(dyno ? `Saved ${values.name}` : `Added ${values.name}`);
      onClose();
    } catch (e) {
      applyFieldErrors(e, form.setError);
    }
  });

  return (
    <Dialog
      open={open}
      onClose={onClose}
      busy={save.isPending}
      title={dyno ? `Edit ${dyno.name}` : 'Add a dyno'}
      description="Runs are only comparable on the same dyno; sessions record which one was used."
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={save.isPending}>
            Cancel
          </Button>
          <Button variant="primary" type="submit" form="dyno-form" loading={save.isPending}>
            {dyno ? 'Save dyno' : 'Add dyno'}
          </Button>
        </>
      }
    >
      <form id="dyno-form" onSubmit={submit} noValidate className="space-y-4">
        <FormError error={save.error instanceof ApiError && save.error.fields.length ? null : save.error} />
        <TextField label="Name" required {...form.register('name')} error={form.formState.errors.name} hint="What the shop calls it, e.g. “Bay 1 roller”." />
        <SelectField label="Kind" options={KIND_OPTIONS} {...form.register('kind')} error={form.formState.errors.kind} />
        <TextAreaField label="Notes" {...form.register('notes')} error={form.formState.errors.notes} hint="Calibration dates, roller size, anything the tuner should know." />
      </form>
    </Dialog>
  );
}
