// Worker-thread entry of the batch pool, bundled to dist/batch-worker.cjs (scripts/build.mjs).
// Receives tasks (at most two at a time when it has a reader thread: one analysed, one being read) and answers each
// with its RecordingResult.
import { parentPort, workerData } from 'node:worker_threads';
import { ReaderThread } from '../node/reader-thread.js';
import type { BatchWorkerData } from './pool.js';
import { processRecording, type RecordingTask } from './process-recording.js';

const port = parentPort;
if (port) {
  const readerFile = (workerData as BatchWorkerData | null)?.readerFile ?? null;
  const reader = readerFile ? new ReaderThread(readerFile) : null;
  port.on('message', (task: RecordingTask) => {
    void processRecording(task, reader?.usable ? reader : null).then((r) => port.postMessage(r));
  });
}
