// Calibration from the first minutes of a recording: flow offset, sign of expiration, transport delay and the CO2
// sensor's response time constant. All four can be given instead (then they are only checked, not estimated).

import { detExp } from '../numeric/det-math';
import type { Settings } from '../settings';
import type { SettingOrigin } from '../types';
import { fitInspiratoryFall, type FallFit } from './fall-fit';
import { mad, median, medianStep, quantile } from '../numeric/stats';
import { createSegmenter, type BreathBounds } from './segment';
import { edgeSampleCount, inspirationReversalTime, rippleRestSpan } from './flow-reversal';
import { restsOscillate, type RestSpan } from './ripple-baseline';
import { robustDelay } from './robust-delay';

export interface Calibration {
  /** multiply (file flow - offset) by this to get expiration positive */
  sign: 1 | -1;
  sign_origin: SettingOrigin;
  /** flow offset in the file's sign convention, L/s */
  offset_lps: number;
  offset_origin: SettingOrigin;
  /** where the offset came from: still flow at end-inspiration, at end-expiration, both, given, or none found */
  offset_source: OffsetSource | 'given' | 'none';
  /** standard error of the estimated offset, L/s (NaN when given or not found) */
  offset_uncertainty_lps: number;
  delay_s: number;
  delay_origin: SettingOrigin;
  response_ms: number;
  /** standard error of the estimated time constant, ms (1.2533 × 1.4826 × MAD / √n of the per-breath fits; NaN when
   *  given or with fewer than 3 fits) */
  response_uncertainty_ms: number;
  response_origin: SettingOrigin;
  /** typical peak flow magnitude (95th percentile of |flow|), L/s */
  peak_flow_lps: number;
  /** typical tidal volume, mL */
  typical_vt_ml: number;
  /** spread (interquartile range) of per-breath delay estimates in the calibration window, s */
  delay_iqr_s: number;
  /** standard error of the estimated delay, s (NaN when given or not estimable) */
  delay_uncertainty_s: number;
  /** share of the calibration breaths whose downstroke agrees with the delay (its cluster) */
  delay_agreement: number;
  /** false when the per-breath delays do not agree on one value (no cluster holds most breaths) */
  delay_trusted: boolean;
  /** the delay the CO2 downstrokes show (densest cluster), s, also when a delay was given (NaN: none measurable) */
  delay_data_s: number;
  /** its standard error, s, and whether its cluster holds most breaths */
  delay_data_uncertainty_s: number;
  delay_data_trusted: boolean;
  /** median number of samples on the inspiratory valve edges of the calibration breaths (edgeSampleCount; NaN: none) */
  edge_samples: number;
  fall_fits: number;
  /** whether the end-expiratory rests carry cardiogenic flow oscillation; then each inspiration's onset is the kink
   *  where its own rise leaves the oscillation (flow-reversal.ts) */
  ripple: boolean;
  notes: string[];
}

/** Where a flow offset estimate came from. */
export type OffsetSource = 'end_inspiratory_pause' | 'end_expiratory_rest';

/** The decaying end of one phase of a breath (sample index range, end exclusive) and which phase it ends. */
export interface DecaySpan {
  from: number;
  to: number;
  kind: 'end_inspiratory' | 'end_expiratory';
}

/** Offset estimate: the median level, how many phase ends gave one, its standard error and where it came from. */
export interface OffsetEstimate {
  offset: number;
  spans: number;
  uncertainty_lps: number;
  source: OffsetSource;
}

/** Candidate decay time constants of a phase end, s (log-spaced 0.02-5 s). */
const DECAY_TAUS: number[] = Array.from({ length: 36 }, (_, k) => 0.02 * Math.pow(250, k / 35));

