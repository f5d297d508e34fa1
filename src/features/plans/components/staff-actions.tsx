import { useState } from 'react';
import type { PlanDto } from '@shared/schemas/plans';
import { Button, ConfirmDialog, FormError, useToast } from '@/components/ui';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { useConvertPlan, useRefundDeposit, useRevisePlan, useSendPlan } from '../api/plan-actions';
import { PlanEditor } from './plan-editor';
import { money } from './plan-details';

/** What staff can do with a plan in its current status: edit, send, reopen, turn into a stage, refund. */
export function StaffPlanActions({ plan }: { plan: PlanDto }) {
  const user = useCurrentUser();
  const toast = useToast();
  const send = useSendPlan(plan.id);
  const revise = useRevisePlan(plan.id);
  const convert = useConvertPlan(plan.id);
  const refund = useRefundDeposit(plan.id);
  const [editing, setEditing] = useState(false);
  const [refunding, setRefunding] = useState(false);
  const refundable = plan.depositPaidCents - plan.depositRefundedCents;
  const error = send.error ?? revise.error ?? convert.error ?? refund.error;
  return (
    <div className="space-y-3">
      <FormError error={error?.message ?? null} />
      <div className="flex flex-wrap gap-2">
        {plan.status === 'draft' && <Button onClick={() => setEditing(true)}>Edit plan</Button>}
        {(plan.status === 'draft' || plan.status === 'sent' || plan.status === 'expired') && (
          <Button
            variant={plan.status === 'draft' ? 'primary' : 'secondary'}
            loading={send.isPending}
            loadingText="Sending…"
            onClick={() => send.mutate({}, { onSuccess: (r) => toast.success(`Plan sent to ${r.to} (version ${r.plan.version})`) })}
          >
            {plan.status === 'draft' ? 'Send to the customer' : 'Send again'}
          </Button>
        )}
        {(plan.status === 'sent' || plan.status === 'declined' || plan.status === 'expired') && (
          <Button loading={revise.isPending} loadingText="Reopening…" onClick={() => revise.mutate()}>
            Reopen as draft
          </Button>
        )}
        {plan.status === 'accepted' && hasRole(user, ['owner', 'tuner']) && (
          <Button variant="primary" loading={convert.isPending} loadingText="Adding the stage…" onClick={() => convert.mutate({}, { onSuccess: () => toast.success('Stage added to the bike') })}>
            Work done: add as stage
          </Button>
        )}
        {refundable > 0 && plan.status !== 'converted' && hasRole(user, ['owner', 'desk']) && (
          <Button variant="danger" onClick={() => setRefunding(true)}>
            Refund deposit
          </Button>
        )}
      </div>
      <PlanEditor open={editing} onClose={() => setEditing(false)} bikeId={plan.bikeId} plan={plan} />
      <ConfirmDialog
        open={refunding}
        onCancel={() => setRefunding(false)}
        title="Refund the deposit?"
        tone="danger"
        confirmLabel={`Refund ${money(plan, refundable)}`}
        isConfirming={refund.isPending}
        onConfirm={() => refund.mutate({}, { onSettled: () => setRefunding(false), onSuccess: () => toast.success('Deposit refunded') })}
      >
        {`${money(plan, refundable)} goes back to the customer through the payment service, and the plan is marked declined.`}
      </ConfirmDialog>
    </div>
  );
}
