import { useCallback, useMemo, useRef, useState, type ReactNode } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { formatCount } from '@shared/format';
import { Button, ProgressBar, SelectField, useBottomBar, useToast } from '@/components/ui';
import { invalidateKeys } from '@/lib/invalidate';
import { stageQueries } from '../api/stages/stage-queries';
import { tagRuns, tagRunsInvalidates } from '../api/runs/tag-runs';
import { setReferenceRunMutation } from '../api/stages/set-reference-run';
import { runViews } from '../api/run-views';

/** A run as the selection needs it. */
export interface SelectableRun {
  id: string;
  stageId: string | null;
  /** How the run is named in messages (its file). */
  name: string;
}

/** Runs ticked for a bulk change, and the box that ticks them all. */
export interface RunSelection {
  selected: ReadonlySet<string>;
  toggle: (id: string, on: boolean) => void;
  selectAll?: ReactNode;
}

/** Selection over a list of selectable runs; ids no longer offered drop out by themselves. */
export function useRunSelection(runs: SelectableRun[]) {
  const [picked, setPicked] = useState<ReadonlySet<string>>(new Set());
  const offered = useMemo(() => new Map(runs.map((r) => [r.id, r])), [runs]);
  const selected = useMemo(() => new Set([...picked].filter((id) => offered.has(id))), [picked, offered]);
  const toggle = useCallback((id: string, on: boolean) => {
    setPicked((prev) => {
      const next = new Set(prev);
      if (on) next.add(id);
      else next.delete(id);
      return next;
    });
  }, []);
  const all = runs.length > 0 && selected.size === runs.length;
  const selectAll = runs.length ? (
    <label className="flex size-11 cursor-pointer items-center justify-center rounded-control hover:bg-paper-sunk">
      <input type="checkbox" className="size-5 accent-accent" aria-label="Select every read run" checked={all} onChange={(e) => setPicked(e.target.checked ? new Set(offered.keys()) : new Set())} />
    </label>
  ) : undefined;
  const clear = useCallback(() => setPicked(new Set()), []);
  return { selected, toggle, selectAll, clear, runs: [...selected].map((id) => offered.get(id)!) };
}

/** Runs per request of a bulk change: small enough for the progress bar to move. */
const CHUNK = 10;

/**
 * The bar for the ticked runs, fixed to the bottom of the screen: set their stage in one go, or
 * make the one ticked run its stage's reference. One summary toast at the end, a progress bar
 * while it works; toasts sit above the bar (useBottomBar), never over it.
 */
interface BulkActionBarProps {
  bikeId: string;
  selection: ReturnType<typeof useRunSelection>;
  /** Told which runs took which stage, for lists held outside the query cache (the upload results). */
  onStageSet?: (runIds: string[], stageId: string | null, stageName: string | null) => void;
}

export function BulkActionBar(props: BulkActionBarProps) {
  return props.selection.runs.length ? <Bar {...props} /> : null;
}

function Bar({ bikeId, selection, onStageSet }: BulkActionBarProps) {
  const qc = useQueryClient();
  const toast = useToast();
  const stages = useQuery(stageQueries.list(bikeId));
  const bar = useRef<HTMLDivElement>(null);
  const [stageId, setStageId] = useState('');
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const [busyRef, setBusyRef] = useState(false);
  const runs = selection.runs;
  useBottomBar(bar);

  const stageName = (id: string | null) => stages.data?.find((s) => s.id === id)?.name;
  const applyStage = async (target: string) => {
    const list = [...runs];
    const next = target || null;
    let done = 0;
    const failed: string[] = [];
    const tagged: string[] = [];
    setProgress({ done, total: list.length });
    // In chunks, one after the other: the bar shows real progress and each chunk lands whole.
    for (let i = 0; i < list.length; i += CHUNK) {
      const chunk = list.slice(i, i + CHUNK);
      try {
        await tagRuns(
          chunk.map((r) => r.id),
          next,
        );
        tagged.push(...chunk.map((r) => r.id));
      } catch {
        failed.push(...chunk.map((r) => r.name));
      }
      done += chunk.length;
      setProgress({ done, total: list.length });
    }
    if (tagged.length) onStageSet?.(tagged, next, stageName(next) ?? null);
    await invalidateKeys(qc, tagRunsInvalidates());
    setProgress(null);
    setStageId('');
    const ok = list.length - failed.length;
    const what = next ? `as ${stageName(next)}` : 'without a stage';
    if (failed.length) toast.error(`Tagged ${formatCount(ok, 'run')} ${what}; ${formatCount(failed.length, 'run')} not changed`, { description: failed.join(', ') });
    else toast.success(`Tagged ${formatCount(ok, 'run')} ${what}`);
    selection.clear();
  };

  const single = runs.length === 1 ? runs[0] : null;
  const makeReference = async () => {
    if (!single?.stageId) return;
    setBusyRef(true);
    try {
      await setReferenceRunMutation(qc).mutationFn({ stageId: single.stageId, runId: single.id });
      await invalidateKeys(qc, runViews());
      toast.success(`${single.name} now represents ${stageName(single.stageId) ?? 'its stage'}`);
      selection.clear();
    } catch (e) {
      toast.error('The reference run was not changed', { description: e instanceof Error ? e.message : undefined });
    } finally {
      setBusyRef(false);
    }
  };

  return (
    <div ref={bar} role="region" aria-label="Selected runs" className="fixed inset-x-0 bottom-0 z-40 border-t border-line bg-paper-raised shadow-overlay">
      <div className="mx-auto flex max-w-page flex-wrap items-end gap-3 px-4 py-3">
        <p className="num min-h-11 self-center font-semibold text-ink" aria-live="polite">
          {formatCount(runs.length, 'run')} selected
        </p>
        {progress ? (
          <ProgressBar className="max-w-md flex-1" label="Tagging the selected runs" value={progress.done} max={progress.total} valueText={`${progress.done} of ${progress.total}`} />
        ) : (
          <>
            <SelectField
              label="Set their stage"
              placeholder="Choose a stage…"
              value={stageId}
              options={(stages.data ?? []).map((s) => ({ value: s.id, label: s.name }))}
              onChange={(e) => {
                setStageId(e.target.value);
                if (e.target.value) void applyStage(e.target.value);
              }}
              containerClassName="min-w-56"
            />
            <Button disabled={!single?.stageId} loading={busyRef} onClick={makeReference} title={single ? (single.stageId ? undefined : 'Tag the run with a stage first') : 'Select one run'}>
              Make reference
            </Button>
            <Button variant="ghost" onClick={selection.clear}>
              Clear selection
            </Button>
          </>
        )}
      </div>
    </div>
  );
}