/**
 * Flow zero offset from the ends of the breath's phases (end-inspiratory pauses; end-expiratory stretches only when
 * no breath has such a pause). After the peak of each phase, flow decays towards zero:
 * abruptly into an inspiratory pause (square flow), exponentially in a decelerating inspiration or a passive
 * expiration, or into an end-expiratory rest. Each phase end from a tenth of its peak flow onwards is fitted with
 *   f(t) = c + A exp(-(t - t_s)/tau)
 * (tau from a log grid, c and A by linear least squares): c is where the flow settles, the sensor's zero. A still
 * stretch gives tau small and c its mean level; a slowly decaying tail that looks level within noise is modelled
 * instead of being taken for zero flow. A fit counts when it has at least 8 samples, its residual RMS is below
 * max(3 x sample noise, 1.5 % of peak flow) (a non-exponential shape such as the end of a half-sine inspiration
 * fails) and the modelled tail has fallen below 1 % of peak flow by the phase end (c is measured, not extrapolated).
 * The offset is the median of c over phase ends (common practice, no source for the zero-flow principle; the decay
 * model is derived here from the single-compartment passive expiration, flow ∝ exp(-t/RC)).
 * Returns null when fewer than 30 % of the breaths (or fewer than 3 phase ends) give a fit: no correction then.
 */
export function estimateFlowOffset(
  t: ArrayLike<number>,
  flow: ArrayLike<number>,
  spans: DecaySpan[],
  breaths: number,
): OffsetEstimate | null {
  const n = flow.length;
  const peak = quantile(absValues(flow), 0.95);
  if (!(peak > 0) || n < 10) return null;
  // sample-to-sample noise of flow near zero (robust: MAD of first differences / sqrt 2)
  const d1: number[] = [];
  for (let i = 1; i < n && d1.length < 50_000; i++) {
    if (Math.abs(flow[i]!) < 0.05 * peak && Math.abs(flow[i - 1]!) < 0.05 * peak) d1.push(Math.abs(flow[i]! - flow[i - 1]!));
  }
  const noiseSd = d1.length ? (1.4826 * median(d1)) / Math.SQRT2 : 0;
  const maxRms = Math.max(3 * noiseSd, 0.015 * peak);
  const levelsOf = (kind: DecaySpan['kind']): number[] => {
    const levels: number[] = [];
    for (const sp of spans) {
      if (sp.kind !== kind) continue;
      const fit = fitDecay(t, flow, sp.from, sp.to);
      if (fit && fit.rms <= maxRms && Math.abs(fit.tailEnd) < 0.01 * peak) levels.push(fit.level);
    }
    return levels;
  };
  // end-inspiratory pauses are the cleaner zero; end-expiratory stretches are fitted and used only when too few
  // breaths have such a pause
  const enough = (levels: number[]) => levels.length >= 3 && levels.length >= 0.3 * breaths;
  const insp = levelsOf('end_inspiratory');
  const fromInsp = enough(insp);
  const values = fromInsp ? insp : levelsOf('end_expiratory');
  if (!enough(values)) return null;
  const offset = median(values);
  const spread = 1.4826 * median(values.map((v) => Math.abs(v - offset)));
  return {
    offset,
    spans: values.length,
    uncertainty_lps: (1.2533 * spread) / Math.sqrt(values.length),
    source: fromInsp ? 'end_inspiratory_pause' : 'end_expiratory_rest',
  };
}

/** Least-squares fit of c + A exp(-(t - t_from)/tau) over samples [from, to): tau from the grid, then refined by a
 *  golden-section search between the grid neighbours of the best grid value (a coarse tau would bias c). */
function fitDecay(t: ArrayLike<number>, flow: ArrayLike<number>, from: number, to: number): { level: number; tailEnd: number; rms: number } | null {
  if (to - from < 8) return null;
  let bestK = -1;
  let bestSse = Infinity;
  for (let k = 0; k < DECAY_TAUS.length; k++) {
    const fit = decayFitAt(t, flow, from, to, DECAY_TAUS[k]!);
    if (fit && fit.sse < bestSse) {
      bestSse = fit.sse;
      bestK = k;
    }
  }
  if (bestK < 0) return null;
  let lo = DECAY_TAUS[Math.max(0, bestK - 1)]!;
  let hi = DECAY_TAUS[Math.min(DECAY_TAUS.length - 1, bestK + 1)]!;
  const g = (Math.sqrt(5) - 1) / 2;
  for (let it = 0; it < 25; it++) {
    const a = hi - g * (hi - lo);
    const b = lo + g * (hi - lo);
    const fa = decayFitAt(t, flow, from, to, a)?.sse ?? Infinity;
    const fb = decayFitAt(t, flow, from, to, b)?.sse ?? Infinity;
    if (fa <= fb) hi = b;
    else lo = a;
  }
  const tau = 0.5 * (lo + hi);
  const fit = decayFitAt(t, flow, from, to, tau);
  const best = fit && fit.sse <= bestSse ? fit : decayFitAt(t, flow, from, to, DECAY_TAUS[bestK]!)!;
  return { level: best.level, tailEnd: best.tailEnd, rms: Math.sqrt(best.sse / (to - from)) };
}

