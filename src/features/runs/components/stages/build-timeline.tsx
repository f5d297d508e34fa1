import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { HEAD_WORK_LABELS, PART_CATEGORY_LABELS } from '@shared/parts';
import type { StageDto } from '@shared/schemas/run';
import { WORKSHOP } from '@shared/roles';
import { Button, Card, ConfirmDialog, EmptyState, ErrorState, Icon, LoadingState, useToast } from '@/components/ui';
import { formatDate, formatHp, formatMoney, formatRpm, formatTorque } from '@shared/format';
import { useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { runQueries } from '../../api/runs/run-queries';
import { stageQueries } from '../../api/stages/stage-queries';
import { useDeleteStage } from '../../api/stages/delete-stage';
import { StageFormDialog } from './stage-form-dialog';

function ReferenceRun({ runId }: { runId: string }) {
  const run = useQuery(runQueries.detail(runId));
  if (run.isLoading) return <span className="text-sm text-ink-muted">Loading the reference run…</span>;
  if (!run.data) return null;
  const r = run.data;
  return (
    <p className="num text-sm">
      <span className="text-ink-muted">Reference run: </span>
      <Link to={paths.run(r.id)} className="font-semibold text-accent underline">
        {r.label ?? r.originalName}
      </Link>{' '}
      — {formatHp(r.peakPowerHp)} at {formatRpm(r.peakPowerRpm)}, {formatTorque(r.peakTorqueLbft)} at {formatRpm(r.peakTorqueRpm)}
    </p>
  );
}

function StageItem({ stage, index, canEdit, onEdit, onDelete }: { stage: StageDto; index: number; canEdit: boolean; onEdit: () => void; onDelete: () => void }) {
  const cost = stage.totalCostCents;
  return (
    <li className="relative pl-10">
      <span className="num absolute left-0 top-1 inline-flex size-7 items-center justify-center rounded-full border-2 border-accent bg-paper-raised text-sm font-bold text-ink" aria-hidden="true">
        {index + 1}
      </span>
      <div className="rounded-card border border-line bg-paper-raised p-4">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div>
            <h3 className="text-lg font-semibold text-ink">{stage.name}</h3>
            <p className="num text-sm text-ink-muted">
              {stage.date ? <time dateTime={stage.date}>{formatDate(stage.date)}</time> : 'No date'} · {stage.runCount} {stage.runCount === 1 ? 'run' : 'runs'}
            </p>
          </div>
          <div className="flex flex-wrap items-center gap-2">
            {canEdit && (
              <>
                <Button size="sm" onClick={onEdit} aria-label={`Edit stage ${stage.name}`}>
                  Edit
                </Button>
                <Button size="sm" variant="ghost" onClick={onDelete} aria-label={`Remove stage ${stage.name}`}>
                  Remove
                </Button>
              </>
            )}
          </div>
        </div>
        {stage.description && <p className="mt-2 whitespace-pre-wrap text-ink">{stage.description}</p>}
        {stage.referenceRunId ? <div className="mt-2"><ReferenceRun runId={stage.referenceRunId} /></div> : <p className="mt-2 text-sm text-ink-subtle">No reference run chosen yet (choose one on a session page).</p>}
        {stage.parts.length === 0 && <p className="mt-2 text-sm text-ink-muted">No parts or work recorded for this stage.</p>}
        {stage.parts.length > 0 && (
          <div className="mt-3 overflow-x-auto" role="region" aria-label={`Parts of ${stage.name}`} tabIndex={0}>
            <table className="min-w-full text-sm">
              <caption className="sr-only">Parts of {stage.name}</caption>
              <thead>
                <tr className="border-b border-line text-left text-ink-muted">
                  <th scope="col" className="py-1 pr-3 font-semibold">Category</th>
                  <th scope="col" className="py-1 pr-3 font-semibold">Part or job</th>
                  <th scope="col" className="py-1 pr-3 text-right font-semibold">Part</th>
                  <th scope="col" className="py-1 text-right font-semibold">Labour</th>
                </tr>
              </thead>
              <tbody>
                {stage.parts.map((p) => (
                  <tr key={p.id} className="border-b border-line">
                    <td className="py-1 pr-3">{PART_CATEGORY_LABELS[p.category]}</td>
                    <td className="py-1 pr-3">
                      {p.description}
                      {p.headWorkLevel && <span className="text-ink-muted"> ({HEAD_WORK_LABELS[p.headWorkLevel]})</span>}
                    </td>
                    <td className="num py-1 pr-3 text-right">{formatMoney(p.partCostCents, { minorUnits: true })}</td>
                    <td className="num py-1 text-right">{formatMoney(p.labourCostCents, { minorUnits: true })}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                <tr>
                  <th scope="row" colSpan={3} className="py-1 pr-3 text-right font-semibold">
                    Stage total
                  </th>
                  <td className="num py-1 text-right font-semibold">{formatMoney(cost, { minorUnits: true })}</td>
                </tr>
              </tfoot>
            </table>
          </div>
        )}
      </div>
    </li>
  );
}

/**
 * "Stages and parts": a bike's build as its stages in order, the parts and work of each with
 * their costs, the stage total and the reference run. Gains and cost per hp are not shown here;
 * the comparisons feature computes them like for like.
 */
export function BikeBuildTimeline({ bikeId }: { bikeId: string }) {
  const user = useCurrentUser();
  const toast = useToast();
  const canEdit = WORKSHOP.includes(user.role);
  const stages = useQuery(stageQueries.list(bikeId));
  const [editing, setEditing] = useState<StageDto | null>(null);
  const [formOpen, setFormOpen] = useState(false);
  const [removing, setRemoving] = useState<StageDto | null>(null);
  const del = useDeleteStage();
  const total = (stages.data ?? []).reduce((sum, s) => sum + s.totalCostCents, 0);

  return (
    <Card
      title="Stages and parts"
      description={stages.data?.length ? `${stages.data.length} stages · ${formatMoney(total, { minorUnits: true })} in parts and labour` : 'The stages of work on this bike.'}
      actions={
        canEdit && (
          <Button
            size="sm"
            variant="primary"
            icon={<Icon name="plus" size={16} />}
            onClick={() => {
              setEditing(null);
              setFormOpen(true);
            }}
          >
            Add stage
          </Button>
        )
      }
    >
      {stages.isLoading ? (
        <LoadingState compact message="Loading the build…" />
      ) : stages.isError ? (
        <ErrorState error={stages.error} onRetry={() => stages.refetch()} />
      ) : !stages.data?.length ? (
        <EmptyState title="No stages yet" message="Start with a baseline: the bike as it came in. Then add a stage for each round of work." />
      ) : (
        <ol className="relative space-y-4 before:absolute before:bottom-2 before:left-3.5 before:top-2 before:w-0.5 before:bg-line" aria-label="Stages in build order">
          {stages.data.map((s, i) => (
            <StageItem
              key={s.id}
              stage={s}
              index={i}
              canEdit={canEdit}
              onEdit={() => {
                setEditing(s);
                setFormOpen(true);
              }}
              onDelete={() => setRemoving(s)}
            />
          ))}
        </ol>
      )}
      <StageFormDialog bikeId={bikeId} stage={editing} open={formOpen} onClose={() => setFormOpen(false)} />
      <ConfirmDialog
        open={removing !== null}
        title={`Remove ${removing?.name ?? 'this stage'}?`}
        tone="danger"
        confirmLabel="Remove stage"
        isConfirming={del.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={() =>
          removing &&
          del.mutate(removing.id, {
            onSuccess: () => {
              toast.success(`Removed ${removing.name}`);
              setRemoving(null);
            },
            onError: (e) => toast.error('The stage was not removed', { description: e.message }),
          })
        }
      >
        Its parts go with it. Its runs stay in the archive, without a stage.
      </ConfirmDialog>
    </Card>
  );
}
