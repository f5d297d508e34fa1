/**
 * Run files on disk (Node only): the streaming reader around the pure engine in server/analysis/.
 * This is the stable import for `analyzeFile`; server/analysis/ itself does no I/O.
 */
export { analyzeFile } from './analyze-file.js';
