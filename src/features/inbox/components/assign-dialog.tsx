import { useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { InboxItemDto } from '@shared/schemas/bay';
import { bikeLabel } from '@shared/labels';
import { formatDateTime } from '@shared/format';
import { Button, Dialog, FormError, SearchInput, SelectField, useDebouncedValue, useToast } from '@/components/ui';
import { inboxQueries, useAssignInboxItem } from '../api/inbox-queries';

/** Assign a waiting file to a bike, and optionally one of its sessions and stages. Nothing is guessed: every choice is the user's. */
export function AssignDialog({ item, onClose }: { item: InboxItemDto | null; onClose: () => void }) {
  const [q, setQ] = useState('');
  const [bikeId, setBikeId] = useState('');
  const [sessionId, setSessionId] = useState('');
  const [stageId, setStageId] = useState('');
  const debounced = useDebouncedValue(q, 250);
  const open = item !== null;
  const bikes = useQuery({ ...inboxQueries.bikes(debounced), enabled: open });
  const sessions = useQuery({ ...inboxQueries.sessions(bikeId), enabled: open && !!bikeId });
  const stages = useQuery({ ...inboxQueries.stages(bikeId), enabled: open && !!bikeId });
  const assign = useAssignInboxItem();
  const toast = useToast();

  const close = () => {
    setQ('');
    setBikeId('');
    setSessionId('');
    setStageId('');
    assign.reset();
    onClose();
  };
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!item || !bikeId) return;
    assign.mutate(
      { id: item.id, bikeId, sessionId: sessionId || undefined, stageId: stageId || undefined },
      {
        onSuccess: ({ results }) => {
          const r = results[0];
          if (r && !r.ok && !r.runId) {
            toast.error(`${item.originalName} was not assigned`, { description: r.error.message });
            return;
          }
          const runs = r?.runs?.length ?? 1;
          toast.success(r && r.ok && r.duplicate ? `${item.originalName}: already in the archive for that bike; nothing new was saved` : `${item.originalName}: ${runs} run${runs === 1 ? '' : 's'} added`);
          close();
        },
      },
    );
  };

  return (
    <Dialog open={open} onClose={close} title={`Assign ${item?.originalName ?? ''}`} description="Choose the bike this file was pulled on; its session and stage if you know them." size="lg" busy={assign.isPending}>
      <form onSubmit={submit} className="space-y-4">
        <SearchInput label="Find the bike" showLabel value={q} onValueChange={setQ} placeholder="Make, model, VIN or customer" />
        <SelectField
          label="Bike"
          required
          placeholder={bikes.isPending ? 'Loading bikes…' : 'Choose the bike…'}
          value={bikeId}
          onChange={(e) => {
            setBikeId(e.target.value);
            setSessionId('');
            setStageId('');
          }}
          options={(bikes.data ?? []).map((b) => ({ value: b.id, label: `${bikeLabel(b)} · ${b.customerName}` }))}
        />
        <SelectField
          label="Session"
          hint="Leave empty to keep the run without a session."
          placeholder="No session"
          value={sessionId}
          disabled={!bikeId}
          onChange={(e) => setSessionId(e.target.value)}
          options={(sessions.data ?? []).map((s) => ({ value: s.id, label: `${formatDateTime(s.startedAt)}${s.dynoName ? ` · ${s.dynoName}` : ''} · ${s.runCount} run${s.runCount === 1 ? '' : 's'}` }))}
        />
        <SelectField label="Stage" placeholder="No stage" value={stageId} disabled={!bikeId} onChange={(e) => setStageId(e.target.value)} options={(stages.data ?? []).map((s) => ({ value: s.id, label: s.name }))} />
        {assign.isError && <FormError error={assign.error} title="The file was not assigned" />}
        <div className="flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" disabled={!bikeId} loading={assign.isPending} loadingText="Assigning…">
            Assign
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
