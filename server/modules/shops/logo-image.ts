/** What a shop logo may be: a PNG or JPEG image of at most 2 MB. */

export const LOGO_MAX_BYTES = 2 * 1024 * 1024;

/** PNG and JPEG are told apart by their magic bytes (PNG: 89 50 4E 47 0D 0A 1A 0A; JPEG: FF D8 FF). */
export function imageFormatOf(bytes: Buffer): 'png' | 'jpg' | null {
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'jpg';
  return null;
}
