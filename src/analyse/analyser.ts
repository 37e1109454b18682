// Streaming analysis: sample blocks in, breath rows out. Memory holds only the calibration window (first
// `calibration_s` seconds) and then the samples of the breaths still in progress, never the whole recording.
//
// Stages (each its own module): calibrate (offset, sign, delay, response) -> segment (breaths from flow) ->
// align (delay, response compensation) -> decompose (capnogram metrics) -> quality (reason codes) -> summary.

import type { Settings } from '../settings.js';
import type { BreathRow, SampleBlock } from '../types.js';
import { deconvolveFirstOrder, interpolateAt, scratchFor, type DeconvolveScratch } from './align.js';
import { calibrate, type Calibration } from './calibrate.js';
import { decomposeBreath, type BreathDecomposition, type BreathSignals } from './decompose.js';
import { fitInspiratoryFall, lowerBound } from './fall-fit.js';
import { checkBreath, markOutliers, statusOf } from './quality.js';
import { createSegmenter, type BreathBounds, type Segmenter } from './segment.js';
import { median } from './stats.js';

export interface AnalysisCore {
  breaths: BreathRow[];
  calibration: Calibration;
  /** breaths cut by the start or end of the recording or by a gap (not analysed, counted) */
  partial_breaths: number;
  segments: number;
  samples: number;
  duration_s: number;
  median_dt_s: number;
  /** per-breath delay estimates (s), for the spread */
  breath_delays_s: number[];
}

export interface BreathEvent {
  decomposition: BreathDecomposition;
  /** the breath's samples; the arrays are reused for the next breath, so copy what you keep */
  signals: BreathSignals;
}

export interface Analyser {
  push(block: SampleBlock): void;
  finish(): AnalysisCore;
}

class Growable {
  data: Float64Array;
  length = 0;
  constructor(cap = 4096) {
    this.data = new Float64Array(cap);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  dropFront(k: number): void {
    this.data.copyWithin(0, k, this.length);
    this.length -= k;
  }
  view(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}

export class AnalysisInputError extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
  }
}

/**
 * Creates a streaming analyser. `onBreath` (optional) receives every decomposed breath with its signals, for
 * viewers; the analyser itself keeps only the breath rows.
 */
