/**
 * Run files on disk (Node only): the streaming reader around the pure engine in src/shared/analysis/.
 * This is the stable import for `analyzeFile`; src/shared/analysis/ itself does no I/O.
 */
export { analyzeFile, analyzeFilePulls } from './analyze-file.js';
