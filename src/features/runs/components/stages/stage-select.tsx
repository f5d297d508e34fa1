import { useQuery } from '@tanstack/react-query';
import { SelectField, useToast } from '@/components/ui';
import { stageQueries } from '../../api/stages/stage-queries';
import { useUpdateRun } from '../../api/runs/update-run';

/** Tag one run with a stage of its bike, saved as soon as it changes. */
export function StageSelect({ runId, bikeId, stageId, runName, onChanged, disabled }: { runId: string; bikeId: string; stageId: string | null; runName: string; onChanged?: (stageId: string | null, stageName: string | null) => void; disabled?: boolean }) {
  const stages = useQuery(stageQueries.list(bikeId));
  const update = useUpdateRun();
  const toast = useToast();
  return (
    <SelectField
      label={`Stage of ${runName}`}
      hideLabel
      containerClassName="min-w-40"
      className="min-h-10 py-1.5 text-sm"
      value={stageId ?? ''}
      disabled={disabled || update.isPending || stages.isLoading}
      placeholder={stages.isLoading ? 'Loading stages…' : 'No stage'}
      options={(stages.data ?? []).map((s) => ({ value: s.id, label: s.name }))}
      onChange={(e) => {
        const next = e.target.value || null;
        update.mutate(
          { id: runId, stageId: next },
          {
            onSuccess: () => {
              const name = stages.data?.find((s) => s.id === next)?.name ?? null;
              onChanged?.(next, name);
              toast.success(next ? `Tagged ${runName} as ${name}` : `Removed the stage from ${runName}`);
            },
            onError: (err) => toast.error(`${runName} was not tagged`, { description: err.message }),
          },
        );
      }}
    />
  );
}
