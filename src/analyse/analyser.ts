// Streaming analysis: sample blocks in, breath rows out. Memory holds only the calibration window (first
// `calibration_s` seconds) and then the samples of the breaths still in progress, never the whole recording.
//
// Stages (each its own module): calibrate (offset, sign, delay, response) -> segment (breaths from flow) ->
// align (delay, response compensation) -> decompose (capnogram metrics) -> quality (reason codes) -> summary.

import type { Settings } from '../settings';
import type { BreathRow, SampleBlock } from '../types';
import { deconvolveFirstOrder, interpolateAt, scratchFor, type DeconvolveScratch } from './align';
import { calibrate, type Calibration } from './calibrate';
import { createBreathWorkspace } from './breath-workspace';
import { decomposeBreath, type BreathDecomposition, type BreathSignals } from './decompose';
import { fitInspiratoryFall, lowerBound } from './fall-fit';
import { inspirationReversalTime } from './flow-reversal';
import { checkBreath, co2GridStep, markOutliers, statusOf, usableForSummary } from './quality';
import { createSegmenter, type BreathBounds, type Segmenter } from './segment';
import { countFinite, median, medianPositiveStep } from '../numeric/stats';

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
  /** recording-level cautions (e.g. a delay that cannot be trusted); listed in summary.json recording_cautions and
   *  the terminal summary. None are set yet. */
  recording_cautions?: { code: string; message: string }[];
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
  return new StreamAnalyser(settings, onBreath ?? null);
}

class StreamAnalyser implements Analyser {
  private readonly cfg: Settings['analysis'];
  // calibration window
  private readonly calT = new Growable();
  private readonly calF = new Growable();
  private readonly calC = new Growable();
  private cal: Calibration | null = null;
  private totalSamples = 0;
  private firstT = NaN;
  private lastT = NaN;
  private medianDt = NaN;

  // streaming state
  private readonly bt = new Growable();
  private readonly bf = new Growable();
  private readonly bc = new Growable();
  /** absolute index of bt[0] */
  private base = 0;
  /** next absolute index */
  private absNext = 0;
  private segmenter: Segmenter | null = null;
  private readonly pending: BreathBounds[] = [];
  private readonly rows: BreathRow[] = [];
  private readonly recentVt: number[] = [];
  private readonly breathDelays: number[] = [];
  private partial = 0;
  private segments = 0;
  private inSegment = false;
  private scratch: DeconvolveScratch | null = null;
  private fastBuf = new Float64Array(0);
  private rawBuf = new Float64Array(0);
  private readonly workspace = createBreathWorkspace();
  /** ripple floor: min_volume_fraction x running median tidal volume (updated per breath) */
  private minVolumeMl = 0;

  constructor(
    private readonly settings: Settings,
    private readonly onBreath: ((e: BreathEvent) => void) | null,
  ) {
    this.cfg = settings.analysis;
  }

  private setMinVolume(ml: number): void {
    this.minVolumeMl = ml;
    this.segmenter?.setMinVolume(ml);
  }

  private newSegment(): void {
    this.segments++;
    this.inSegment = true;
    this.bt.length = this.bf.length = this.bc.length = 0;
    this.base = this.absNext;
    this.pending.length = 0;
    const c = this.cal!;
    this.segmenter = createSegmenter({
      threshold_lps: this.cfg.flow_threshold_fraction * c.peak_flow_lps,
      min_phase_s: this.cfg.min_phase_s,
      min_volume_ml: this.minVolumeMl,
    });
  }

  private endSegment(): void {
    if (!this.inSegment) return;
    this.flushPending(true);
    if (this.segmenter!.pendingStart()) this.partial++;
    this.partial += this.pending.length;
    this.pending.length = 0;
    this.inSegment = false;
  }

  private needUntil(b: BreathBounds): number {
    const c = this.cal!;
    return b.t_end_s + c.delay_s + 0.7 + 5 * (c.response_ms / 1000);
  }

