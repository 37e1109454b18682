// Worker-thread entry of the batch pool, bundled to dist/batch-worker.cjs (scripts/build.mjs).
// Runs one lane (src/batch/pool.ts runLane) over the tasks the pool sends (at most two waiting at a time) and answers
// each with its RecordingResult.
import { parentPort, workerData } from 'node:worker_threads';
import type { BatchWorkerData } from './pool';
import { runLane } from './pool';
import type { RecordingTask } from './process-recording';

const port = parentPort;
if (port) {
  const data = workerData as BatchWorkerData | null;
  const readerFile = data?.readerFile ?? null;
  const queue: RecordingTask[] = [];
  let wake: (() => void) | null = null;
  port.on('message', (task: RecordingTask) => {
    queue.push(task);
    wake?.();
  });
  // the pool ends the worker (terminate) when it has no more tasks for it, so the lane waits for ever otherwise
  const take = async (): Promise<RecordingTask> => {
    while (!queue.length) await new Promise<void>((r) => (wake = r));
    wake = null;
    return queue.shift()!;
  };
  void runLane(take, (r) => port.postMessage(r), readerFile, data?.readerMinBytes);
}
