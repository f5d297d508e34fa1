import { useEffect, useState } from 'react';
import type { PasswordJudgement } from '@shared/password-policy';
import { METER_SEGMENTS, meterView, type MeterTone } from './password-meter-model';

type Policy = typeof import('@shared/password-policy');
let policyLoad: Promise<Policy> | undefined;
/** The policy and its ~1 MB of dictionaries, loaded on first use only (never in the first-load bundle). */
const loadPolicy = () => (policyLoad ??= import('@shared/password-policy'));

/** The policy's judgement of `password`, once the policy has loaded (null before, or when empty). */
function usePasswordJudgement(password: string, userInputs: string[]): PasswordJudgement | null {
  const [judgement, setJudgement] = useState<{ password: string; result: PasswordJudgement } | null>(null);
  const inputsKey = userInputs.join('\n');
  useEffect(() => {
    if (!password) return;
    let live = true;
    loadPolicy().then(
      ({ judgePassword }) => {
        if (live) setJudgement({ password, result: judgePassword(password, inputsKey ? inputsKey.split('\n') : []) });
      },
      () => undefined, // The server judges again on submit; a meter that did not load shows nothing.
    );
    return () => {
      live = false;
    };
  }, [password, inputsKey]);
  return judgement && judgement.password === password ? judgement.result : null;
}

const TONE_BAR: Record<MeterTone, string> = { loss: 'bg-loss', warn: 'bg-warn', gain: 'bg-gain' };
const TONE_TEXT: Record<MeterTone, string> = { loss: 'text-loss', warn: 'text-warn', gain: 'text-gain' };

/** A small strength meter under a new-password field: the score in words, a bar, and the policy's advice. */
export function PasswordMeter({ password, userInputs = [] }: { password: string; userInputs?: string[] }) {
  const view = meterView(password, usePasswordJudgement(password, userInputs));
  return (
    <div aria-live="polite" className="min-h-5 text-sm" data-testid="password-meter">
      {view && (
        <div className="space-y-1">
          <div className="flex gap-1" aria-hidden="true">
            {Array.from({ length: METER_SEGMENTS }, (_, i) => (
              <span key={i} className={`h-1.5 flex-1 rounded-full ${i < view.filled ? TONE_BAR[view.tone] : 'bg-line'}`} />
            ))}
          </div>
          <p className={`font-medium ${TONE_TEXT[view.tone]}`}>{view.label}</p>
          {view.message && <p className="text-ink-muted">{view.message}</p>}
        </div>
      )}
    </div>
  );
}
