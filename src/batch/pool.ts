// Runs recording tasks on `jobs` threads. A recording's work splits in two nearly equal halves: reading and parsing
// the text, and analysing the samples. So threads are spent in lanes of two: an analysis thread with its own reader
// thread (src/node/reader-thread.ts) that parses the lane's files one after another, each one while the previous
// is analysed. Lane 0's analysis runs in the main thread; further lanes are batch workers (node:worker_threads).
//   --jobs 1: one thread reads and analyses (no worker at all);
//   --jobs 2: the main thread analyses, one reader thread parses;
//   --jobs 3: that, plus a worker that reads and analyses by itself; --jobs 4: two lanes of two; and so on.
// When most of the bytes are in short recordings, readers would idle: every lane then reads its own files, with one
// thread's worth left to V8's background threads, except that --jobs 2 runs two lanes on a large set (planLanes).
// Pairing threads this way (instead of N threads that each read and analyse) starts fewer copies of the code, each
// of which warms up only its half, and keeps one file per lane in memory. Only files of READER_MIN_BYTES or more
// go through the reader thread: for short recordings the second thread costs more than it saves (measured, below).
// Each lane takes the next task as soon as it can use it (one task ahead when its reader is busy with a large file,
// so the reader never waits); results arrive in completion order and the caller places them by index, so the
// tables do not depend on scheduling. Once the caller's `stop` signal is aborted no task is handed out, the tasks
// handed out finish, and runTasks returns. A worker that dies (e.g. out of memory) fails only the tasks it held and is
// replaced.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { ReaderThread, readWorkerFile } from '../node/reader-thread';
import { processRecording, type RecordingResult, type RecordingTask } from './process-recording';

export const WORKER_BUNDLE = 'batch-worker.cjs';

/** What a batch worker is told when it starts. */
export interface BatchWorkerData {
  /** the reader bundle for this lane's reader thread, or null: the worker reads its files itself */
  readerFile: string | null;
  /** files from this size on go to the reader thread */
  readerMinBytes: number;
}

/**
 * The bundled worker file next to the running bundle (dist/cli.cjs -> dist/batch-worker.cjs). The CLI ships
 * bundled, so the worker must be the bundle too; `null` when not running from a bundle (pass a file instead).
 */
export function defaultWorkerFile(): string | null {
  const dir = typeof __dirname === 'string' ? __dirname : null;
  if (!dir) return null;
  const f = join(dir, WORKER_BUNDLE);
  return existsSync(f) ? f : null;
}

/**
 * The lanes for `jobs` threads: per lane, whether it has a reader thread (lane 0 is the main thread).
 * When most of the bytes are in recordings of READER_MIN_BYTES or more (`pairs`), threads go in pairs (analysis +
 * reader), an odd one as a lane of its own. Otherwise readers would idle, so every lane reads its own files; one
 * thread's worth is left to V8's compiler and garbage-collector threads, which keep about a core busy beside the
 * JavaScript threads (measured here: on 2 cores, two such lanes took 1.9-2.2 s for 20 short recordings, one lane
 * 1.4-1.6 s). Only with --jobs 2 and a set of TWO_SHORT_LANES_MIN_BYTES or more (`bytes`: all the tasks' bytes) do
 * both threads get a lane, as the second lane's start is then repaid.
 */
export function planLanes(jobs: number, tasks: number, pairs: boolean, bytes = 0): boolean[] {
  const n = Math.max(1, Math.floor(jobs));
  if (!pairs) {
    const lanes = n >= 3 ? n - 1 : n === 2 && bytes >= TWO_SHORT_LANES_MIN_BYTES ? 2 : 1;
    return Array.from({ length: Math.max(1, Math.min(tasks, lanes)) }, () => false);
  }
  const lanes: boolean[] = [];
  let left = n;
  while (left > 0 && lanes.length < tasks) {
    const pair = left >= 2;
    lanes.push(pair);
    left -= pair ? 2 : 1;
  }
  return lanes.length ? lanes : [false];
}