/** exp(-(t - t_from)/tau) of the current span, kept between the two passes of decayFitAt. Speed: one exponential per
 *  sample instead of two took `batch --jobs 1` of 40 five-minute recordings from 3.37-3.53 s CPU to 2.79-3.00 s (3 runs each, user + system). */
let decayScratch = new Float64Array(1024);

/** Linear least squares of flow on [1, exp(-(t - t_from)/tau)] for one tau. */
function decayFitAt(t: ArrayLike<number>, flow: ArrayLike<number>, from: number, to: number, tau: number): { level: number; tailEnd: number; sse: number } | null {
  const m = to - from;
  const t0 = t[from]!;
  if (decayScratch.length < m) decayScratch = new Float64Array(2 * m);
  const us = decayScratch;
  let su = 0;
  let suu = 0;
  let sy = 0;
  let suy = 0;
  for (let i = from; i < to; i++) {
    const u = detExp(-(t[i]! - t0) / tau);
    us[i - from] = u;
    const y = flow[i]!;
    su += u;
    suu += u * u;
    sy += y;
    suy += u * y;
  }
  const det = m * suu - su * su;
  if (!(det > 1e-12 * m * m)) return null;
  const amp = (m * suy - su * sy) / det;
  const level = (sy - amp * su) / m;
  let sse = 0;
  for (let i = from; i < to; i++) sse += (flow[i]! - level - amp * us[i - from]!) ** 2;
  return { level, tailEnd: amp * us[m - 1]!, sse };
}

function absValues(a: ArrayLike<number>): Float64Array {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = Math.abs(a[i]!);
  return out;
}

/**
 * Coarse sign of expiration and transport delay from the timing of CO2 edges (common practice, no source; reasoning
 * documented in DEVELOPERS.md). For the right sign, the CO2 falls d seconds after each inspiration onset (d = delay)
 * and rises d + t_I after each expiration onset, where t_I is the short time phase I takes: rise lag - fall lag is
 * small and positive. Read with the wrong sign, "inspiration onsets" are expiration onsets and the same difference
 * becomes Ti - Te + t_I modulo the breath period, i.e. about 2 Ti + t_I when Ti < Te: much larger. So the sign with
 * the smaller non-negative difference wins, and its fall lag is the coarse delay. Only I:E = 1:1 with identical
 * flow shapes leaves the sign undecided (then --expiration is needed; the note says so).
 */
export function signAndLagFromEdges(
  t: Float64Array,
  flow: Float64Array,
  co2: Float64Array,
  thr: number,
  minVolumeMl: number,
  minPhaseS: number,
  signs: (1 | -1)[],
): { sign: 1 | -1; lag: number; gap: number; ambiguous: boolean } | null {
  const lo = quantile(co2, 0.05);
  const hi = quantile(co2, 0.95);
  if (!(hi - lo > 3)) return null;
  const mid = 0.5 * (lo + hi);
  const band = 0.2 * (hi - lo);
  // CO2 edges at the mid level, with hysteresis
  const falls: number[] = [];
  const rises: number[] = [];
  let state = 0;
  for (let i = 1; i < co2.length; i++) {
    const a = co2[i - 1]!;
    const b = co2[i]!;
    if (Number.isNaN(a) || Number.isNaN(b)) continue;
    if (b > mid + band) {
      if (state === -1) rises.push(crossTime(t, co2, i, mid, true));
      state = 1;
    } else if (b < mid - band) {
      if (state === 1) falls.push(crossTime(t, co2, i, mid, false));
      state = -1;
    }
  }
  const results: { sign: 1 | -1; fall: number; rise: number; diff: number }[] = [];
  for (const sign of signs) {
    const signed = new Float64Array(flow.length);
    for (let i = 0; i < flow.length; i++) signed[i] = sign * flow[i]!;
    const bounds = breathBounds(t, signed, thr, minVolumeMl, minPhaseS);
    const fallLags: number[] = [];
    const riseLags: number[] = [];
    for (const b of bounds) {
      const f = firstAfter(falls, b.t_end_s - 0.05);
      const r = firstAfter(rises, b.t_exp_s - 0.05);
      if (f !== null) fallLags.push(f - b.t_end_s);
      if (r !== null) riseLags.push(r - b.t_exp_s);
    }
    if (fallLags.length < 3 || riseLags.length < 3) continue;
    const fall = median(fallLags);
    const rise = median(riseLags);
    // edges are found as "the next one after", so lags live modulo the breath period
    const period = median(bounds.map((b) => b.t_end_s - b.t_insp_s));
    let diff = rise - fall;
    if (period > 0) {
      diff = ((diff % period) + period) % period;
      if (diff > period - 0.05) diff -= period;
    }
    results.push({ sign, fall, rise, diff });
  }
  const valid = results.filter((r) => r.diff > -0.05).sort((a, b) => a.diff - b.diff);
  if (!valid.length) return null;
  const best = valid[0]!;
  const other = valid[1];
  return { sign: best.sign, lag: Math.max(0, best.fall), gap: best.diff, ambiguous: !!other && other.diff - best.diff < 0.1 };
}