  private flushPending(force: boolean): void {
    const bt = this.bt;
    const pending = this.pending;
    const lastTime = bt.length ? bt.data[bt.length - 1]! : -Infinity;
    while (pending.length && (force || lastTime >= this.needUntil(pending[0]!))) {
      const b = pending.shift()!;
      if (lastTime < b.t_end_s + this.cal!.delay_s + 0.05) {
        this.partial++;
        continue;
      }
      this.analyseBreath(b);
    }
    // drop samples no longer needed
    const keepFrom = Math.min(
      pending.length ? pending[0]!.i_insp : Infinity,
      this.segmenter ? this.segmenter.oldestNeeded() : Infinity,
      this.absNext,
    );
    // four samples before the oldest sample still needed, and as many more as a negative delay reaches back
    let keepLocal = keepFrom - this.base;
    const delay = this.cal ? this.cal.delay_s : 0;
    if (delay < 0 && keepLocal >= 0 && keepLocal < bt.length) keepLocal = Math.min(keepLocal, lowerBound(bt.view(), bt.view()[keepLocal]! + delay));
    const drop = Math.max(0, keepLocal - 4);
    if (drop > 50_000 || (drop > 0 && drop > bt.length / 2)) {
      bt.dropFront(drop);
      this.bf.dropFront(drop);
      this.bc.dropFront(drop);
      this.base += drop;
    }
  }

  private analyseBreath(b: BreathBounds): void {
    const c = this.cal!;
    const cfg = this.cfg;
    const base = this.base;
    const tau = c.response_ms / 1000;
    const tv = this.bt.view();
    // three samples before the inspiration, and as many more as a negative delay reaches back
    const i0 = Math.max(0, Math.min(b.i_insp - base, lowerBound(tv, b.t_insp_s + Math.min(0, c.delay_s))) - 3);
    const tNeed = this.needUntil(b);
    const i1 = Math.min(this.bt.length, lowerBound(tv, tNeed) + 2);
    const t = tv.subarray(i0, i1);
    const f = this.bf.view().subarray(i0, i1);
    const co2 = this.bc.view().subarray(i0, i1);
    // per-breath buffers are reused (the signals handed to onBreath are valid during the call only)
    const scratch = (this.scratch = scratchFor(this.scratch, t.length));
    if (this.fastBuf.length < t.length) this.fastBuf = new Float64Array(2 * t.length);
    if (this.rawBuf.length < t.length) this.rawBuf = new Float64Array(2 * t.length);
    const dec = deconvolveFirstOrder(t, co2, tau, scratch);
    const fast = interpolateAt(dec.t, dec.x, t, c.delay_s, this.fastBuf);
    const raw = interpolateAt(t, co2, t, c.delay_s, this.rawBuf);
    const reversal = inspirationReversalTime(t, f, b.t_end_s, c.ripple);
    const fall = fitInspiratoryFall(t, co2, reversal + c.delay_s - 0.35, reversal + c.delay_s + 0.65);
    const breathDelay = fall ? fall.t0_s - reversal : NaN;
    if (fall) this.breathDelays.push(breathDelay);
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
    const rows = this.rows;
    const d = decomposeBreath(signals, { breath: rows.length + 1, delay_s: c.delay_s, tau_s: tau, settings: cfg, workspace: this.workspace, keep_geometry: this.onBreath !== null });
    // NaN in the aligned CO2 inside the breath means the CO2 channel was missing there
    for (let i = signals.i_insp; i < signals.i_end; i++) {
      if (Number.isNaN(fast[i]!)) {
        if (!d.flags.includes('gap')) d.flags.push('gap');
        break;
      }
    }
    const flags = checkBreath(
      {
        row: d.row, geometry: d.geometry, flags: d.flags, breath_delay_s: breathDelay, delay_s: c.delay_s, median_dt_s: this.medianDt,
        co2_grid_mmhg: co2GridStep(co2),
      },
      cfg,
    );
    d.row.delay_measured_s = breathDelay;
    d.row.flags = flags;
    d.row.status = statusOf(flags);
    rows.push(d.row);
    if (d.row.vt_exp_ml > 0) {
      const recentVt = this.recentVt;
      recentVt.push(d.row.vt_exp_ml);
      if (recentVt.length > 15) recentVt.shift();
      if (recentVt.length >= 5) this.setMinVolume(cfg.min_volume_fraction * median(recentVt));
    }
    this.onBreath?.({ decomposition: d, signals });
  }

