// Worker-thread entry (bundled to dist/read-worker.cjs): a reader thread that stays up for a sequence of files.
// It reads and parses each requested recording, in the order asked, and posts its sample blocks to the parent, so
// that parsing (here) and the per-breath analysis (in the parent) run on two cores at once. While the parent
// finishes one recording (outputs, tables) this thread is already parsing the next, and it starts (loads the
// bundle, warms up) once per batch instead of once per file.
// Backpressure: at most MAX_IN_FLIGHT blocks wait in the parent, whichever file they belong to; the reader blocks
// on a shared counter (Atomics.wait) until the parent has taken one, so memory stays flat whatever the file length.
// With `hash`, the SHA-256 of the file's bytes is computed from the same chunks (the manifest's content hash,
// without reading the file a second time).
import { createHash } from 'node:crypto';
import { parentPort, workerData } from 'node:worker_threads';
import { isInputError } from '../ingest/errors';
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { readRecordingFile } from './read-recording';

export const MAX_IN_FLIGHT = 4;

export interface ReadWorkerData {
  /** Int32Array over a SharedArrayBuffer: [0] = blocks posted and not yet taken by the parent */
  inFlight: SharedArrayBuffer;
}

export type ReadRequest =
  | { kind: 'read'; id: number; path: string; ingest: IngestSettings; min_rate_hz: number; hash: boolean }
  /** stop reading request `id` (the parent no longer wants its blocks, e.g. its analysis failed) */
  | { kind: 'cancel'; id: number };

export type ReadWorkerMessage =
  | { kind: 'block'; id: number; block: SampleBlock }
  | { kind: 'done'; id: number; report: unknown; sha256: string | null }
  | { kind: 'error'; id: number; input: { code: string; detail: string; hint: string; file?: string; line?: number; column?: number } | null; message: string };

class Cancelled extends Error {}

const port = parentPort;
if (port && workerData) {
  const counter = new Int32Array((workerData as ReadWorkerData).inFlight);
  const cancelled = new Set<number>();
  const post = (id: number, block: SampleBlock) => {
    if (cancelled.has(id)) throw new Cancelled();
    let n = Atomics.load(counter, 0);
    while (n >= MAX_IN_FLIGHT) {
      Atomics.wait(counter, 0, n, 1000);
      n = Atomics.load(counter, 0);
    }
    Atomics.add(counter, 0, 1);
    const msg: ReadWorkerMessage = { kind: 'block', id, block };
    port.postMessage(msg, [block.t_s.buffer, block.flow_lps.buffer, block.co2_mmhg.buffer] as ArrayBuffer[]);
  };
  const serve = async (req: Extract<ReadRequest, { kind: 'read' }>): Promise<void> => {
    if (cancelled.delete(req.id)) return;
    const hash = req.hash ? createHash('sha256') : null;
    try {
      const report = await readRecordingFile(req.path, req.ingest, req.min_rate_hz, (b) => post(req.id, b), hash ? (buf) => hash.update(buf) : undefined);
      port.postMessage({ kind: 'done', id: req.id, report, sha256: hash ? hash.digest('hex') : null } satisfies ReadWorkerMessage);
    } catch (e) {
      if (e instanceof Cancelled) return;
      const input = isInputError(e)
        ? { code: e.code, detail: e.detail, hint: e.hint, file: e.file, line: e.line, column: e.column }
        : null;
      port.postMessage({ kind: 'error', id: req.id, input, message: (e as Error)?.message ?? String(e) } satisfies ReadWorkerMessage);
    } finally {
      cancelled.delete(req.id);
    }
  };
  // one file at a time, in the order asked
  let queue: Promise<void> = Promise.resolve();
  port.on('message', (req: ReadRequest) => {
    if (req.kind === 'cancel') cancelled.add(req.id);
    else queue = queue.then(() => serve(req));
  });
}
