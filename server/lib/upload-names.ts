/**
 * Upload metadata fitted to what the archive keeps (run.entity.ts: original name 300 characters,
 * content type 120). A longer name or type is shortened and kept, never a reason to refuse a file.
 */
export const MAX_FILE_NAME = 300;
export const MAX_CONTENT_TYPE = 120;

/** The name cut to `max` characters (code points), keeping its extension and marking the cut with "…". */
export function fitFileName(name: string, max = MAX_FILE_NAME): string {
  // Control characters are dropped (they have no place in a name shown on screen).
  const chars = Array.from(name).filter((c) => c.codePointAt(0)! >= 0x20 && c !== '\u007f');
  if (chars.length <= max) return chars.join('');
  const dot = chars.lastIndexOf('.');
  const ext = dot > 0 && chars.length - dot <= 16 ? chars.slice(dot) : [];
  const stem = chars.slice(0, max - ext.length - 1);
  return [...stem, '…', ...ext].join('');
}

/** The content type within `max` characters: its parameters dropped first, then unknown. */
export function fitContentType(type: string | null | undefined, max = MAX_CONTENT_TYPE): string | null {
  if (!type) return null;
  if (type.length <= max) return type;
  const bare = type.split(';')[0].trim();
  return bare.length > 0 && bare.length <= max ? bare : 'application/octet-stream';
}
