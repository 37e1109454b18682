// Parent side of the reader thread (src/node/read-worker.ts): one worker thread that reads and parses files in the
// order they are asked for, while the caller's thread analyses the blocks. Several reads may be outstanding: the
// thread starts on the next file as soon as it has finished the previous one (the batch pool keeps one waiting).
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { InputError, type InputErrorCode } from '../ingest/errors';
import type { IngestReport } from '../ingest/index';
import type { Settings } from '../settings';
import type { SampleBlock } from '../types';
import type { ReadRequest, ReadWorkerData, ReadWorkerMessage } from './read-worker';

export const READ_WORKER_BUNDLE = 'read-worker.cjs';

/** The bundled reader next to the running bundle (dist/cli.cjs -> dist/read-worker.cjs), or null. */
export function readWorkerFile(): string | null {
  const dir = typeof __dirname === 'string' ? __dirname : null;
  if (!dir) return null;
  const f = join(dir, READ_WORKER_BUNDLE);
  return existsSync(f) ? f : null;
}


export interface ReadResult {
  report: IngestReport;
  /** SHA-256 of the file's bytes when asked for (hash: true), else null */
  sha256: string | null;
}

interface Pending {
  onBlock: (b: SampleBlock) => void;
  resolve: (r: ReadResult) => void;
  reject: (e: unknown) => void;
}

export class ReaderThread {
  private readonly worker: Worker;
  private readonly counter: Int32Array;
  private readonly pending = new Map<number, Pending>();
  private nextId = 1;
  private broken: Error | null = null;
  private closing = false;

  /** Starts the reader worker from its bundle (dist/read-worker.cjs). */
  constructor(workerFile: string) {
    const inFlight = new SharedArrayBuffer(4);
    const data: ReadWorkerData = { inFlight };
    this.counter = new Int32Array(inFlight);
    this.worker = new Worker(workerFile, { workerData: data });
    this.worker.on('message', (m: ReadWorkerMessage) => this.receive(m));
    this.worker.on('error', (e) => this.fail(e));
    this.worker.on('exit', (code) => this.fail(new Error(`the reader thread stopped (exit ${code})`)));
  }

  /**
   * Reads `path` in the thread; `onBlock` is called here for each block, in order. Resolves to the ingest report;
   * rejects with the reader's InputError, or with what `onBlock` threw (the rest of that file is then not read).
   */
  read(path: string, settings: Settings, onBlock: (b: SampleBlock) => void, hash = false): Promise<ReadResult> {
    if (this.broken) return Promise.reject(this.broken);
    const id = this.nextId++;
    return new Promise<ReadResult>((resolve, reject) => {
      this.pending.set(id, { onBlock, resolve, reject });
      const req: ReadRequest = { kind: 'read', id, path, ingest: settings.ingest, min_rate_hz: settings.analysis.min_rate_hz, hash };
      this.worker.postMessage(req);
    });
  }

  /** False once the thread has stopped (then read here instead). */
  get usable(): boolean {
    return this.broken === null;
  }

  /** Stops the thread (outstanding reads are rejected). */
  async close(): Promise<void> {
    this.closing = true;
    await this.worker.terminate();
  }

  private receive(m: ReadWorkerMessage): void {
    const p = this.pending.get(m.id);
    if (m.kind === 'block') {
      try {
        p?.onBlock(m.block);
      } catch (e) {
        this.pending.delete(m.id);
        this.worker.postMessage({ kind: 'cancel', id: m.id } satisfies ReadRequest);
        p!.reject(e);
      } finally {
        Atomics.sub(this.counter, 0, 1);
        Atomics.notify(this.counter, 0);
      }
      return;
    }
    if (!p) return;
    this.pending.delete(m.id);
    if (m.kind === 'done') {
      p.resolve({ report: m.report as IngestReport, sha256: m.sha256 });
      return;
    }
    const i = m.input;
    p.reject(
      i
        ? new InputError(i.code as InputErrorCode, i.detail, i.hint, {
            ...(i.file !== undefined ? { file: i.file } : {}),
            ...(i.line !== undefined ? { line: i.line } : {}),
            ...(i.column !== undefined ? { column: i.column } : {}),
          })
        : new Error(m.message),
    );
  }

  private fail(e: Error): void {
    if (this.broken) return;
    this.broken = this.closing ? new Error('the reader thread was closed') : e;
    for (const p of this.pending.values()) p.reject(this.broken);
    this.pending.clear();
  }
}
