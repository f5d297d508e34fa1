/**
 * Display helpers of the comparisons feature: the aligned-curves CSV and file downloads. Unit
 * conversion is the shared one (src/shared/units-display.ts).
 */
import type { ComparisonPreview } from '@shared/schemas/comparison';
import type { DisplayUnits } from '@shared/units-display';

/** A CSV cell: quoted, and a leading = + - @ neutralised so spreadsheets do not run it as a formula. */
function cell(v: string | number | null): string {
  if (v === null) return '';
  if (typeof v === 'number') return String(v);
  const safe = /^[=+\-@]/.test(v) ? `'${v}` : v;
  return `"${safe.replace(/"/g, '""')}"`;
}

/** The aligned, corrected curves as CSV: one rpm column, then power and torque per run (empty where a run has no data). */
export function curvesCsv(preview: ComparisonPreview, u: DisplayUnits): string {
  // The run's one name with its file, so a column can be matched to its pull and file.
  const names = new Map(preview.runs.map((r) => [r.runId, r.fileName ? `${r.name} (${r.fileName})` : r.name]));
  const header = ['rpm', ...preview.curves.runs.flatMap((c) => [`${names.get(c.runId)} power (${u.power})`, `${names.get(c.runId)} torque (${u.torque})`])];
  const round = (v: number | null) => (v === null ? null : Math.round(v * 1000) / 1000);
  const lines = [header.map(cell).join(',')];
  preview.curves.rpm.forEach((rpm, i) => {
    const row: (string | number | null)[] = [rpm];
    for (const c of preview.curves.runs) {
      const p = c.powerHp[i];
      const t = c.torqueLbft[i];
      row.push(round(p === null ? null : u.p(p)), round(t === null ? null : u.t(t)));
    }
    lines.push(row.map(cell).join(','));
  });
  return `${lines.join('\r\n')}\r\n`;
}

/** Starts a download of a blob or data URL under a file name. */
export function download(data: Blob | string, fileName: string) {
  const url = typeof data === 'string' ? data : URL.createObjectURL(data);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  if (typeof data !== 'string') setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** A file-name-safe slug of a comparison name. */
export function fileSlug(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'comparison';
}
