/** Escapes `%`, `_` and `\` so user text is matched literally inside a LIKE / ILIKE pattern. */
export const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** `%text%` for a literal "contains" match with LIKE / ILIKE. */
export const containsPattern = (s: string) => `%${escapeLike(s)}%`;
