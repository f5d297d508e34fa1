import { useEffect, useState } from 'react';
import type { z } from 'zod';
import { useQuery } from '@tanstack/react-query';
import type { RunSummaryDto } from '@shared/schemas/run';
import { columnMappingInput } from '@shared/schemas/run';
import { DialogActions, CheckboxField, cn, Dialog, ErrorState, FormError, LoadingState, SelectField, TextField } from '@/components/ui';
import type { ApiErrorCodeOnClient } from '@/lib/api-client';
import { runQueries } from '../api/runs/run-queries';
import { useApplyMapping, type ApplyMapping } from '../api/runs/apply-mapping';
import { checkSpeedRatio, NO_SPEED_RATIO, SpeedRatioFields, type SpeedRatioChoice } from './speed-ratio-fields';

const TORQUE_UNITS = [
  { value: 'lbft', label: 'lb·ft' },
  { value: 'nm', label: 'N·m' },
  { value: 'kgfm', label: 'kgf·m' },
];
const POWER_UNITS = [
  { value: 'hp', label: 'hp' },
  { value: 'kw', label: 'kW' },
  { value: 'ps', label: 'PS (metric)' },
];
const PREVIEW_ROWS = 8;

interface Choice {
  rpm: string;
  torque: string;
  torqueUnit: string;
  power: string;
  powerUnit: string;
  save: boolean;
  layoutName: string;
}

/** The mapping the choice describes, or the first thing to fix. */
function check(choice: Choice): { mapping: z.output<typeof columnMappingInput> | null; problem: string | null } {
  const parsed = columnMappingInput.safeParse({
    rpm: choice.rpm,
    torque: choice.torque ? { column: choice.torque, unit: choice.torqueUnit } : undefined,
    power: choice.power ? { column: choice.power, unit: choice.powerUnit } : undefined,
  });
  if (!parsed.success) return { mapping: null, problem: parsed.error.issues[0]?.message ?? 'Choose the engine-speed column and a torque or power column.' };
  const used = [choice.rpm, choice.torque, choice.power].filter(Boolean);
  if (new Set(used).size !== used.length) return { mapping: null, problem: 'Each column can be used once: engine speed, torque and power need different columns.' };
  if (choice.save && !choice.layoutName.trim()) return { mapping: null, problem: 'Give the layout a name, or untick “Save this layout”.' };
  return { mapping: parsed.data, problem: null };
}

function suggested(s: Record<string, unknown>, key: string): { column?: string; unit?: string } {
  const v = s[key];
  if (typeof v === 'string') return { column: v };
  if (v && typeof v === 'object') {
    const o = v as { column?: unknown; unit?: unknown };
    return { column: typeof o.column === 'string' ? o.column : undefined, unit: typeof o.unit === 'string' ? o.unit : undefined };
  }
  return {};
}

type Issue = { code: string; message: string } | null | undefined;

/**
 * Why the dialog is open, in plain words, from the reader's error code (src/shared/analysis/errors.ts)
 * and the roles it could not settle (`needs` of its mapping help).
 */
export function mappingReason(error: Issue, needs: string[], rpmColumn: string | undefined): string {
  const rpm = rpmColumn ? `“${rpmColumn}”` : 'a column';
  switch (error?.code as ApiErrorCodeOnClient | undefined) {
    case 'NO_RPM_COLUMN':
      return 'Pullbook found no engine-speed (rpm) column in this file. Choose it below, with the torque or power column.';
    case 'NO_POWER_OR_TORQUE':
      return `Pullbook took engine speed from ${rpm} but recognised neither a torque nor a power column. Choose the torque or power column below, if the file has one.`;
    case 'NEEDS_MAPPING':
      if (needs.length && !needs.includes('rpm')) return `Pullbook took engine speed from ${rpm} but could not tell which columns are torque and power. Choose them below.`;
      return 'Pullbook could not recognise the columns of this file with confidence. Check engine speed, torque and power below.';
    default:
      return 'Choose which columns hold engine speed, torque and power.';
  }
}

