/** The first rows of a run's raw file, for the mapping dialog. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../../app-deps';
import type { Actor } from '../../http/actor';
import { AppError } from '../../lib/errors';
import { detectLayout } from '@shared/analysis/layout';
import { decodeBytes } from '@shared/analysis/decode';
import { AnalysisError } from '@shared/analysis/index';
import type { RunPreviewDto } from '@shared/schemas/run';
import { getRunEntity } from './run-scope';

const PREVIEW_ROWS = 10;
/** Bytes read for a preview: enough for the layout sniffing (the engine's head size). */
const PREVIEW_BYTES = 256 * 1024;

/** The mapping help stored with a run that needs a mapping, else a fresh look at the file's head. */
export async function runPreview(em: EntityManager, deps: AppDeps, actor: Actor, id: string): Promise<RunPreviewDto> {
  const run = await getRunEntity(em, actor, id, { includeDeleted: false });
  const help = (run.error?.details ?? null) as { headers?: string[]; previewRows?: string[][]; suggestions?: Record<string, unknown>; headerSignature?: string; needs?: string[] } | null;
  const base = { runId: run.id, originalName: run.originalName, status: run.status, mapping: run.mapping };
  if (help && Array.isArray(help.headers)) {
    return { ...base, headers: help.headers, previewRows: (help.previewRows ?? []).slice(0, PREVIEW_ROWS), suggestions: help.suggestions ?? {}, headerSignature: help.headerSignature ?? run.headerSignature, needs: help.needs ?? [] };
  }
  const bytes = await deps.storage.getBuffer(run.rawKey);
  try {
    const text = decodeBytes(bytes.subarray(0, PREVIEW_BYTES));
    const layout = detectLayout(text, bytes.length <= PREVIEW_BYTES);
    const headers = layout.header ?? Array.from({ length: layout.fieldCount }, (_, i) => `column ${i + 1}`);
    const suggestions: Record<string, unknown> = run.columns ? { rpm: run.columns.rpm, torque: run.columns.torque, power: run.columns.power } : {};
    return { ...base, headers, previewRows: layout.preview.slice(0, PREVIEW_ROWS), suggestions, headerSignature: run.headerSignature, needs: [] };
  } catch (e) {
    const msg = e instanceof AnalysisError ? e.message : 'The file could not be read as a table.';
    throw new AppError('NO_PREVIEW', `No preview: ${msg}`, 422);
  }
}
