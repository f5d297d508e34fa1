import { useState } from 'react';
import { SAFETY_CHECKS, type SessionDto } from '@shared/schemas/run';
import { Button, Caution, CheckboxField, FormError, StatusBadge, useToast } from '@/components/ui';
import { formatDateTime } from '@shared/format';
import { useConfirmSafety } from '../../api/sessions/confirm-safety';

/** The dyno-operation cautions every session shows (PRODUCT.md). */
export function DynoCaution() {
  return (
    <Caution title="Before anyone pulls on the dyno">
      <ul>
        <li>Restraints and wheel chocks checked; cooling fan running; exhaust extraction on.</li>
        <li>Hearing protection for everyone in the bay; nobody in line with the roller or the rear wheel.</li>
        <li>Fire extinguisher at hand.</li>
      </ul>
      <p>Follow the dyno maker's manual and your local workplace rules; they come before anything on this screen.</p>
    </Caution>
  );
}

/**
 * The checklist confirmed before a session's first pull. Once confirmed it shows who did it and
 * when; the server refuses a partial list.
 */
export function SafetyChecklist({ session, canConfirm }: { session: SessionDto; canConfirm: boolean }) {
  const toast = useToast();
  const confirm = useConfirmSafety();
  const [ticked, setTicked] = useState<Set<string>>(new Set());
  if (session.safetyConfirmedAt) {
    return (
      <div className="flex flex-wrap items-center gap-2">
        <StatusBadge status="ok">Safety checks confirmed</StatusBadge>
        <span className="num text-sm text-ink-muted">
          by {session.safetyConfirmedByName ?? 'a user'}, {formatDateTime(session.safetyConfirmedAt)}
        </span>
      </div>
    );
  }
  const all = SAFETY_CHECKS.every((c) => ticked.has(c.id));
  return (
    <div className="space-y-3">
      <DynoCaution />
      <fieldset disabled={!canConfirm || confirm.isPending}>
        <legend className="font-semibold text-ink">Safety checks for this session</legend>
        <p className="text-sm text-ink-muted">Tick each one when it is done. Uploads open once every box is ticked and confirmed.</p>
        <div className="mt-1 grid gap-x-6 md:grid-cols-2">
          {SAFETY_CHECKS.map((c) => (
            <CheckboxField
              key={c.id}
              label={c.label}
              checked={ticked.has(c.id)}
              onChange={(e) => {
                const next = new Set(ticked);
                if (e.target.checked) next.add(c.id);
                else next.delete(c.id);
                setTicked(next);
              }}
            />
          ))}
        </div>
      </fieldset>
      <FormError error={confirm.error} title="The checks were not recorded" />
      {canConfirm ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button
            variant="primary"
            disabled={!all}
            loading={confirm.isPending}
            onClick={() =>
              confirm.mutate(
                { sessionId: session.id, checks: [...ticked] },
                { onSuccess: () => toast.success('Safety checks recorded for this session') },
              )
            }
          >
            Confirm safety checks
          </Button>
          {!all && (
            <span className="num text-sm text-ink-muted">
              {SAFETY_CHECKS.filter((c) => ticked.has(c.id)).length} of {SAFETY_CHECKS.length} ticked
            </span>
          )}
        </div>
      ) : (
        <p className="text-sm text-ink-muted">The tuner or the owner confirms these in the bay.</p>
      )}
    </div>
  );
}