function crossTime(t: Float64Array, y: Float64Array, i: number, level: number, rising: boolean): number {
  // walk back to the sample pair that straddles the level
  let j = i;
  while (j > 0 && (rising ? y[j - 1]! >= level : y[j - 1]! <= level)) j--;
  if (j === 0) return t[i]!;
  const a = y[j - 1]!;
  const b = y[j]!;
  return t[j - 1]! + ((level - a) / (b - a)) * (t[j]! - t[j - 1]!);
}

function firstAfter(sorted: number[], x: number): number | null {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (sorted[m]! < x) lo = m + 1;
    else hi = m;
  }
  return lo < sorted.length ? sorted[lo]! : null;
}

/**
 * Coarse delay when the sign is known and the edges are unclear: the lag that puts the least CO2 on the inspiratory
 * side (common practice, no source), shortest lag among near-equal scores.
 */
function lagByInspiredCo2(flow: Float64Array, co2: Float64Array, dt: number, thr: number, sign: 1 | -1, lags: number[]): number {
  const base = quantile(co2, 0.02);
  const n = flow.length;
  const all: { lag: number; ratio: number }[] = [];
  for (const lag of lags) {
    const k = Math.round(lag / dt);
    let insp = 0;
    let exp = 0;
    for (let i = 0; i + k < n; i++) {
      const f = sign * flow[i]!;
      const c = co2[i + k]! - base;
      if (Number.isNaN(c) || Number.isNaN(f)) continue;
      const cc = c > 0 ? c : 0;
      if (f > thr) exp += cc * f;
      else if (f < -thr) insp -= cc * f;
    }
    all.push({ lag, ratio: exp > 0 ? insp / exp : Infinity });
  }
  const best = Math.min(...all.map((r) => r.ratio));
  const near = all.filter((r) => r.ratio <= best * 1.15 + 0.01).sort((a, b) => a.lag - b.lag);
  return (near[0] ?? all[0]!).lag;
}

/** Breaths found by the breath segmenter, run separately on each gap-free run. */
export function breathBounds(t: ArrayLike<number>, flow: ArrayLike<number>, thr: number, minVolumeMl: number, minPhaseS: number): BreathBounds[] {
  const out: BreathBounds[] = [];
  let seg = null as ReturnType<typeof createSegmenter> | null;
  for (let i = 0; i < flow.length; i++) {
    const f = flow[i]!;
    if (Number.isNaN(f) || Number.isNaN(t[i]!)) {
      seg = null;
      continue;
    }
    seg ??= createSegmenter({ threshold_lps: thr, min_phase_s: minPhaseS, min_volume_ml: minVolumeMl });
    for (const b of seg.pushOne(t[i]!, f, i)) out.push(b);
  }
  return out;
}

/**
 * Calibration of one recording from its first minutes: sign of expiration, flow offset, transport delay and sensor
 * response, each given (then only recorded) or estimated, with notes that say what was assumed.
 */
