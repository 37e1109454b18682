// Worker-thread entry of the batch pool, bundled to dist/batch-worker.cjs (scripts/build.mjs).
// Receives one RecordingTask at a time and answers with its RecordingResult.
import { parentPort } from 'node:worker_threads';
import { processRecording, type RecordingTask } from './process-recording.js';

const port = parentPort;
if (port) {
  port.on('message', (task: RecordingTask) => {
    void processRecording(task).then((r) => port.postMessage(r));
  });
}
