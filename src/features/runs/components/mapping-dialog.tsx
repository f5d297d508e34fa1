import { useEffect, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { RunSummaryDto } from '@shared/schemas/run';
import { columnMappingInput } from '@shared/schemas/run';
import { Button, CheckboxField, Dialog, ErrorState, FormError, LoadingState, SelectField, TextField } from '@/components/ui';
import { runQueries } from '../api/run-queries';
import { useApplyMapping, type ApplyMapping } from '../api/apply-mapping';

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

function suggested(s: Record<string, unknown>, key: string): { column?: string; unit?: string } {
  const v = s[key];
  if (typeof v === 'string') return { column: v };
  if (v && typeof v === 'object') {
    const o = v as { column?: unknown; unit?: unknown };
    return { column: typeof o.column === 'string' ? o.column : undefined, unit: typeof o.unit === 'string' ? o.unit : undefined };
  }
  return {};
}

/**
 * Choose the columns of a file Pullbook could not read on its own, from a preview of its first
 * rows. The layout can be saved so the same header is read automatically next time.
 */
export function MappingDialog({ runId, fileName, open, onClose, onMapped }: { runId: string; fileName: string; open: boolean; onClose: () => void; onMapped?: (run: RunSummaryDto) => void }) {
  const preview = useQuery({ ...runQueries.preview(runId), enabled: open });
  const apply = useApplyMapping();
  const [choice, setChoice] = useState<Choice>({ rpm: '', torque: '', torqueUnit: 'lbft', power: '', powerUnit: 'hp', save: false, layoutName: '' });
  const [problem, setProblem] = useState<string | null>(null);
  const headers = preview.data?.headers ?? [];

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

  const set = <K extends keyof Choice>(k: K, v: Choice[K]) => setChoice((c) => ({ ...c, [k]: v }));
  const columnOptions = headers.map((h, i) => ({ value: h, label: h || `Column ${i + 1}` }));

  const submit = async () => {
    setProblem(null);
    const mapping = {
      rpm: choice.rpm,
      torque: choice.torque ? { column: choice.torque, unit: choice.torqueUnit } : undefined,
      power: choice.power ? { column: choice.power, unit: choice.powerUnit } : undefined,
    };
    const parsed = columnMappingInput.safeParse(mapping);
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? 'Check the columns');
      return;
    }
    if (choice.save && !choice.layoutName.trim()) {
      setProblem('Give the layout a name, or untick “Save this layout”.');
      return;
    }
    const body: ApplyMapping = { mapping: parsed.data, saveLayoutName: choice.save ? choice.layoutName.trim() : undefined };
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
          Pullbook could not tell which column of <span className="font-semibold text-ink">{fileName}</span> is engine speed. Pick the columns below; the file is read again with them.
        </>
      }
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={apply.isPending}>
            Not now
          </Button>
          <Button variant="primary" onClick={submit} loading={apply.isPending} loadingText="Reading the file…" disabled={!preview.data}>
            Read with these columns
          </Button>
        </>
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
                        <th key={i} scope="col" className="whitespace-nowrap border-b border-line px-3 py-1.5 text-left font-semibold text-ink-muted">
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
                    {preview.data!.rows.slice(0, PREVIEW_ROWS).map((row, r) => (
                      <tr key={r}>
                        {headers.map((_, c) => (
                          <td key={c} className="num whitespace-nowrap border-b border-line px-3 py-1 text-right">
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
          <FormError error={problem ?? apply.error} title={problem ? 'Check the columns' : 'The file was not read'} />
        </div>
      )}
    </Dialog>
  );
}
