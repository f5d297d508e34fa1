import type { PlanStatus } from '@shared/schemas/plans';
import { StatusBadge, type Status } from '@/components/ui';

const LOOK: Record<PlanStatus, { status: Status; label: string }> = {
  draft: { status: 'neutral', label: 'Draft' },
  sent: { status: 'pending', label: 'Sent, awaiting answer' },
  accepted: { status: 'ok', label: 'Accepted' },
  declined: { status: 'error', label: 'Declined' },
  expired: { status: 'warning', label: 'Expired' },
  converted: { status: 'info', label: 'Work done (stage added)' },
};

/** A plan's status in words, with its own shape and colour. */
export function PlanStatusBadge({ status }: { status: PlanStatus }) {
  return <StatusBadge status={LOOK[status].status}>{LOOK[status].label}</StatusBadge>;
}

export const planStatusLabel = (status: PlanStatus) => LOOK[status].label;