  private feed(t: number, fFile: number, co2: number): void {
    const c = this.cal!;
    const f = c.sign * (fFile - c.offset_lps);
    if (Number.isNaN(f) || Number.isNaN(co2)) {
      this.endSegment();
      this.absNext++;
      return;
    }
    if (!this.inSegment) this.newSegment();
    this.bt.push(t);
    this.bf.push(f);
    this.bc.push(co2);
    const idx = this.absNext++;
    const done = this.segmenter!.pushOne(t, f, idx);
    const pending = this.pending;
    for (let k = 0; k < done.length; k++) pending.push(done[k]!);
    if (pending.length && t >= this.needUntil(pending[0]!)) this.flushPending(false);
  }

  private startStreaming(): void {
    const t = this.calT.view();
    const f = this.calF.view();
    const co2 = this.calC.view();
    this.medianDt = medianPositiveStep(t, 20_000);
    if (countFinite(co2) < 10) throw new AnalysisInputError('no_co2', 'the CO2 channel has no readable values in the first part of the recording');
    const cal = (this.cal = calibrate(t, f, co2, this.settings));
    this.setMinVolume(Number.isFinite(cal.typical_vt_ml) ? this.cfg.min_volume_fraction * cal.typical_vt_ml : 0);
    this.feedRange(t, f, co2, 0, t.length);
    this.calT.length = this.calF.length = this.calC.length = 0;
  }

  private feedRange(ts: ArrayLike<number>, fs: ArrayLike<number>, cs: ArrayLike<number>, from: number, to: number): void {
    for (let i = from; i < to; i++) this.feed(ts[i]!, fs[i]!, cs[i]!);
  }

  /** Adds samples to the calibration window until it spans calibration_s; returns the index after the last taken. */
  private collect(ts: ArrayLike<number>, fs: ArrayLike<number>, cs: ArrayLike<number>, from: number, to: number): number {
    const span = this.cfg.calibration_s;
    for (let i = from; i < to; i++) {
      this.calT.push(ts[i]!);
      this.calF.push(fs[i]!);
      this.calC.push(cs[i]!);
      if (ts[i]! - this.calT.data[0]! >= span) return i + 1;
    }
    return to;
  }

  push(block: SampleBlock): void {
    const n = block.n;
    this.totalSamples += n;
    if (n > 0) {
      if (Number.isNaN(this.firstT)) this.firstT = block.t_s[0]!;
      this.lastT = block.t_s[n - 1]!;
    }
    let i = 0;
    if (!this.cal) {
      i = this.collect(block.t_s, block.flow_lps, block.co2_mmhg, 0, n);
      const full = this.calT.length > 0 && block.t_s[i - 1]! - this.calT.data[0]! >= this.cfg.calibration_s;
      if (full) this.startStreaming();
    }
    if (this.cal) this.feedRange(block.t_s, block.flow_lps, block.co2_mmhg, i, n);
  }

  finish(): AnalysisCore {
    if (!this.cal) {
      if (this.calT.length < 10) throw new AnalysisInputError('too_short', 'the recording has too few samples to analyse');
      this.startStreaming();
    }
    this.endSegment();
    const rows = this.rows;
    markOutliers(rows, this.cfg);
    for (const r of rows) r.status = statusOf(r.flags);
    const c = this.cal!;
    return {
      recording_cautions: [...calibrationCautions(c, this.medianDt), ...endTidalCautions(rows, this.settings)],
      breaths: rows,
      calibration: this.cal!,
      partial_breaths: this.partial,
      segments: this.segments,
      samples: this.totalSamples,
      duration_s: this.lastT - this.firstT,
      median_dt_s: this.medianDt,
      breath_delays_s: this.breathDelays,
    };
  }
}

/** A median gap between the default PETCO2 and the last expired reading above this (mmHg) is reported. */
const PHASE3_BEND_MMHG = 1;

/**
 * A recording caution when phase III bends near the end of expiration: the default PETCO2 (the phase III line at the
 * end of expiration, `petco2_method` `line_end`) then departs from the gas at the end of expiration (the last expired
 * reading), e.g. when a slow region with high PCO2 empties last, and the arterial–end-tidal gradient depends on which
 * one is meant. Medians over the breaths the summary uses; only with the default method.
 */
