/// <reference lib="webworker" />
// The analysis worker: has the File read and parsed by a reader worker of its own (read-worker.ts; here when workers
// cannot start workers), runs the same core as the CLI on the blocks (createAnalyser), keeps the samples for the
// overview chart and the per-breath geometry for the breath view, and posts progress and results. The page never
// parses the recording.

import { createAnalyser, parseGasCsv, sniffTable, type AnalysisCore, type IngestReport, type Settings, composeOutputs, type ComposedOutputs } from '../src/index';
import { splitFields } from '../src/ingest/split-fields';
import { GeometryWriter, transferables } from './geometry-store';
import { packRows, rowTransferables } from './row-columns';
import type { FromWorker, ReaderIn, ReaderOut, ToWorker } from './protocol';
import { isSignalsName, readHead, readRecording, readSignalsHead, type ReadCallbacks } from './read-file';
import { SignalStore } from './signal-store';

declare const self: DedicatedWorkerGlobalScope;

/** Data rows shown in the mapping step. */
const PREVIEW_ROWS = 12;

let store: SignalStore | null = null;
let display = { sign: 1, offset: 0 };
/** the last analysis, kept for recomputing the outputs after exclusions or a blood-gas file */
let last: { core: AnalysisCore; report: IngestReport; settings: Settings; given: Set<string> } | null = null;

function composed(excluded: Map<number, string>, gas: Parameters<typeof composeOutputs>[5]): ComposedOutputs {
  const { rows: _rows, ...rest } = composeOutputs(last!.core, last!.report, last!.settings, last!.given, excluded, gas);
  return rest;
}

function post(msg: FromWorker, transfer: Transferable[] = []): void {
  self.postMessage(msg, transfer);
}

function errorOf(e: unknown): { message: string; code: string } {
  const err = e as { message?: string; code?: string };
  return { message: String(err?.message ?? e).split('\n')[0]!, code: typeof err?.code === 'string' ? err.code : 'internal' };
}

async function sniff(file: File, companions: File[], settings: Settings): Promise<void> {
  if (isSignalsName(file.name)) return sniffSignals(file, companions, settings);
  const head = await readHead(file, settings.ingest.encoding);
  const layout = sniffTable(head, settings.ingest, settings.analysis.min_rate_hz, file.name);
  const lines = head.split(layout.line_end === '\r' ? '\r' : '\n');
  const rows: string[][] = [];
  const numbers: number[] = [];
  for (let k = layout.data_start_index; k < lines.length - 1 && rows.length < PREVIEW_ROWS; k++) {
    const l = lines[k]!.replace(/\r$/, '');
    if (l.trim() === '') continue;
    rows.push(splitFields(l, layout.delimiter) ?? [l]);
    numbers.push(k + 1);
  }
  post({ type: 'sniffed', preview: { layout, header: layout.header, rows, lines: numbers } });
}

/** A recording of signals (EDF/BDF, WFDB): its data signals (labels as the "columns") and the reader's choice. */
async function sniffSignals(file: File, companions: File[], settings: Settings): Promise<void> {
  const { signals, layout } = await readSignalsHead(file, companions, settings.ingest, settings.analysis.min_rate_hz);
  post({ type: 'sniffed', preview: { layout, header: signals.map((s) => s.label), signals, rows: [], lines: [] } });
}

