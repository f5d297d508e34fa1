import type { RunStatusId, RunSummaryDto } from '@shared/schemas/run';
import { StatusBadge } from '@/components/ui';

export const RUN_STATUS_LABELS: Record<RunStatusId, string> = {
  ready: 'Ready',
  'needs-mapping': 'Needs column mapping',
  failed: 'Could not be read',
};

export function RunStatusBadge({ status, deleted }: { status: RunStatusId; deleted?: boolean }) {
  if (deleted) return <StatusBadge status="neutral">Deleted</StatusBadge>;
  if (status === 'ready') return <StatusBadge status="ok">{RUN_STATUS_LABELS.ready}</StatusBadge>;
  if (status === 'needs-mapping') return <StatusBadge status="warning">{RUN_STATUS_LABELS['needs-mapping']}</StatusBadge>;
  return <StatusBadge status="error">{RUN_STATUS_LABELS.failed}</StatusBadge>;
}

/** Power against torque × rpm: did the file's two columns agree? */
export function CrossCheckBadge({ status }: { status: RunSummaryDto['identityStatus'] }) {
  if (status === 'ok') return <StatusBadge status="ok">Power and torque agree</StatusBadge>;
  if (status === 'derived') return <StatusBadge status="info">One column derived from the other</StatusBadge>;
  if (status === 'mismatch') return <StatusBadge status="warning">Power and torque disagree</StatusBadge>;
  return <StatusBadge status="neutral">Not cross-checked</StatusBadge>;
}

/**
 * What a run's engine warnings mean for trusting it, as badges: one pull of a log holding several,
 * a partial pull, engine speed from road speed, and a run marked for review (too many glitches).
 */
export function RunFlags({ run }: { run: Pick<RunSummaryDto, 'pullIndex' | 'pullCount' | 'review' | 'warnings'> }) {
  const has = (code: string) => run.warnings.some((w) => w.code === code);
  return (
    <>
      {run.review && <StatusBadge status="error">Marked for review</StatusBadge>}
      {run.pullCount > 1 && (
        <StatusBadge status="neutral">
          Pull {run.pullIndex + 1} of {run.pullCount}
        </StatusBadge>
      )}
      {has('PULL_PARTIAL') && <StatusBadge status="warning">Partial pull</StatusBadge>}
      {has('RPM_FROM_SPEED') && <StatusBadge status="info">rpm from road speed</StatusBadge>}
    </>
  );
}