function endTidalCautions(rows: readonly BreathRow[], settings: Settings): { code: string; message: string }[] {
  if (settings.analysis.petco2_method !== 'line_end') return [];
  const used = rows.filter((r) => usableForSummary(r, { summary_breaths: settings.analysis.summary_breaths }));
  const line = median(used.map((r) => r.petco2_mmhg));
  const last = median(used.map((r) => r.petco2_last_mmhg));
  if (!(Math.abs(last - line) > PHASE3_BEND_MMHG)) return [];
  return [{
    code: 'phase3_end_bends',
    message:
      `phase III bends near the end of expiration: the last expired reading (median ${last.toFixed(1)} mmHg) lies ` +
      `${Math.abs(last - line).toFixed(1)} mmHg ${last > line ? 'above' : 'below'} the default PETCO2, the phase III line at the end of expiration ` +
      `(${line.toFixed(1)} mmHg); the arterial–end-tidal gradient differs by as much; \`--petco2 last\` reports the gas itself (petco2_last_mmhg)`,
  }];
}

/** Below this flow sampling rate (Hz) the recording carries the caution low_sampling_rate (docs/accuracy.md). */
const LOW_RATE_HZ = 50;

/** Smallest disagreement between a given and the measured delay that is reported, s. */
const GIVEN_DELAY_TOLERANCE_S = 0.01;

/** Airway dead-space uncertainty, mL, as text, from a delay known to ± half a sample interval at `flow_lps`: flow × dt / 2
 *  (derived here). */
function deadSpaceSpread(flow_lps: number, dt: number): string {
  const ml = 500 * flow_lps * dt;
  return ml < 10 ? ml.toFixed(1) : ml.toFixed(0);
}

/**
 * Recording-level cautions: a flow sampling rate below 50 Hz, valve edges within one sample (the delay is then known
 * to about half an interval only), a delay the breaths do not agree on, and a given delay that the CO2
 * downstrokes contradict (beyond max(3 standard errors, 2 samples, 10 ms) of the delay they show).
 */
function calibrationCautions(c: Calibration, dt: number): { code: string; message: string }[] {
  const out: { code: string; message: string }[] = [];
  const rate = 1 / dt;
  if (rate < LOW_RATE_HZ) {
    out.push({
      code: 'low_sampling_rate',
      message:
        `flow is sampled at ${rate.toFixed(rate < 10 ? 1 : 0)} Hz: below ${LOW_RATE_HZ} Hz the CO2 front passes the sensor within one or two samples; on ` +
        'simulated recordings exported at 25 Hz airway dead space was off by up to 6 % (fast expirations, sidestream sensors) and a fast ' +
        'infant pattern gave no usable breaths (docs/accuracy.md); record at 100 Hz or faster',
    });
  }
  if (c.delay_origin !== 'given' && c.edge_samples <= 1) {
    const half = (500 * dt).toFixed(0);
    out.push({
      code: 'valve_edge_unresolved',
      message:
        `the inspiratory flow edges pass within one sample interval (${(1000 * dt).toFixed(0)} ms): the samples hold their area but not ` +
        `where they start, so the CO2 delay is known only to about ± ${half} ms and airway dead space to about ± (expiratory flow at ` +
        `phase II × ${half} ms): here to at most about ± ${deadSpaceSpread(c.peak_flow_lps, dt)} mL (typical peak flow ` +
        `${c.peak_flow_lps.toFixed(2)} L/s); on simulated 50 Hz exports of fast pressure-controlled ` +
        'breathing it read 6 % low (docs/accuracy.md); record at 100 Hz or faster, or give --delay if it is known',
    });
  }
  if (!c.delay_trusted) {
    out.push({
      code: 'delay_untrusted',
      message:
        `the breaths do not agree on one CO2 transport delay (${(100 * c.delay_agreement).toFixed(0)} % in the largest cluster); ` +
        'volumes of the dead spaces depend on it: give --delay if it is known',
    });
  }
  const se = Number.isFinite(c.delay_data_uncertainty_s) ? c.delay_data_uncertainty_s : 0;
  const tolerance = Math.max(3 * se, 2 * dt, GIVEN_DELAY_TOLERANCE_S);
  if (c.delay_origin === 'given' && c.delay_data_trusted && Number.isFinite(c.delay_data_s) && Math.abs(c.delay_s - c.delay_data_s) > tolerance) {
    out.push({
      code: 'given_delay_disagrees',
      message:
        `the given CO2 delay ${c.delay_s.toFixed(3)} s disagrees with the ${c.delay_data_s.toFixed(3)} s ` +
        `(± ${se.toFixed(3)} s) that the inspiratory CO2 downstrokes show: ` +
        'the dead-space volumes depend on it; check the value or leave --delay out to use the measured one',
    });
  }
  return out;
}