async function analyse(file: File, companions: File[], settings: Settings, given: string[]): Promise<void> {
  const totalBytes = file.size + companions.reduce((n, f) => n + f.size, 0);
  const started = performance.now();
  const geometry = new GeometryWriter();
  const analyser = createAnalyser(settings, (e) => geometry.add(e.decomposition.geometry));
  let s: SignalStore | null = null;
  let lastPost = 0;
  const callbacks: ReadCallbacks = {
    onLayout: (layout, head) => {
      // preallocate from the head's characters per data row so a 24-hour file does not grow its arrays
      const lines = head.split(layout.line_end);
      const data = lines.slice(layout.data_start_index, -1);
      const chars = data.reduce((n, l) => n + l.length + 1, 0);
      const perRow = data.length ? chars / data.length : 20;
      s = new SignalStore((1.02 * file.size) / Math.max(4, perRow) + 1024);
    },
    onSampleCount: (n) => {
      s = new SignalStore(n);
    },
    onBlock: (b) => {
      s!.append(b.t_s, b.flow_lps, b.co2_mmhg, b.n);
      analyser.push(b);
    },
    onProgress: (bytes) => {
      const now = performance.now();
      if (now - lastPost > 100 || bytes === totalBytes) {
        lastPost = now;
        post({ type: 'progress', bytes, total: totalBytes, breaths: geometry.count });
      }
    },
  };
  const report =
    typeof Worker === 'function'
      ? await readInReaderWorker(file, companions, settings, callbacks)
      : await readRecording(file, settings.ingest, settings.analysis.min_rate_hz, callbacks, undefined, companions);
  const core = analyser.finish();
  const sig = s! as SignalStore;
  sig.finalize();
  store = sig;
  const c = core.calibration;
  display = { sign: c.sign, offset: c.offset_lps };
  const r = sig.ranges();
  const f0 = c.sign * (r.flow[0] - c.offset_lps);
  const f1 = c.sign * (r.flow[1] - c.offset_lps);
  const packed = geometry.pack();
  last = { core, report, settings, given: new Set(given) };
  const outputs = composed(new Map(), null);
  const { breaths, ...coreRest } = core;
  const rows = packRows(breaths);
  post(
    {
      type: 'done',
      core: coreRest,
      rows,
      report,
      geometry: packed,
      outputs,
      sign: c.sign,
      offset_lps: c.offset_lps,
      t_first_s: sig.firstTime,
      t_last_s: sig.lastTime,
      flow_range: [Math.min(f0, f1), Math.max(f0, f1)],
      co2_range: r.co2,
      worker_ms: performance.now() - started,
      posted_epoch_ms: performance.timeOrigin + performance.now(),
    },
    [...transferables(packed), ...rowTransferables(rows)],
  );
}

/**
 * Reads the file in a reader worker of its own (read-worker.ts) while this worker analyses the blocks: the same
 * blocks, in the same order, as reading here (the exports are compared with the command line's in the browser tests).
 */
function readInReaderWorker(file: File, companions: File[], settings: Settings, cb: ReadCallbacks): Promise<IngestReport> {
  const reader = new Worker(new URL('./read-worker.ts', import.meta.url), { type: 'module' });
  const send = (m: ReaderIn) => reader.postMessage(m);
  return new Promise<IngestReport>((resolve, reject) => {
    const finish = (f: () => void) => {
      reader.terminate();
      f();
    };
    reader.onmessage = (ev: MessageEvent<ReaderOut>) => {
      const m = ev.data;
      try {
        if (m.type === 'block') {
          cb.onBlock(m.block);
          send({ type: 'ack' });
        } else if (m.type === 'layout') cb.onLayout?.(m.layout, m.head);
        else if (m.type === 'count') cb.onSampleCount?.(m.samples);
        else if (m.type === 'progress') cb.onProgress?.(m.bytes);
        else if (m.type === 'done') finish(() => resolve(m.report));
        else finish(() => reject(Object.assign(new Error(m.message), { code: m.code })));
      } catch (e) {
        finish(() => reject(e));
      }
    };
    reader.onerror = (ev) => finish(() => reject(new Error(`the reader worker stopped: ${ev.message || 'unknown error'}`)));
    send({ type: 'read', file, companions, settings });
  });
}

self.onmessage = async (ev: MessageEvent<ToWorker>) => {
  const m = ev.data;
  try {
    if (m.type === 'sniff') await sniff(m.file, m.companions, m.settings);
    else if (m.type === 'analyse') await analyse(m.file, m.companions, m.settings, m.given);
    else if (m.type === 'compose') {
      if (!last) throw new Error('no analysis to recompute');
      const t0 = performance.now();
      const outputs = composed(new Map(m.excluded), m.gas);
      post({ type: 'composed', id: m.id, outputs, ms: performance.now() - t0 });
    }
    else if (m.type === 'window') {
      const data = store ? store.window(m.t0, m.t1, m.columns, display.sign, display.offset) : { t_s: [], flow_lps: [], co2_mmhg: [], decimated: false };
      post({ type: 'window', id: m.id, data });
    } else if (m.type === 'gas') {
      const text = await m.file.text();
      // clock times go on the analysed recording's own clock when it has one, else on the 'recording start' field
      const recording = last ? { clock_start: last.report.clock_start ?? null, duration_s: last.core.duration_s } : { clock_start: null };
      const result = parseGasCsv(text, m.file.name, { ...(m.start ? { start: m.start } : {}), recording, start_option: "the 'recording start' field" });
      post({ type: 'gas', result, file: m.file.name });
    }
  } catch (e) {
    const stage = m.type === 'window' || m.type === 'compose' ? 'analyse' : m.type;
    post({ type: 'error', stage, ...errorOf(e) });
  }
};
