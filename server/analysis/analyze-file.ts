/**
 * Streaming reader (Node only): reads the head to sniff the layout, then streams the rest through
 * csv-parse into the row collector, so memory is bounded by the used columns, not the file.
 */
import { open } from 'node:fs/promises';
import { Parser } from 'csv-parse';
import { type AnalysisResult, type AnalyzeOptions, HEAD_CHARS, finishAnalysis, normaliseOptions, prepareRead } from './analyze.js';
import { SNIFF_BYTES, createStreamDecoder, detectEncoding } from './decode.js';
import { AnalysisError, toAnalysisError } from './errors.js';
import { RowCollector, csvOptions } from './table.js';

const CHUNK_BYTES = 256 * 1024;

/** Analyses a file on disk with bounded memory. Rejects with AnalysisError only. */
export async function analyzeFile(path: string, options: AnalyzeOptions = {}): Promise<AnalysisResult> {
  let handle: Awaited<ReturnType<typeof open>> | undefined;
  try {
    const opts = normaliseOptions(options);
    handle = await open(path, 'r');
    const size = (await handle.stat()).size;
    if (size > opts.maxBytes) throw new AnalysisError('FILE_TOO_LARGE', `The file is ${size} bytes; the limit is ${opts.maxBytes}.`);
    const buffer = new Uint8Array(CHUNK_BYTES);
    let position = 0;
    const readChunk = async (): Promise<Uint8Array | null> => {
      const { bytesRead } = await handle!.read(buffer, 0, CHUNK_BYTES, position);
      position += bytesRead;
      if (position > opts.maxBytes) throw new AnalysisError('FILE_TOO_LARGE', `The file is larger than the limit of ${opts.maxBytes} bytes.`);
      return bytesRead === 0 ? null : buffer.subarray(0, bytesRead);
    };

    // Head: enough bytes to decide the encoding and sniff the layout.
    const first = await readChunk();
    if (!first) throw new AnalysisError('EMPTY_FILE', 'The file is empty.');
    const guess = detectEncoding(first.subarray(0, SNIFF_BYTES));
    const decoder = createStreamDecoder(guess.encoding);
    let head = decoder.write(first.subarray(guess.bomLength));
    let ended = false;
    while (head.length < HEAD_CHARS && !ended) {
      const chunk = await readChunk();
      if (!chunk) {
        head += decoder.end();
        ended = true;
      } else head += decoder.write(chunk);
    }
    const prepared = prepareRead(head, ended, opts);
    const collector = new RowCollector(prepared.plan, prepared.layout.decimalComma, prepared.layout.dataStartLine - 1);
    const parser = new Parser(csvOptions(prepared.layout, collector));
    const done = new Promise<void>((resolve, reject) => {
      parser.on('error', reject);
      parser.on('end', resolve);
    });
    parser.resume();
    const write = async (text: string) => {
      if (text.length > 0 && !parser.write(text)) await new Promise((r) => parser.once('drain', r));
    };
    await write(head.slice(prepared.layout.dataStart));
    while (!ended && !collector.error) {
      const chunk = await readChunk();
      if (!chunk) {
        await write(decoder.end());
        ended = true;
      } else await write(decoder.write(chunk));
    }
    parser.end();
    await done;
    return finishAnalysis(collector, prepared, opts);
  } catch (e) {
    throw toAnalysisError(e, 'READ_FAILED');
  } finally {
    await handle?.close().catch(() => undefined);
  }
}
