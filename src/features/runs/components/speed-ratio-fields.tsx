import { rpmPerSpeedInput, type RpmPerSpeedDto } from '@shared/schemas/run';
import { CheckboxField, NumberField, SelectField } from '@/components/ui';

/** The engine-speed ratio as typed: used or not, the figure as text, and its unit. */
export interface SpeedRatioChoice {
  use: boolean;
  ratio: string;
  unit: RpmPerSpeedDto['unit'];
}

export const NO_SPEED_RATIO: SpeedRatioChoice = { use: false, ratio: '', unit: 'mph' };

/** The ratio to send, or the first thing to fix. */
export function checkSpeedRatio(choice: SpeedRatioChoice): { rpmPerSpeed: RpmPerSpeedDto | null; problem: string | null } {
  const parsed = rpmPerSpeedInput.safeParse({ ratio: choice.ratio.trim() === '' ? undefined : Number(choice.ratio), unit: choice.unit });
  if (!parsed.success) return { rpmPerSpeed: null, problem: parsed.error.issues[0]?.message ?? 'Give the engine-speed ratio.' };
  return { rpmPerSpeed: parsed.data, problem: null };
}

/**
 * For a log with a road/roller speed column but no engine speed: compute engine speed from it with
 * the ratio of the gear the pull was made in (rpm per mph or per km/h), so the curve is plotted
 * against engine speed.
 */
export function SpeedRatioFields({ speedColumn, hint, value, onChange }: { speedColumn: string; hint?: string; value: SpeedRatioChoice; onChange: (next: SpeedRatioChoice) => void }) {
  return (
    <section className="space-y-2 rounded-card border border-line p-3" aria-label="Engine speed from road speed">
      <CheckboxField label={`Compute engine speed from “${speedColumn}”`} checked={value.use} onChange={(e) => onChange({ ...value, use: e.target.checked })} />
      {value.use && (
        <div className="grid gap-2 md:grid-cols-[12rem_10rem] md:items-end">
          <NumberField label="Engine-speed ratio" required min={0} value={value.ratio} onChange={(e) => onChange({ ...value, ratio: e.target.value })} unit="rpm" />
          <SelectField
            label="per"
            options={[
              { value: 'mph', label: 'mph' },
              { value: 'km/h', label: 'km/h' },
            ]}
            value={value.unit}
            onChange={(e) => onChange({ ...value, unit: e.target.value as SpeedRatioChoice['unit'] })}
          />
        </div>
      )}
      <p className="text-sm text-ink-muted">
        {hint ?? 'Engine speed = road speed × ratio, for the gear used.'} The ratio is only right for the gear it belongs to; the run says it was computed this way.
      </p>
    </section>
  );
}
