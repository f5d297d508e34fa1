import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { nextStageName } from '@shared/labels';
import { Button, Icon, SelectField, TextField, useToast } from '@/components/ui';
import { stageQueries } from '../../api/stages/stage-queries';
import { useCreateStage } from '../../api/stages/create-stage';

/**
 * The stage the dropped files are tagged with, and a new stage made right here ("Baseline",
 * "Stage 1 — exhaust + tune") without leaving for the bike page: one click adds the suggested
 * name, or "Other name…" takes a typed one. Parts and costs can be added on the bike page later.
 */
export function UploadStageField({ bikeId, value, onChange, disabled }: { bikeId: string; value: string; onChange: (stageId: string) => void; disabled?: boolean }) {
  const stages = useQuery(stageQueries.list(bikeId));
  const create = useCreateStage();
  const toast = useToast();
  const [typing, setTyping] = useState(false);
  const [name, setName] = useState('');
  const suggestion = nextStageName((stages.data ?? []).map((s) => s.name));

  const add = async (stageName: string) => {
    const trimmed = stageName.trim();
    if (!trimmed) return;
    try {
      const stage = await create.mutateAsync({ bikeId, name: trimmed, parts: [] });
      onChange(stage.id);
      setTyping(false);
      setName('');
      toast.success(`Added ${stage.name}`, { description: 'The next files are tagged with it.' });
    } catch (e) {
      toast.error('The stage was not added', { description: e instanceof Error ? e.message : undefined });
    }
  };

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end gap-2">
        <SelectField
          label="Stage for these files"
          hint="Tags every file of the batch; you can change each file's stage afterwards."
          placeholder={stages.isLoading ? 'Loading stages…' : 'No stage yet'}
          value={value}
          onChange={(e) => onChange(e.target.value)}
          options={(stages.data ?? []).map((x) => ({ value: x.id, label: x.name }))}
          disabled={disabled}
          containerClassName="min-w-60 max-w-sm flex-1"
        />
        {!typing && (
          <>
            <Button icon={<Icon name="plus" size={16} />} disabled={disabled || stages.isLoading} loading={create.isPending} onClick={() => add(suggestion)}>
              Add “{suggestion}”
            </Button>
            <Button variant="ghost" disabled={disabled} onClick={() => setTyping(true)}>
              Other name…
            </Button>
          </>
        )}
      </div>
      {typing && (
        <form
          className="flex flex-wrap items-end gap-2"
          aria-label="New stage"
          onSubmit={(e) => {
            e.preventDefault();
            void add(name);
          }}
        >
          <TextField label="New stage name" value={name} onChange={(e) => setName(e.target.value)} placeholder={`e.g. ${suggestion} — exhaust + tune`} maxLength={120} autoFocus containerClassName="min-w-60 max-w-sm flex-1" />
          <Button type="submit" variant="primary" loading={create.isPending} disabled={!name.trim()}>
            Add stage
          </Button>
          <Button variant="ghost" onClick={() => setTyping(false)}>
            Cancel
          </Button>
        </form>
      )}
    </div>
  );
}
