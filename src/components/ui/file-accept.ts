/** Why a dropped or chosen file was not taken. */
export type FileRejectionReason = 'type' | 'size' | 'count';

export interface FileRejection {
  file: File;
  reason: FileRejectionReason;
}

/**
 * Does a file match an accept list like `['.csv', '.txt', 'text/*']`? Same rules as the HTML
 * `accept` attribute: ".ext" matches the name's ending (case-insensitive), "type/*" a MIME
 * family, anything else an exact MIME type. An empty list accepts everything.
 */
export function fileMatchesAccept(file: Pick<File, 'name' | 'type'>, accept: readonly string[] | undefined): boolean {
  if (!accept || accept.length === 0) return true;
  const name = file.name.toLowerCase();
  const type = (file.type || '').toLowerCase();
  return accept.some((raw) => {
    const token = raw.trim().toLowerCase();
    if (!token) return false;
    if (token.startsWith('.')) return name.endsWith(token);
    if (token.endsWith('/*')) return type.startsWith(token.slice(0, -1));
    return type === token;
  });
}

/** Identity for de-duplicating files chosen twice. */
export function fileKey(file: Pick<File, 'name' | 'size' | 'lastModified'>): string {
  return `${file.name}|${file.size}|${file.lastModified}`;
}

export interface MergeFilesOptions {
  accept?: readonly string[];
  multiple?: boolean;
  maxFiles?: number;
  maxSizeBytes?: number;
}

/** Adds incoming files to the current list, skipping duplicates and anything over the limits. */
export function mergeFiles(current: readonly File[], incoming: readonly File[], options: MergeFilesOptions) {
  const { accept, multiple = true, maxFiles, maxSizeBytes } = options;
  const rejected: FileRejection[] = [];
  const accepted: File[] = [];
  for (const file of incoming) {
    if (!fileMatchesAccept(file, accept)) rejected.push({ file, reason: 'type' });
    else if (maxSizeBytes !== undefined && file.size > maxSizeBytes) rejected.push({ file, reason: 'size' });
    else accepted.push(file);
  }
  if (!multiple) {
    const [first, ...rest] = accepted;
    rest.forEach((file) => rejected.push({ file, reason: 'count' }));
    return { files: first ? [first] : [...current], rejected };
  }
  const seen = new Set(current.map(fileKey));
  const files = [...current];
  for (const file of accepted) {
    const key = fileKey(file);
    if (seen.has(key)) continue;
    if (maxFiles !== undefined && files.length >= maxFiles) {
      rejected.push({ file, reason: 'count' });
      continue;
    }
    seen.add(key);
    files.push(file);
  }
  return { files, rejected };
}
