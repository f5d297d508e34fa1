/**
 * Streaming reader (Node only): reads the head to sniff the layout, then streams the rest through
 * csv-parse into the row collector, so memory is bounded by the used columns, not the file.
 */
import { open } from 'node:fs/promises';
import {
  type AnalysisPulls, type AnalysisResult, type AnalyzeOptions, HEAD_CHARS, createFeeder, estimateRows, normaliseOptions, prepareRead, utf8Length,
} from '@shared/analysis/analyze';
import { finishPulls } from '@shared/analysis/pulls';
import { SNIFF_BYTES, createStreamDecoder, detectEncoding } from '@shared/analysis/decode';
import { AnalysisError, toAnalysisError } from '@shared/analysis/errors';
import { RowCollector } from '@shared/analysis/table';

const CHUNK_BYTES = 128 * 1024;

/** Analyses a file on disk with bounded memory: the main pull (largest rpm rise). Rejects with AnalysisError only. */
export async function analyzeFile(path: string, options: AnalyzeOptions = {}): Promise<AnalysisResult> {
  const all = await analyzeFilePulls(path, options);
  return all.pulls[all.main];
}

/** Analyses a file on disk with bounded memory: every pull of the log, in time order. Rejects with AnalysisError only. */
export async function analyzeFilePulls(path: string, options: AnalyzeOptions = {}): Promise<AnalysisPulls> {
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
    const utf8 = guess.encoding === 'utf-8';
    const decoder = createStreamDecoder(guess.encoding);
    const headBytes: Uint8Array[] = [first.slice(guess.bomLength)];
    let head = decoder.write(first.subarray(guess.bomLength));
    let ended = false;
    while (head.length < HEAD_CHARS && !ended) {
      const chunk = await readChunk();
      if (!chunk) {
        head += decoder.end();
        ended = true;
      } else {
        if (utf8) headBytes.push(chunk.slice());
        head += decoder.write(chunk);
      }
    }
    const prepared = prepareRead(head, ended, opts);
    const collector = new RowCollector(prepared.plan, prepared.layout.decimalComma, estimateRows(head, prepared.layout.dataStart, size));
    const feeder = createFeeder(prepared, collector);
    const encoder = new TextEncoder();
    if (utf8) {
      // Pass UTF-8 bytes through untouched from the first data row.
      let skip = utf8Length(head.slice(0, prepared.layout.dataStart));
      for (const b of headBytes) {
        if (skip >= b.length) {
          skip -= b.length;
          continue;
        }
        feeder.push(b.subarray(skip));
        skip = 0;
      }
    } else feeder.push(encoder.encode(head.slice(prepared.layout.dataStart)));
    while (!ended && !feeder.stopped) {
      const chunk = await readChunk();
      if (!chunk) {
        if (!utf8) feeder.push(encoder.encode(decoder.end()));
        ended = true;
      } else feeder.push(utf8 ? chunk : encoder.encode(decoder.write(chunk)));
    }
    feeder.end();
    return finishPulls(collector, prepared, opts);
  } catch (e) {
    throw toAnalysisError(e, 'READ_FAILED');
  } finally {
    await handle?.close().catch(() => undefined);
  }
}
