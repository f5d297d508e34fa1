/** What a shop logo may be: a PNG or JPEG image of at most 2 MB and 2000 × 2000 px (4 MP). */
export const LOGO_MAX_BYTES = 2 * 1024 * 1024;