export function createAnalyser(settings: Settings, onBreath?: (e: BreathEvent) => void): Analyser {
  const cfg = settings.analysis;
  // calibration window
  const calT = new Growable();
  const calF = new Growable();
  const calC = new Growable();
  let cal: Calibration | null = null;
  let totalSamples = 0;
  let firstT = NaN;
  let lastT = NaN;
  let medianDt = NaN;

  // streaming state
  const bt = new Growable();
  const bf = new Growable();
  const bc = new Growable();
  let base = 0; // absolute index of bt[0]
  let absNext = 0; // next absolute index
  let segmenter: Segmenter | null = null;
  const pending: BreathBounds[] = [];
  const rows: BreathRow[] = [];
  const recentVt: number[] = [];
  const breathDelays: number[] = [];
  let partial = 0;
  let segments = 0;
  let inSegment = false;
  let scratch: DeconvolveScratch | null = null;
  let fastBuf = new Float64Array(0);
  let rawBuf = new Float64Array(0);
  let minVolumeMl = 0; // ripple floor: min_volume_fraction x running median tidal volume (updated per breath)

  function newSegment(): void {
    segments++;
    inSegment = true;
    bt.length = bf.length = bc.length = 0;
    base = absNext;
    pending.length = 0;
    const c = cal!;
    segmenter = createSegmenter({
      threshold_lps: cfg.flow_threshold_fraction * c.peak_flow_lps,
      min_phase_s: cfg.min_phase_s,
      min_volume_ml: () => minVolumeMl,
    });
  }

  function endSegment(): void {
    if (!inSegment) return;
    flushPending(true);
    if (segmenter!.pendingStart()) partial++;
    partial += pending.length;
    pending.length = 0;
    inSegment = false;
  }

  function needUntil(b: BreathBounds): number {
    const c = cal!;
    return b.t_end_s + c.delay_s + 0.7 + 5 * (c.response_ms / 1000);
  }

  function flushPending(force: boolean): void {
    const lastTime = bt.length ? bt.data[bt.length - 1]! : -Infinity;
    while (pending.length && (force || lastTime >= needUntil(pending[0]!))) {
      const b = pending.shift()!;
      if (lastTime < b.t_end_s + cal!.delay_s + 0.05) {
        partial++;
        continue;
      }
      analyseBreath(b);
    }
    // drop samples no longer needed
    const keepFrom = Math.min(
      pending.length ? pending[0]!.i_insp : Infinity,
      segmenter ? segmenter.oldestNeeded() : Infinity,
      absNext,
    );
    const drop = Math.max(0, keepFrom - 4 - base);
    if (drop > 50_000 || (drop > 0 && drop > bt.length / 2)) {
      bt.dropFront(drop);
      bf.dropFront(drop);
      bc.dropFront(drop);
      base += drop;
    }
  }

  function analyseBreath(b: BreathBounds): void {
    const c = cal!;
    const tau = c.response_ms / 1000;
    const i0 = Math.max(0, b.i_insp - base - 3);
    const tNeed = needUntil(b);
    const tv = bt.view();
    const i1 = Math.min(bt.length, lowerBound(tv, tNeed) + 2);
    const t = tv.subarray(i0, i1);
    const f = bf.view().subarray(i0, i1);
    const co2 = bc.view().subarray(i0, i1);
    // per-breath buffers are reused (the signals handed to onBreath are valid during the call only)
    scratch = scratchFor(scratch, t.length);
    if (fastBuf.length < t.length) fastBuf = new Float64Array(2 * t.length);
    if (rawBuf.length < t.length) rawBuf = new Float64Array(2 * t.length);
    const dec = deconvolveFirstOrder(t, co2, tau, scratch);
    const fast = interpolateAt(dec.t, dec.x, t, c.delay_s, fastBuf);
    const raw = interpolateAt(t, co2, t, c.delay_s, rawBuf);
    const fall = fitInspiratoryFall(t, co2, b.t_end_s + c.delay_s - 0.35, b.t_end_s + c.delay_s + 0.65);
    const breathDelay = fall ? fall.t0_s - b.t_end_s : NaN;
    if (fall) breathDelays.push(breathDelay);
    const signals: BreathSignals = {
      t_s: t,
      flow_lps: f,
      fast_mmhg: fast,
      raw_mmhg: raw,
      i_insp: b.i_insp - base - i0,
      i_exp: b.i_exp - base - i0,
      i_end: b.i_end - base - i0,
      t_insp_s: b.t_insp_s,
      t_exp_s: b.t_exp_s,
      t_end_s: b.t_end_s,
      insp_abrupt: b.insp_abrupt,
      exp_abrupt: b.exp_abrupt,
    };
    const d = decomposeBreath(signals, { breath: rows.length + 1, delay_s: c.delay_s, tau_s: tau, settings: cfg });
    // NaN in the aligned CO2 inside the breath means the CO2 channel was missing there
    for (let i = signals.i_insp; i < signals.i_end; i++) {
      if (!(fast[i]! === fast[i]!)) {
        if (!d.flags.includes('gap')) d.flags.push('gap');
        break;
      }
    }
    const flags = checkBreath(
      { row: d.row, geometry: d.geometry, flags: d.flags, breath_delay_s: breathDelay, delay_s: c.delay_s, median_dt_s: medianDt },
      cfg,
    );
    d.row.delay_measured_s = breathDelay;
    d.row.flags = flags;
    d.row.status = statusOf(flags);
    rows.push(d.row);
    if (d.row.vt_exp_ml > 0) {
      recentVt.push(d.row.vt_exp_ml);
      if (recentVt.length > 15) recentVt.shift();
      if (recentVt.length >= 5) minVolumeMl = cfg.min_volume_fraction * median(recentVt);
    }
    onBreath?.({ decomposition: d, signals });
  }

  function feed(t: number, fFile: number, co2: number): void {
    const c = cal!;
    const f = c.sign * (fFile - c.offset_lps);
    if (!(f === f) || !(co2 === co2)) {
      endSegment();
      absNext++;
      return;
    }
    if (!inSegment) newSegment();
    bt.push(t);
    bf.push(f);
    bc.push(co2);
    const idx = absNext++;
    const done = segmenter!.pushOne(t, f, idx);
    for (let k = 0; k < done.length; k++) pending.push(done[k]!);
    if (pending.length && t >= needUntil(pending[0]!)) flushPending(false);
  }

  function startStreaming(): void {
    const t = calT.view();
    const f = calF.view();
    const co2 = calC.view();
    const finite: number[] = [];
    for (let i = 1; i < t.length && finite.length < 20_000; i++) {
      const d = t[i]! - t[i - 1]!;
      if (d > 0) finite.push(d);
    }
    medianDt = median(finite);
    let co2Seen = 0;
    for (let i = 0; i < co2.length; i++) if (co2[i]! === co2[i]!) co2Seen++;
    if (co2Seen < 10) throw new AnalysisInputError('no_co2', 'the CO2 channel has no readable values in the first part of the recording');
    cal = calibrate(t, f, co2, settings);
    minVolumeMl = Number.isFinite(cal.typical_vt_ml) ? cfg.min_volume_fraction * cal.typical_vt_ml : 0;
    for (let i = 0; i < t.length; i++) feed(t[i]!, f[i]!, co2[i]!);
    calT.length = calF.length = calC.length = 0;
  }

  return {
    push(block) {
      const n = block.n;
      totalSamples += n;
      if (n > 0) {
        if (!(firstT === firstT)) firstT = block.t_s[0]!;
        lastT = block.t_s[n - 1]!;
      }
      for (let i = 0; i < n; i++) {
        if (cal) {
          feed(block.t_s[i]!, block.flow_lps[i]!, block.co2_mmhg[i]!);
          continue;
        }
        calT.push(block.t_s[i]!);
        calF.push(block.flow_lps[i]!);
        calC.push(block.co2_mmhg[i]!);
        if (block.t_s[i]! - calT.data[0]! >= cfg.calibration_s) startStreaming();
      }
    },
    finish() {
      if (!cal) {
        if (calT.length < 10) throw new AnalysisInputError('too_short', 'the recording has too few samples to analyse');
        startStreaming();
      }
      endSegment();
      markOutliers(rows, cfg);
      for (const r of rows) r.status = statusOf(r.flags);
      return {
        breaths: rows,
        calibration: cal!,
        partial_breaths: partial,
        segments,
        samples: totalSamples,
        duration_s: lastT - firstT,
        median_dt_s: medianDt,
        breath_delays_s: breathDelays,
      };
    },
  };
}