export function calibrate(t: Float64Array, flowFile: Float64Array, co2: Float64Array, settings: Settings): Calibration {
  const a = settings.analysis;
  const notes: string[] = [];
  const dt = medianStep(t, 5000);
  const offsetGiven = a.flow_offset_lps !== null;
  const flow = shifted(flowFile, offsetGiven ? a.flow_offset_lps! : 0);
  const peak = quantile(absValues(flow), 0.95);
  const thr = a.flow_threshold_fraction * peak;
  // typical tidal volume (sign-independent: volumes of the larger flow excursions)
  const typicalVt = typicalTidalVolume(t, flow, thr);
  const minVol = Number.isFinite(typicalVt) ? a.min_volume_fraction * typicalVt : 0;
  const signed = inferSign(t, flow, co2, settings, { dt, thr, minVol }, notes);
  scale(flow, signed.sign);
  const offset = correctOffset(t, flow, signed.sign, settings, { thr, minVol }, notes);
  const timing = estimateTiming(t, flow, co2, settings, { dt, thr, minVol, coarseLag: signed.coarseLag }, notes);
  return {
    sign: signed.sign,
    sign_origin: settings.ingest.expiration !== null ? 'given' : 'inferred',
    ...offset,
    ...timing,
    peak_flow_lps: peak,
    typical_vt_ml: typicalVt,
    notes,
  };
}

interface Grid {
  dt: number;
  thr: number;
  minVol: number;
}

/** Sign of expiration (given, or from the CO2 edges) and the coarse delay those edges give. */
function inferSign(t: Float64Array, flow: Float64Array, co2: Float64Array, settings: Settings, grid: Grid, notes: string[]): { sign: 1 | -1; coarseLag: number } {
  const a = settings.analysis;
  const signGiven = settings.ingest.expiration !== null;
  const signs: (1 | -1)[] = signGiven ? [settings.ingest.expiration === 'negative' ? -1 : 1] : [1, -1];
  const edges = signAndLagFromEdges(t, flow, co2, grid.thr, grid.minVol, a.min_phase_s, signs);
  let sign: 1 | -1 = signs[0]!;
  let coarseLag = 0;
  if (edges) {
    sign = edges.sign;
    coarseLag = edges.lag;
  }
  if (!edges && a.delay_s === null) coarseLag = lagByInspiredCo2(flow, co2, grid.dt, grid.thr, sign, lagGrid(grid.dt, a.max_delay_s));
  if (!signGiven) {
    if (edges) {
      notes.push(
        `expiration sign inferred: ${sign > 0 ? 'positive' : 'negative'} flow is expiration (CO2 falls ${edges.lag.toFixed(2)} s after ` +
          `inspiration starts and rises ${edges.gap.toFixed(2)} s later after expiration starts)` +
          (edges.ambiguous ? '; the breathing pattern leaves this uncertain: give --expiration to be sure' : ''),
      );
    } else notes.push('expiration sign could not be inferred from the CO2 edges; assumed positive: give --expiration');
  }
  return { sign, coarseLag };
}

/** The flow offset (given, or estimated from the settled phase ends and removed from `flow`, expiration positive). */
function correctOffset(
  t: Float64Array,
  flow: Float64Array,
  sign: 1 | -1,
  settings: Settings,
  grid: Pick<Grid, 'thr' | 'minVol'>,
  notes: string[],
): Pick<Calibration, 'offset_lps' | 'offset_origin' | 'offset_source' | 'offset_uncertainty_lps'> {
  const a = settings.analysis;
  if (a.flow_offset_lps !== null) {
    return { offset_lps: a.flow_offset_lps, offset_origin: 'given', offset_source: 'given', offset_uncertainty_lps: NaN };
  }
  const bounds = breathBounds(t, flow, grid.thr, grid.minVol, a.min_phase_s);
  const est = estimateFlowOffset(t, flow, decaySpans(t, flow, bounds), bounds.length);
  if (!est) {
    notes.push(
      'no phase end settles to a steady flow (end-inspiratory pause or end-expiratory rest): flow offset not corrected; set analysis.flow_offset_lps in a settings file if it is known',
    );
    return { offset_lps: 0, offset_origin: 'default', offset_source: 'none', offset_uncertainty_lps: NaN };
  }
  subtract(flow, est.offset);
  // in the file's sign convention
  return { offset_lps: sign * est.offset, offset_origin: 'inferred', offset_source: est.source, offset_uncertainty_lps: est.uncertainty_lps };
}

