import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { RunSummaryDto } from '@shared/schemas/run';
import { formatCount, formatDateTime } from '@shared/format';
import { Button, Card, Icon, useToast } from '@/components/ui';
import { paths } from '@/config/paths';
import { useReprocessRun } from '../../api/runs/reprocess-run';
import { latestBatch } from '../../lib/latest-batch';
import { PeakCells, RunGridHeader, RunGridRow, RunNameCell, StatusMark } from '../run-grid';
import { MappingDialog } from '../mapping-dialog';
import { StageSelect } from '../stages/stage-select';
import { CrossCheckBadge } from '../run-status';

function NextStep({ run, canEdit }: { run: RunSummaryDto; canEdit: boolean }) {
  const reprocess = useReprocessRun();
  const toast = useToast();
  const [open, setOpen] = useState(false);
  if (run.status === 'ready') return <CrossCheckBadge status={run.identityStatus} />;
  if (!canEdit) return null;
  if (run.status === 'needs-mapping') {
    return (
      <>
        <Button size="sm" variant="primary" onClick={() => setOpen(true)}>
          Choose columns…
        </Button>
        <MappingDialog runId={run.id} fileName={run.originalName} open={open} onClose={() => setOpen(false)} error={run.error ?? undefined} />
      </>
    );
  }
  return (
    <Button
      size="sm"
      icon={<Icon name="refresh" size={16} />}
      loading={reprocess.isPending}
      aria-label={`Read ${run.originalName} again`}
      onClick={() =>
        reprocess.mutate(run.id, {
          onSuccess: (r) => toast.success(`${run.originalName} was read again`, { description: r.status === 'ready' ? 'It is read now.' : (r.error?.message ?? 'It still cannot be read.') }),
          onError: (e) => toast.error(`${run.originalName} was not read again`, { description: e.message }),
        })
      }
    >
      Read again
    </Button>
  );
}

/**
 * The session's latest upload batch, as the upload screen showed it: after the upload page is
 * left, every file's status (read, needs mapping, not read) is still here with its next step.
 */
export function LatestUpload({ runs, canEdit }: { runs: RunSummaryDto[]; canEdit: boolean }) {
  const batch = latestBatch(runs);
  if (!batch.length) return null;
  const read = batch.filter((r) => r.status === 'ready').length;
  return (
    <Card title="Latest upload" description={`${formatCount(batch.length, 'run')} from the files sent ${formatDateTime(batch[batch.length - 1].createdAt)}: ${read} read, ${batch.length - read} waiting for a step.`} flush>
      <RunGridHeader />
      <ul className="divide-y divide-line" aria-label="Files of the latest upload">
        {batch.map((run) => (
          <RunGridRow
            key={run.id}
            status={<StatusMark status={run.status} />}
            name={<RunNameCell run={run} fileName={run.originalName} />}
            peaks={<PeakCells run={run} />}
            stage={canEdit && run.status === 'ready' ? <StageSelect runId={run.id} bikeId={run.bikeId} stageId={run.stageId} runName={run.originalName} /> : <span className="text-sm">{run.stageName ?? 'No stage'}</span>}
            actions={
              <>
                <NextStep run={run} canEdit={canEdit} />
                {run.status !== 'ready' && (
                  <Link className="text-sm font-semibold text-accent underline" to={paths.run(run.id)}>
                    Open it
                  </Link>
                )}
              </>
            }
            detail={run.status !== 'ready' && run.error ? <p className="text-sm text-ink">{run.error.message}</p> : undefined}
          />
        ))}
      </ul>
    </Card>
  );
}
