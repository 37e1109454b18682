// Node edge: one recording file -> analysis outputs (used by `analyse` and `batch`).
import { createAnalyser } from '../analyse/analyser.js';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { InputError, type InputErrorCode } from '../ingest/errors.js';
import type { SampleBlock } from '../types.js';
import { readRecordingFile } from './read-recording.js';
import type { ReadWorkerData, ReadWorkerMessage } from './read-worker.js';
import type { Settings } from '../settings.js';
import type { AnalysisCore } from '../analyse/analyser.js';
import type { IngestReport } from '../ingest/index.js';

/** The analysis of one file; the outputs (summary, trends, tables) are composed by src/report/outputs.ts. */
export interface FileAnalysis {
  core: AnalysisCore;
  report: IngestReport;
}

/**
 * Streams the file through the reader into the analyser; memory holds breath rows, not samples.
 * With `parallel` (the `analyse` command), the file is read and parsed in a worker thread while this thread analyses
 * the blocks it receives, when the bundled worker (dist/read-worker.cjs) is there; else, and in batch workers, both
 * run here. The results are the same either way (the blocks are identical; tested).
 */
export async function analyseFile(
  path: string,
  settings: Settings,
  parallel = false,
): Promise<FileAnalysis> {
  const analyser = createAnalyser(settings);
  const workerFile = parallel ? readWorkerFile() : null;
  const report = workerFile
    ? await readInWorker(workerFile, path, settings, (b) => analyser.push(b))
    : await readRecordingFile(path, settings.ingest, settings.analysis.min_rate_hz, (b) => analyser.push(b));
  return { core: analyser.finish(), report };
}

/** The bundled reader worker next to the running bundle (dist/cli.cjs -> dist/read-worker.cjs), or null. */
export function readWorkerFile(): string | null {
  const dir = typeof __dirname === 'string' ? __dirname : null;
  if (!dir) return null;
  const f = join(dir, 'read-worker.cjs');
  return existsSync(f) ? f : null;
}

/** Reads the file in a worker thread; calls onBlock here for each block, in order; resolves to the ingest report. */
export function readInWorker(workerFile: string, path: string, settings: Settings, onBlock: (b: SampleBlock) => void): Promise<IngestReport> {
  const inFlight = new SharedArrayBuffer(4);
  const counter = new Int32Array(inFlight);
  const data: ReadWorkerData = { path, ingest: settings.ingest, min_rate_hz: settings.analysis.min_rate_hz, inFlight };
  // the reader holds one chunk and one block at a time: a small heap keeps the process under the memory target
  const worker = new Worker(workerFile, { workerData: data, resourceLimits: { maxYoungGenerationSizeMb: 8, maxOldGenerationSizeMb: 96 } });
  return new Promise<IngestReport>((resolve, reject) => {
    let settled = false;
    const finish = (f: () => void) => {
      if (settled) return;
      settled = true;
      void worker.terminate();
      f();
    };
    worker.on('message', (m: ReadWorkerMessage) => {
      if (m.kind === 'block') {
        try {
          onBlock(m.block);
        } catch (e) {
          finish(() => reject(e));
          return;
        } finally {
          Atomics.sub(counter, 0, 1);
          Atomics.notify(counter, 0);
        }
      } else if (m.kind === 'done') finish(() => resolve(m.report as IngestReport));
      else {
        const i = m.input;
        const err = i
          ? new InputError(i.code as InputErrorCode, i.detail, i.hint, {
              ...(i.file !== undefined ? { file: i.file } : {}),
              ...(i.line !== undefined ? { line: i.line } : {}),
              ...(i.column !== undefined ? { column: i.column } : {}),
            })
          : new Error(m.message);
        finish(() => reject(err));
      }
    });
    worker.on('error', (e) => finish(() => reject(e)));
    worker.on('exit', (code) => finish(() => reject(new Error(`the reader thread stopped (exit ${code})`))));
  });
}