/**
 * Sensor time constant and transport delay from the per-breath CO2 downstrokes: the densest cluster of the per-breath
 * delays (w: two sample intervals, at least 10 ms), or the given values.
 */
function estimateTiming(
  t: Float64Array,
  flow: Float64Array,
  co2: Float64Array,
  settings: Settings,
  grid: Grid & { coarseLag: number },
  notes: string[],
): Pick<
  Calibration,
  'delay_s' | 'delay_origin' | 'response_ms' | 'response_origin' | 'response_uncertainty_ms' | 'delay_iqr_s' | 'delay_uncertainty_s' | 'delay_agreement' | 'delay_trusted' | 'fall_fits' | 'ripple' | 'delay_data_s' | 'delay_data_uncertainty_s' | 'delay_data_trusted' | 'edge_samples'
> {
  const a = settings.analysis;
  const delayGiven = a.delay_s !== null;
  const bounds = breathBounds(t, flow, grid.thr, grid.minVol, a.min_phase_s);
  const ripple = recordingHasRipple(t, flow, bounds);
  const fits = fallFits(t, flow, co2, bounds, delayGiven ? a.delay_s! : grid.coarseLag, ripple);
  const delaySamples = fits.map((f) => f.delay);
  const edges = fits.map((f) => f.edge).filter(Number.isFinite);
  const taus = fits.map((f) => f.fit.tau_s);
  const responseGiven = a.response_ms !== null;
  const tau = responseGiven ? a.response_ms! / 1000 : taus.length ? Math.max(0, median(taus)) : 0;
  const est = robustDelay(delaySamples, Math.max(0.01, 2 * grid.dt));
  let delay = delayGiven ? a.delay_s! : fits.length ? est.delay_s : grid.coarseLag;
  // a slightly negative delay is real when the export averages flow over each interval and stamps it at the end
  // (flow then lags CO2 by half an interval); more than that is not a transport delay
  if (!delayGiven) delay = Math.max(-1.5 * grid.dt, delay);
  if (!delayGiven && fits.length && !est.trusted) {
    notes.push(
      `the breaths do not agree on one transport delay (only ${(100 * est.share).toFixed(0)} % of ${est.breaths} breaths within ` +
        `the largest cluster): the delay ${delay.toFixed(3)} s cannot be trusted; give --delay if it is known`,
    );
  }
  if (!fits.length) notes.push('no clean inspiratory CO2 downstroke found: delay from the coarse search, response time 0');
  if (!delayGiven && (tau >= 0.035 || delay >= 0.2)) {
    notes.push(
      `the CO2 sensor looks sidestream (delay ${delay.toFixed(2)} s, time constant ${(tau * 1000).toFixed(0)} ms): with regular breathing a ` +
        'delay longer by whole breath periods would fit the signals equally; give --delay if the line delay is known',
    );
  }
  return {
    delay_s: delay,
    delay_origin: delayGiven ? 'given' : 'inferred',
    response_ms: tau * 1000,
    response_uncertainty_ms: !responseGiven && taus.length >= 3 ? (1000 * 1.2533 * 1.4826 * mad(taus)) / Math.sqrt(taus.length) : NaN,
    response_origin: responseGiven ? 'given' : 'inferred',
    delay_iqr_s: delaySamples.length ? quantile(delaySamples, 0.75) - quantile(delaySamples, 0.25) : NaN,
    delay_uncertainty_s: delayGiven ? NaN : est.uncertainty_s,
    delay_agreement: est.share,
    delay_trusted: delayGiven || (fits.length > 0 && est.trusted),
    fall_fits: fits.length,
    ripple,
    delay_data_s: fits.length ? est.delay_s : NaN,
    delay_data_uncertainty_s: est.uncertainty_s,
    delay_data_trusted: fits.length > 0 && est.trusted,
    edge_samples: edges.length ? median(edges) : NaN,
  };
}

/**
 * Whether the end-expiratory rests before the calibration breaths carry cardiogenic oscillation (ripple-baseline.ts;
 * at least 3 rests long enough to tell).
 */
