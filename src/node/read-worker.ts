// Worker-thread entry (bundled to dist/read-worker.cjs): reads and parses one recording file and posts its sample
// blocks to the parent, so that parsing (here) and the per-breath analysis (in the parent) run on two cores at once.
// Backpressure: at most MAX_IN_FLIGHT blocks wait in the parent; the reader blocks on a shared counter
// (Atomics.wait) until the parent has analysed one, so memory stays flat whatever the file length.
import { parentPort, workerData } from 'node:worker_threads';
import { isInputError } from '../ingest/errors.js';
import type { IngestSettings } from '../settings.js';
import type { SampleBlock } from '../types.js';
import { readRecordingFile } from './read-recording.js';

export const MAX_IN_FLIGHT = 4;

export interface ReadWorkerData {
  path: string;
  ingest: IngestSettings;
  min_rate_hz: number;
  /** Int32Array over a SharedArrayBuffer: [0] = blocks posted and not yet analysed */
  inFlight: SharedArrayBuffer;
}

export type ReadWorkerMessage =
  | { kind: 'block'; block: SampleBlock }
  | { kind: 'done'; report: unknown }
  | { kind: 'error'; input: { code: string; detail: string; hint: string; file?: string; line?: number; column?: number } | null; message: string };

const port = parentPort;
if (port && workerData) {
  const data = workerData as ReadWorkerData;
  const counter = new Int32Array(data.inFlight);
  const post = (block: SampleBlock) => {
    let n = Atomics.load(counter, 0);
    while (n >= MAX_IN_FLIGHT) {
      Atomics.wait(counter, 0, n, 1000);
      n = Atomics.load(counter, 0);
    }
    Atomics.add(counter, 0, 1);
    const msg: ReadWorkerMessage = { kind: 'block', block };
    const transfer = [block.t_s.buffer, block.flow_lps.buffer, block.co2_mmhg.buffer] as ArrayBuffer[];
    port.postMessage(msg, transfer);
  };
  readRecordingFile(data.path, data.ingest, data.min_rate_hz, post).then(
    (report) => port.postMessage({ kind: 'done', report } satisfies ReadWorkerMessage),
    (e: unknown) => {
      const input = isInputError(e)
        ? { code: e.code, detail: e.detail, hint: e.hint, file: e.file, line: e.line, column: e.column }
        : null;
      port.postMessage({ kind: 'error', input, message: (e as Error)?.message ?? String(e) } satisfies ReadWorkerMessage);
    },
  );
}
