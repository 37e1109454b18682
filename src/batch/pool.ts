// Runs recording tasks, `jobs` at a time: the main thread analyses too, beside jobs - 1 worker threads
// (node:worker_threads), so one job needs no worker and N jobs start only N - 1 copies of the bundle.
// Each thread takes the next task as soon as it is free; results arrive in completion order and the caller places
// them by index, so the tables do not depend on scheduling. A worker that dies (e.g. out of memory) fails only its
// current task and is replaced.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { processRecording, type RecordingResult, type RecordingTask } from './process-recording.js';

export const WORKER_BUNDLE = 'batch-worker.cjs';

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

export async function runTasks(
  tasks: readonly RecordingTask[],
  jobs: number,
  onResult: (r: RecordingResult) => void,
  workerFile: string | null = defaultWorkerFile(),
): Promise<void> {
  if (jobs <= 1 || tasks.length <= 1) {
    for (const t of tasks) onResult(await processRecording(t));
    return;
  }
  if (!workerFile) throw new Error(`the worker bundle ${WORKER_BUNDLE} was not found next to the CLI; run \`npm run build\``);
  const file = workerFile;
  let next = 0;
  let done = 0;
  await new Promise<void>((resolve) => {
    const complete = (r: RecordingResult) => {
      onResult(r);
      if (++done === tasks.length) resolve();
    };
    const start = () => {
      const w = new Worker(file);
      let current: RecordingTask | null = null;
      let finished = false;
      const give = () => {
        if (next >= tasks.length) {
          finished = true;
          void w.terminate();
          return;
        }
        current = tasks[next++]!;
        w.postMessage(current);
      };
      w.on('message', (r: RecordingResult) => {
        current = null;
        complete(r);
        give();
      });
      const died = (why: string) => {
        if (finished) return;
        finished = true;
        const t = current as RecordingTask | null;
        current = null;
        if (t) {
          complete({
            index: t.index, status: 'failed', resumed: false, size: null, sha256: null,
            error: { code: 'internal', message: `${t.recording}: the worker stopped (${why}) (please report it)` },
            rows: null, breaths_found: null, breaths_ok: null, elapsed_s: 0,
          });
        }
        void w.terminate();
        if (next < tasks.length) start();
      };
      w.on('error', (e) => died(e.message.replace(/[\r\n]+/g, ' ')));
      w.on('exit', (code) => died(`exit code ${code}`));
      give();
    };
    const n = Math.min(jobs, tasks.length) - 1;
    for (let k = 0; k < n; k++) start();
    // the main thread's share
    void (async () => {
      while (next < tasks.length) complete(await processRecording(tasks[next++]!));
    })();
  });
}