function recordingHasRipple(t: Float64Array, flow: Float64Array, bounds: BreathBounds[]): boolean {
  const spans: RestSpan[] = [];
  for (const b of bounds) {
    const span = rippleRestSpan(t, flow, b.t_end_s);
    if (span) spans.push(span);
  }
  return spans.length >= 3 && restsOscillate(t, flow, spans);
}

// Small array helpers used by calibrate.

function shifted(x: Float64Array, offset: number): Float64Array {
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = x[i]! - offset;
  return out;
}

function scale(x: Float64Array, k: number): void {
  for (let i = 0; i < x.length; i++) x[i] = k * x[i]!;
}

function subtract(x: Float64Array, c: number): void {
  for (let i = 0; i < x.length; i++) x[i] = x[i]! - c;
}

/** Candidate delays 0, dt, 2 dt, ... up to maxDelayS. */
function lagGrid(dt: number, maxDelayS: number): number[] {
  const lags: number[] = [];
  for (let k = 0; k * dt <= maxDelayS + 1e-9; k++) lags.push(k * dt);
  return lags;
}

/**
 * The decaying end of each phase: from where flow has fallen to a tenth of its peak (after the peak) to 20 ms before the
 * next phase starts.
 */
function decaySpans(t: Float64Array, flow: Float64Array, bounds: BreathBounds[]): DecaySpan[] {
  const spans: DecaySpan[] = [];
  for (const b of bounds) {
    spans.push({ from: tenthPeakAfter(flow, b.i_insp, b.i_exp, -1), to: lastBefore(t, b.i_exp, b.t_exp_s - 0.02), kind: 'end_inspiratory' });
    spans.push({ from: tenthPeakAfter(flow, b.i_exp, b.i_end, 1), to: lastBefore(t, b.i_end, b.t_end_s - 0.02), kind: 'end_expiratory' });
  }
  return spans;
}

/** First index after the phase's peak (sign: -1 inspiration, +1 expiration) where |flow| is at most 10 % of it. */
function tenthPeakAfter(flow: Float64Array, from: number, to: number, sign: 1 | -1): number {
  let k = from;
  for (let i = from; i < to; i++) if (sign * flow[i]! > sign * flow[k]!) k = i;
  const tenth = 0.1 * sign * flow[k]!;
  while (k < to && sign * flow[k]! > tenth) k++;
  return k;
}

/** End (exclusive) of the samples before time x, searching back from index i. */
function lastBefore(t: Float64Array, i: number, x: number): number {
  let k = Math.min(i, t.length);
  while (k > 0 && t[k - 1]! > x) k--;
  return k;
}

/** The inspiratory CO2 fall of each breath, searched from `lag` - 0.35 s after its inspiration onset. */
function fallFits(
  t: Float64Array, flow: Float64Array, co2: Float64Array, bounds: BreathBounds[], lag: number, ripple: boolean,
): { delay: number; fit: FallFit; edge: number }[] {
  const fits: { delay: number; fit: FallFit; edge: number }[] = [];
  for (const b of bounds) {
    const tr = inspirationReversalTime(t, flow, b.t_end_s, ripple);
    const lo = tr + lag - 0.35;
    const fit = fitInspiratoryFall(t, co2, Math.max(tr - 0.05, lo), lo + 1.0);
    if (fit) fits.push({ delay: fit.t0_s - tr, fit, edge: edgeSampleCount(t, flow, b.t_end_s) });
  }
  return fits;
}

/** Median volume of the larger flow excursions of either sign (mL), used only to set the ripple floor. */
function typicalTidalVolume(t: Float64Array, flow: Float64Array, thr: number): number {
  const vols: number[] = [];
  let v = 0;
  let dir = 0;
  for (let i = 1; i < flow.length; i++) {
    const f0 = flow[i - 1]!;
    const f1 = flow[i]!;
    if (Number.isNaN(f0) || Number.isNaN(f1)) {
      dir = 0;
      v = 0;
      continue;
    }
    const d = f1 > thr ? 1 : f1 < -thr ? -1 : dir;
    if (d !== dir) {
      if (dir !== 0) vols.push(Math.abs(v));
      v = 0;
      dir = d;
    }
    v += 500 * (f0 + f1) * (t[i]! - t[i - 1]!);
  }
  const big = vols.filter((x) => x > 0.25 * quantile(vols, 0.9));
  return big.length ? median(big) : NaN;
}