/**
 * With --jobs 2 and short recordings only, a second lane (a batch worker) pays off once the set holds this many bytes:
 * it costs about a second of CPU to start and warm up. Measured here (2 vCPUs, quiet machine, 5-minute recordings of
 * 0.62 MB, two runs each, one lane / two lanes): 40 files 2.13-2.19 / 2.25-2.27 s, 100 files 4.13-4.20 / 3.63-3.67 s,
 * 200 files 7.50-7.65 / 5.81-5.84 s.
 */
export const TWO_SHORT_LANES_MIN_BYTES = 40_000_000;

/**
 * Files from this size on are parsed in the lane's reader thread; smaller ones are read by the analysis thread itself.
 * Measured here (npm run bench, 2 vCPUs): handing 1.3 MB files (10 min at 100 Hz) to a reader thread made a batch
 * slower than reading them in place (the second thread's start, warm-up and messages cost more than the parsing it
 * takes over), 7.8 MB files (60 min) gained 13 %, a 199 MB file 25 %.
 */
export const READER_MIN_BYTES = 4_000_000;

/**
 * One lane: takes tasks until there are none. Files of READER_MIN_BYTES or more go to the lane's reader thread
 * (started at the first such file) with the next one read ahead; smaller files are read and analysed here, one
 * at a time. `take` returns the next task, or null (also as a promise, for a worker waiting for its next task).
 */
export async function runLane(
  take: () => RecordingTask | null | Promise<RecordingTask | null>,
  complete: (r: RecordingResult) => void,
  readerFile: string | null,
  readerMinBytes: number = READER_MIN_BYTES,
): Promise<void> {
  let reader: ReaderThread | null = null;
  const inFlight = new Set<Promise<void>>();
  try {
    for (let t = await take(); t !== null; t = await take()) {
      const task = t;
      const big = readerFile !== null && task.bytes >= readerMinBytes;
      if (big && !reader) reader = new ReaderThread(readerFile);
      if (big && reader?.usable) {
        const p: Promise<void> = processRecording(task, reader!).then(complete);
        inFlight.add(p);
        void p.finally(() => inFlight.delete(p));
        if (inFlight.size >= 2) await Promise.race(inFlight);
      } else {
        await Promise.all(inFlight);
        complete(await processRecording(task, null));
      }
    }
    await Promise.all(inFlight);
  } finally {
    if (reader) void reader.close();
  }
}

/** What the lanes of one runTasks call share: the task list, the index of the next task to hand out, the workers. */
interface SharedQueue {
  tasks: readonly RecordingTask[];
  /** index of the next task to hand out */
  next: number;
  /** set when the batch ends early with an error: no more tasks are handed out, no more results passed on */
  failed: boolean;
  /** set when the caller stops the batch (Ctrl-C): no more tasks are handed out; those handed out finish */
  stopped: boolean;
  workers: Worker[];
  readerMinBytes: number;
}

export async function runTasks(
  tasks: readonly RecordingTask[],
  jobs: number,
  onResult: (r: RecordingResult) => void,
  workerFile: string | null = defaultWorkerFile(),
  readerFile: string | null = readWorkerFile(),
  readerMinBytes: number = READER_MIN_BYTES,
  stop: AbortSignal | null = null,
): Promise<void> {
  if (!tasks.length || stop?.aborted) return;
  const bytes = tasks.reduce((a, t) => a + t.bytes, 0);
  const lanes = planLanes(jobs, tasks.length, readerFile !== null && mostBytesInLargeFiles(tasks, bytes, readerMinBytes), bytes);
  if (lanes.length > 1 && !workerFile) throw new Error(`the worker bundle ${WORKER_BUNDLE} was not found next to the CLI; run \`npm run build\``);
  const queue: SharedQueue = { tasks, next: 0, failed: false, stopped: false, workers: [], readerMinBytes };
  await new Promise<void>((resolve, reject) => {
    const complete = resultHandler(queue, onResult, resolve, reject);
    stop?.addEventListener('abort', () => {
      queue.stopped = true;
      complete(null);
    }, { once: true });
    // the main thread's lane
    runLane(() => (queue.failed || queue.stopped || queue.next >= tasks.length ? null : tasks[queue.next++]!), complete, lanes[0] ? readerFile : null, readerMinBytes).catch((e: unknown) => {
      queue.failed = true;
      reject(e);
    });
    for (let k = 1; k < lanes.length; k++) startWorker(queue, complete, workerFile!, lanes[k] ? readerFile : null);
  });
}

