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
