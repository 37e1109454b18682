/// <reference lib="webworker" />
// The reader worker, started by the analysis worker (worker.ts) for each analysis: reads and parses the File with the
// shared byte reader (read-file.ts) and posts its sample blocks, so that parsing (here) and the per-breath analysis
// (there) run on two cores, as the command line does. Backpressure: at most MAX_IN_FLIGHT blocks wait in the analysis
// worker; the next chunk of the file is read only after it has acknowledged enough of them.

import { readRecording } from './read-file';
import type { ReaderIn, ReaderOut } from './protocol';

declare const self: DedicatedWorkerGlobalScope;

const MAX_IN_FLIGHT = 4;
let inFlight = 0;
let wake: (() => void) | null = null;

function post(msg: ReaderOut, transfer: Transferable[] = []): void {
  self.postMessage(msg, transfer);
}

async function room(): Promise<void> {
  while (inFlight >= MAX_IN_FLIGHT) await new Promise<void>((r) => (wake = r));
}

self.onmessage = async (ev: MessageEvent<ReaderIn>) => {
  const m = ev.data;
  if (m.type === 'ack') {
    inFlight--;
    const w = wake;
    wake = null;
    w?.();
    return;
  }
  try {
    const report = await readRecording(
      m.file,
      m.settings.ingest,
      m.settings.analysis.min_rate_hz,
      {
        onLayout: (layout, head) => post({ type: 'layout', layout, head }),
        onSampleCount: (samples) => post({ type: 'count', samples }),
        onBlock: (block) => {
          inFlight++;
          post({ type: 'block', block }, [block.t_s.buffer, block.flow_lps.buffer, block.co2_mmhg.buffer]);
        },
        onProgress: (bytes) => post({ type: 'progress', bytes }),
      },
      room,
      m.companions,
    );
    post({ type: 'done', report });
  } catch (e) {
    const err = e as { message?: string; code?: string };
    post({ type: 'error', message: String(err?.message ?? e), code: typeof err?.code === 'string' ? err.code : 'internal' });
  }
};
