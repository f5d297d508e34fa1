import { SAFETY_CHECKS } from '@shared/schemas/run';
import { Caution } from '@/components/ui';

/** The checks before any pull — the same list the session's safety checklist confirms (SAFETY_CHECKS). */
export function DynoCaution() {
  return (
    <Caution title="Before every pull" level={2}>
      <ul>
        {SAFETY_CHECKS.map((c) => (
          <li key={c.id}>{c.label}</li>
        ))}
      </ul>
      <p className="text-sm">Follow the dyno maker’s manual and your local workplace rules; they come first.</p>
    </Caution>
  );
}

export function EngineCaution() {
  return (
    <Caution title="Engine work" level={2}>
      <p>Leaner mixtures and more power raise cylinder-head temperatures. Defer to licensed technicians and the engine maker’s specifications.</p>
    </Caution>
  );
}

/** For riders reading their own numbers. */
export function FiguresNotice() {
  return (
    <Caution title="About dyno figures" kind="notice" level={2}>
      <p>
        Dyno figures depend on the dyno type, the correction standard and the day’s conditions, so compare only like with like. Modifications may affect emissions compliance, noise limits, warranty and
        insurance; on-road use is governed by local law.
      </p>
    </Caution>
  );
}
