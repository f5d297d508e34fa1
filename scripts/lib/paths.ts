import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** The checkout's root folder. */
export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const STORAGE = path.join(ROOT, 'storage');
