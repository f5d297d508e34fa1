/**
 * Which files are run files: what dyno PCs and loggers save a pull as. The upload page's file
 * picker and the sync agent on the dyno PC both use this list, so they never disagree.
 */
export const RUN_FILE_EXTENSIONS = ['.csv', '.txt', '.tsv', '.log', '.dat'] as const;

/** True for a file name with one of the run-file endings (case-insensitive); hidden and temporary files never count. */
export function isRunFileName(name: string): boolean {
  const base = name.split(/[\\/]/).pop() ?? '';
  if (!base || base.startsWith('.') || base.startsWith('~$') || base.endsWith('~')) return false;
  const lower = base.toLowerCase();
  return RUN_FILE_EXTENSIONS.some((ext) => lower.endsWith(ext));
}