/** True when every non-empty preview value of the column reads as a number (so it aligns right). */
function numericColumn(rows: string[][], c: number): boolean {
  const values = rows.map((r) => (r[c] ?? '').trim()).filter(Boolean);
  return values.length > 0 && values.every((v) => /^[-+\u2212]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/.test(v));
}

/**
 * Choose the columns of a file Pullbook could not read on its own, from a preview of its first
 * rows. The layout can be saved so the same header is read automatically next time.
 */
export function MappingDialog({ runId, fileName, open, onClose, onMapped, error }: { runId: string; fileName: string; open: boolean; onClose: () => void; onMapped?: (run: RunSummaryDto) => void; error?: Issue }) {
  const preview = useQuery({ ...runQueries.preview(runId), enabled: open });
  // The stored run knows why it was not read when the caller does not.
  const run = useQuery({ ...runQueries.detail(runId), enabled: open });
  const speedColumn = run.data?.mappingHelp?.speedColumn;
  // Offered, not forced: a column read as road speed may still be engine speed under another name.
  const [speed, setSpeed] = useState<SpeedRatioChoice>(NO_SPEED_RATIO);
  const reason = mappingReason(error ?? run.data?.error, preview.data?.needs ?? [], suggested(preview.data?.suggestions ?? {}, 'rpm').column);
  const apply = useApplyMapping();
  const [choice, setChoice] = useState<Choice>({ rpm: '', torque: '', torqueUnit: 'lbft', power: '', powerUnit: 'hp', save: false, layoutName: '' });
  const [problem, setProblem] = useState<string | null>(null);
  const headers = preview.data?.headers ?? [];
  const previewRows = (preview.data?.rows ?? []).slice(0, PREVIEW_ROWS);
  const numeric = headers.map((_, c) => numericColumn(previewRows, c));

  useEffect(() => {
    if (!preview.data) return;
    const s = preview.data.suggestions;
    const rpm = suggested(s, 'rpm');
    const tq = suggested(s, 'torque');
    const pw = suggested(s, 'power');
    const known = (c?: string) => (c && preview.data.headers.includes(c) ? c : '');
    setChoice((old) => ({
      ...old,
      rpm: old.rpm || known(rpm.column),
      torque: old.torque || known(tq.column),
      torqueUnit: tq.unit ?? old.torqueUnit,
      power: old.power || known(pw.column),
      powerUnit: pw.unit ?? old.powerUnit,
    }));
  }, [preview.data]);

  // Once a problem is shown, every change re-checks it, so it clears as soon as the choice is fixed.
  const set = <K extends keyof Choice>(k: K, v: Choice[K]) => {
    const next = { ...choice, [k]: v };
    setChoice(next);
    if (problem) setProblem(check(next).problem);
    if (apply.error) apply.reset();
  };
  const columnOptions = headers.map((h, i) => ({ value: h, label: h || `Column ${i + 1}` }));

  const submit = async () => {
    if (speedColumn && speed.use) {
      const ratio = checkSpeedRatio(speed);
      setProblem(ratio.problem);
      if (!ratio.rpmPerSpeed) return;
      return send({ rpmPerSpeed: ratio.rpmPerSpeed });
    }
    const checked = check(choice);
    setProblem(checked.problem);
    if (!checked.mapping) return;
    return send({ mapping: checked.mapping, saveLayoutName: choice.save ? choice.layoutName.trim() : undefined });
  };
  const send = async (body: ApplyMapping) => {
    try {
      const run = await apply.mutateAsync({ runId, ...body });
      if (run) onMapped?.(run);
      onClose();
    } catch {
      // Shown by FormError below.
    }
  };

  return (
    <Dialog
      open={open}
      onClose={onClose}
      busy={apply.isPending}
      size="xl"
      title="Choose the columns"
      description={
        <>
          <span className="font-semibold text-ink [overflow-wrap:anywhere]">{fileName}</span>: {reason} The file is read again with the columns you choose.
        </>
      }
      footer={
        <DialogActions
          onCancel={onClose}
          cancelLabel="Not now"
          submitLabel={speedColumn && speed.use ? 'Read with this ratio' : 'Read with these columns'}
          busyLabel="Reading the file…"
          busy={apply.isPending}
          submit={{ onClick: submit }}
          submitDisabled={!preview.data}
        />
      }
    >
      {preview.isLoading ? (
        <LoadingState message="Reading the first rows…" compact />
      ) : preview.isError ? (
        <ErrorState error={preview.error} onRetry={() => preview.refetch()} />
      ) : (
        <div className="space-y-5">
          <section aria-labelledby={`pv-${runId}`}>
            <h3 id={`pv-${runId}`} className="mb-2 font-semibold text-ink">
              First rows of the file
            </h3>
            {headers.length === 0 ? (
              <p className="text-ink-muted">The file has no rows Pullbook could split into columns.</p>
            ) : (
              <div className="overflow-x-auto rounded-card border border-line" role="region" aria-label="Preview of the file" tabIndex={0}>
                <table className="min-w-full text-sm">
                  <caption className="sr-only">First {PREVIEW_ROWS} rows of {fileName}</caption>
                  <thead className="bg-paper-sunk">
                    <tr>
                      {headers.map((h, i) => (
                        <th key={i} scope="col" className={cn('whitespace-nowrap border-b border-line px-3 py-1.5 font-semibold text-ink-muted', numeric[i] ? 'text-right' : 'text-left')}>
                          {h || `Column ${i + 1}`}
                          {[choice.rpm, choice.torque, choice.power].includes(h) && h !== '' && (
                            <span className="ml-1 font-normal text-accent">
                              ({h === choice.rpm ? 'rpm' : h === choice.torque ? 'torque' : 'power'})
                            </span>
                          )}
                        </th>
                      ))}
                    </tr>
                  </thead>
                  <tbody>
                    {previewRows.map((row, r) => (
                      <tr key={r}>
                        {headers.map((_, c) => (
                          <td key={c} className={cn('whitespace-nowrap border-b border-line px-3 py-1', numeric[c] ? 'num text-right' : 'text-left')}>
                            {row[c] ?? ''}
                          </td>
                        ))}
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </section>
          {speedColumn && <SpeedRatioFields speedColumn={speedColumn} hint={run.data?.mappingHelp?.rpmPerSpeedHint} value={speed} onChange={(next) => {
                setSpeed(next);
                setProblem(null);
              }} />}
          {!(speedColumn && speed.use) && (
          <>
          <div className="grid gap-4 md:grid-cols-3">
            <SelectField label="Engine speed (rpm) column" required placeholder="Choose a column…" options={columnOptions} value={choice.rpm} onChange={(e) => set('rpm', e.target.value)} />
            <div className="grid grid-cols-[1fr_7rem] gap-2">
              <SelectField label="Torque column" placeholder="None" options={columnOptions} value={choice.torque} onChange={(e) => set('torque', e.target.value)} />
              <SelectField label="Torque unit" options={TORQUE_UNITS} value={choice.torqueUnit} onChange={(e) => set('torqueUnit', e.target.value)} disabled={!choice.torque} />
            </div>
            <div className="grid grid-cols-[1fr_7rem] gap-2">
              <SelectField label="Power column" placeholder="None" options={columnOptions} value={choice.power} onChange={(e) => set('power', e.target.value)} />
              <SelectField label="Power unit" options={POWER_UNITS} value={choice.powerUnit} onChange={(e) => set('powerUnit', e.target.value)} disabled={!choice.power} />
            </div>
          </div>
          <p className="text-sm text-ink-muted">Map torque, power or both. With only one, Pullbook works out the other from torque × rpm.</p>
          <div className="grid gap-2 md:grid-cols-2 md:items-end">
            <CheckboxField label="Save this layout for files with the same header" checked={choice.save} onChange={(e) => set('save', e.target.checked)} />
            {choice.save && <TextField label="Layout name" value={choice.layoutName} onChange={(e) => set('layoutName', e.target.value)} maxLength={120} hint="e.g. “Bay 2 export, no header names”" />}
          </div>
          </>
          )}
          <FormError error={problem ?? apply.error} title={problem ? 'Check the columns' : 'The file was not read'} />
        </div>
      )}
    </Dialog>
  );
}