/** Whether at least half of the bytes are in recordings large enough for the reader thread (then threads go in pairs). */
function mostBytesInLargeFiles(tasks: readonly RecordingTask[], total: number, readerMinBytes: number): boolean {
  const big = tasks.reduce((a, t) => a + (t.bytes >= readerMinBytes ? t.bytes : 0), 0);
  return total > 0 && big >= 0.5 * total;
}

/**
 * The function every lane calls with a result: passes it to `onResult` and resolves once every task has one, or,
 * once stopped, every task handed out (null: no result, only that check, when the stop arrives).
 * A failure of the caller's own handler (e.g. the manifest cannot be written) ends the batch with that error.
 */
function resultHandler(
  queue: SharedQueue, onResult: (r: RecordingResult) => void, resolve: () => void, reject: (e: unknown) => void,
): (r: RecordingResult | null) => void {
  let done = 0;
  return (r: RecordingResult | null) => {
    if (queue.failed) return;
    if (r) {
      try {
        onResult(r);
      } catch (e) {
        queue.failed = true;
        for (const w of queue.workers) void w.terminate();
        reject(e);
        return;
      }
      done++;
    }
    if (done === queue.tasks.length || (queue.stopped && done === queue.next)) resolve();
  };
}

/**
 * Starts a batch worker as one lane: it is given tasks from the queue (two at a time when it has a reader thread,
 * so the reader never waits) until none are left. If it dies, the tasks it held fail and a new worker takes its place.
 */
function startWorker(queue: SharedQueue, complete: (r: RecordingResult) => void, file: string, laneReader: string | null): void {
  const data: BatchWorkerData = { readerFile: laneReader, readerMinBytes: queue.readerMinBytes };
  const w = new Worker(file, { workerData: data });
  queue.workers.push(w);
  const depth = laneReader ? 2 : 1;
  const held = new Map<number, RecordingTask>();
  let finished = false;
  const give = () => {
    while (!queue.failed && !queue.stopped && held.size < depth && queue.next < queue.tasks.length) {
      const t = queue.tasks[queue.next++]!;
      held.set(t.index, t);
      w.postMessage(t);
    }
    if (held.size === 0) {
      finished = true;
      void w.terminate();
    }
  };
  w.on('message', (r: RecordingResult) => {
    held.delete(r.index);
    complete(r);
    give();
  });
  const died = (why: string) => {
    if (finished) return;
    finished = true;
    for (const t of held.values()) complete(workerStoppedResult(t, why));
    held.clear();
    void w.terminate();
    if (!queue.failed && !queue.stopped && queue.next < queue.tasks.length) startWorker(queue, complete, file, laneReader);
  };
  w.on('error', (e) => died(e.message.replace(/[\r\n]+/g, ' ')));
  w.on('exit', (code) => died(`exit code ${code}`));
  give();
}

/** The failed result of a task held by a worker that stopped (`why`: its error message or exit code). */
function workerStoppedResult(t: RecordingTask, why: string): RecordingResult {
  return {
    index: t.index, status: 'failed', resumed: false, size: null, sha256: null,
    error: { code: 'internal', message: `${t.recording}: the worker stopped (${why}) (please report it)` },
    rows: null, breaths_found: null, breaths_ok: null, elapsed_s: 0,
  };
}
