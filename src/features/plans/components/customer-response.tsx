import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { planAcceptInput, type PlanDto } from '@shared/schemas/plans';
import { Button, Card, FormError, TextAreaField, TextField } from '@/components/ui';
import { useAcceptPlan, useDeclinePlan, useStartDeposit } from '../api/plan-actions';
import type { PlanTarget } from '../api/plan-queries';
import { money } from './plan-details';

/**
 * The customer's side: accept by typing their name, decline with an optional reason, then pay
 * the deposit on the provider's checkout page. Works the same signed in and from the plan link.
 */
export function CustomerResponse({ plan, target, paidReturn }: { plan: PlanDto; target: PlanTarget; paidReturn?: boolean }) {
  const accept = useAcceptPlan(target);
  const decline = useDeclinePlan(target);
  const deposit = useStartDeposit(target);
  const [declining, setDeclining] = useState(false);
  const [reason, setReason] = useState('');
  const form = useForm<{ name: string }>({ resolver: zodResolver(planAcceptInput), defaultValues: { name: '' } });
  const due = plan.depositCents - plan.depositPaidCents;

  if (plan.status === 'sent') {
    return (
      <Card title="Your answer" description="Accepting records your typed name, the time and this plan’s version with the shop.">
        <form
          noValidate
          className="space-y-3"
          onSubmit={form.handleSubmit(async (v) => {
            await accept.mutateAsync(v).catch(() => undefined);
          })}
        >
          <FormError error={accept.error?.message ?? null} />
          <TextField label="Type your full name to accept" autoComplete="name" required error={form.formState.errors.name} {...form.register('name')} />
          <p className="text-sm text-ink-muted">
            By accepting you ask the shop to do the work listed for {money(plan, plan.totalCostCents)}
            {plan.depositCents ? `, with a deposit of ${money(plan, plan.depositCents)}` : ''}. The expected gain is what similar builds measured in the past, not a promise.
          </p>
          <div className="flex flex-wrap gap-3">
            <Button type="submit" variant="primary" loading={accept.isPending} loadingText="Accepting…">
              Accept the plan
            </Button>
            <Button type="button" variant="ghost" onClick={() => setDeclining((d) => !d)} aria-expanded={declining}>
              Decline…
            </Button>
          </div>
        </form>
        {declining ? (
          <div className="mt-4 space-y-3 border-t border-line pt-4">
            <FormError error={decline.error?.message ?? null} />
            <TextAreaField label="Reason (optional)" rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
            <Button variant="danger" loading={decline.isPending} loadingText="Declining…" onClick={() => decline.mutate({ reason: reason.trim() || undefined })}>
              Decline the plan
            </Button>
          </div>
        ) : null}
      </Card>
    );
  }
  if (plan.status === 'accepted') {
    return (
      <Card title="Accepted" description={`Thank you, ${plan.acceptedName}.`}>
        {due > 0 ? (
          <div className="space-y-3">
            {paidReturn ? <p role="status">Payment received by the payment service; it shows here as soon as the shop is notified.</p> : null}
            <p>
              A deposit of <span className="num font-semibold">{money(plan, due)}</span> secures the parts order.
            </p>
            <FormError error={deposit.error?.message ?? null} />
            <Button variant="primary" loading={deposit.isPending} loadingText="Opening the payment page…" onClick={() => deposit.mutate()}>
              Pay the deposit
            </Button>
          </div>
        ) : plan.depositPaidCents > 0 ? (
          <p role="status">Deposit paid: {money(plan, plan.depositPaidCents)}. The shop will be in touch to book the work.</p>
        ) : (
          <p>The shop will be in touch to book the work.</p>
        )}
      </Card>
    );
  }
  return null;
}
