// Breath quality codes. Each code is either an exclusion (the breath's numbers are impossible or wrong: it is left
// out of every summary) or a caution (the numbers are sound but the reader should know the condition: the breath
// stays in the summaries, flagged). A breath is `ok` when no code applies, `caution:<codes>` when only cautions
// apply, and excluded otherwise (status = its codes joined with '+'). Every consumer decides with one predicate,
// usableForSummary. Codes are our own short names; thresholds are settings (src/settings.ts).

import type { AnalysisSettings } from '../settings';
import type { BreathRow } from '../types';
import type { BreathGeometry } from './decompose';
import { quantileSorted } from '../numeric/stats';

/** Every reason code with its meaning (the README table is generated from this list). */
export const REASON_CODES: Record<string, string> = {
  short_exp: 'expiration too short or too small to analyse',
  no_phase3: 'no usable phase III (too few points or too little volume after phase II)',
  poor_fit: 'phase III regression fits poorly (residual RMS above max_phase3_rms_mmhg or R² below min_phase3_r2)',
  no_fowler: "Fowler's construction has no valid solution for this breath",
  leak: 'caution: inspired and expired tidal volumes differ by more than leak_fraction (up to max_leak_fraction)',
  large_leak: 'inspired and expired tidal volumes differ by more than max_leak_fraction',
  rebreathing: 'caution: mean inspired PCO2 above rebreathing_mmhg (the formulas carry the inspired term)',
  outlier: 'tidal volume or breath duration far from its neighbours (more than outlier_mad robust deviations)',
  co2_clipped: 'CO2 holds a flat top at its maximum while gas still flows out and phase III would rise above it (sensor range or clipping)',
  low_co2: 'end-tidal PCO2 below min_petco2_mmhg (no real capnogram: disconnection, sampling line blocked)',
  implausible: 'negative or implausible values (CO2 above max_co2_mmhg or well below zero)',
  gap: 'breath touches a gap or skipped rows',
  delay_uncertain: "caution: this breath's CO2 downstroke disagrees with the delay used by more than delay_spread_s, or has none",
  co2_quantised: 'caution: CO2 readings lie on a grid of quantised_co2_mmhg or coarser (e.g. whole mmHg, 0.1 kPa = 0.75 mmHg)',
};

/** Codes that keep the breath in the summaries (flagged); every other code excludes it. */
export const CAUTION_CODES: ReadonlySet<string> = new Set(['leak', 'rebreathing', 'delay_uncertain', 'co2_quantised']);

/** Which breaths the summaries use: ok and caution breaths (default) or ok breaths only (setting summary_breaths). */
export type SummaryBreaths = AnalysisSettings['summary_breaths'];

export type BreathQuality = 'ok' | 'caution' | 'excluded';

/** ok (no code), caution (caution codes only) or excluded (at least one other code, e.g. excluded_by_user). */
export function breathQuality(flags: readonly string[]): BreathQuality {
  if (flags.length === 0) return 'ok';
  for (const f of flags) if (!CAUTION_CODES.has(f)) return 'excluded';
  return 'caution';
}

/** The class a status value stands for (statusOf writes `ok`, `caution:<codes>` or the excluding codes). */
export function qualityOfStatus(status: string): BreathQuality {
  if (status === 'ok') return 'ok';
  return status.startsWith('caution:') ? 'caution' : 'excluded';
}

/**
 * The one predicate every summary uses (medians, trends, gas windows, PaCO2 estimates, batch tables, viewer): ok
 * breaths, and caution breaths unless summary_breaths is 'ok_only'. Decided from the status, so that rows read back
 * from breaths.csv and rows the reviewer excluded (status excluded_by_user:...) are judged alike.
 */
export function usableForSummary(
  row: { readonly status: string },
  opts: { readonly summary_breaths?: SummaryBreaths | undefined } = {},
): boolean {
  const q = qualityOfStatus(row.status);
  return q === 'ok' || (q === 'caution' && opts.summary_breaths !== 'ok_only');
}

export interface BreathCheckInput {
  row: BreathRow;
  geometry: BreathGeometry;
  flags: string[];
  /** delay measured on this breath's own inspiratory downstroke (NaN if none) */
  breath_delay_s: number;
  /** delay used for alignment */
  delay_s: number;
  median_dt_s: number;
  /** step of the grid the breath's raw CO2 readings lie on, mmHg (0 = none found; see co2GridStep) */
  co2_grid_mmhg: number;
}

/** Adds the per-breath codes that need only this breath; returns the full list. */
export function checkBreath(input: BreathCheckInput, cfg: AnalysisSettings): string[] {
  const { row, geometry: g } = input;
  const flags = [...input.flags];
  const add = (c: string) => {
    if (!flags.includes(c)) flags.push(c);
  };
  const vmax = Math.max(row.vt_insp_ml, row.vt_exp_ml);
  const leak = vmax > 0 ? Math.abs(row.vt_insp_ml - row.vt_exp_ml) / vmax : 0;
  if (leak > cfg.max_leak_fraction) add('large_leak');
  else if (leak > cfg.leak_fraction) add('leak');
  if (row.fico2_mmhg > cfg.rebreathing_mmhg) add('rebreathing');
  if (g.max_co2_mmhg > 0 && clippedTop(g, row.v_phase3_start_ml, input.co2_grid_mmhg)) add('co2_clipped');
  if (input.co2_grid_mmhg >= cfg.quantised_co2_mmhg) add('co2_quantised');
  if (g.max_co2_mmhg > cfg.max_co2_mmhg || g.min_co2_mmhg < -5 || !(row.vt_exp_ml > 0)) add('implausible');
  if (Number.isFinite(row.petco2_mmhg) && row.petco2_mmhg < cfg.min_petco2_mmhg) add('low_co2');
  if (!Number.isFinite(row.petco2_mmhg) && g.max_co2_mmhg < cfg.min_petco2_mmhg) add('low_co2');
  if (g.max_dt_s > 2.5 * input.median_dt_s) add('gap');
  if (!Number.isFinite(input.breath_delay_s) || Math.abs(input.breath_delay_s - input.delay_s) > cfg.delay_spread_s) {
    add('delay_uncertain');
  }
  return flags;
}

/**
 * Outlier breaths: tidal volume or duration more than `outlier_mad` scaled MADs (1.4826 x MAD) from the median of
 * the surrounding `half` breaths on each side (robust statistics; Hampel-type filter, common practice, no source).
 */
export function markOutliers(rows: BreathRow[], cfg: AnalysisSettings, half = 10): void {
  const vt = Float64Array.from(rows, (r) => r.vt_exp_ml);
  const dur = Float64Array.from(rows, (r) => r.t_end_s - r.t_start_s);
  const win = new Float64Array(2 * half);
  const dev = new Float64Array(2 * half);
  for (let i = 0; i < rows.length; i++) {
    const lo = Math.max(0, i - half);
    const hi = Math.min(rows.length, i + half + 1);
    if (hi - lo < 5) continue;
    for (const series of [vt, dur]) {
      let n = 0;
      for (let j = lo; j < hi; j++) if (j !== i && Number.isFinite(series[j]!)) win[n++] = series[j]!;
      if (n === 0) continue;
      const m = quantileSorted(win.subarray(0, n).sort(), 0.5);
      for (let k = 0; k < n; k++) dev[k] = Math.abs(win[k]! - m);
      const spread = 1.4826 * quantileSorted(dev.subarray(0, n).sort(), 0.5);
      const floor = 0.05 * Math.abs(m);
      if (Math.abs(series[i]! - m) > cfg.outlier_mad * Math.max(spread, floor)) {
        if (!rows[i]!.flags.includes('outlier')) rows[i]!.flags.push('outlier');
      }
    }
  }
}

/** One readable value per breath: `ok`, `caution:<codes>` or the codes that exclude it (with any cautions). */
export function statusOf(flags: readonly string[]): string {
  const q = breathQuality(flags);
  if (q === 'ok') return 'ok';
  return q === 'caution' ? `caution:${flags.join('+')}` : flags.join('+');
}

/**
 * Step of the grid the CO2 readings lie on, mmHg, or 0 when they are not on one. Readings exported in whole mmHg,
 * 0.1 kPa or 0.1 % lie on a grid whatever their offset, so every non-zero difference between consecutive readings is
 * a whole multiple of the smallest one. Needs at least 8 non-zero differences; a multiple may miss by 5 % of the
 * step (rounding of unit conversions). Derived here.
 */
export function co2GridStep(co2: ArrayLike<number>): number {
  let step = Infinity;
  let n = 0;
  for (let i = 1; i < co2.length; i++) {
    const d = Math.abs(co2[i]! - co2[i - 1]!);
    if (d > 1e-9) {
      n++;
      if (d < step) step = d;
    }
  }
  if (n < 8 || !Number.isFinite(step)) return 0;
  for (let i = 1; i < co2.length; i++) {
    const d = Math.abs(co2[i]! - co2[i - 1]!);
    if (!(d > 1e-9)) continue;
    const r = d / step;
    if (Math.abs(r - Math.round(r)) > 0.05) return 0;
  }
  return step;
}

/**
 * Clipping, from the signal (derived here; a flat top alone is no evidence when the readings are quantised): the
 * expired CO2 holds its top value (within half a grid step) for at least 5 samples in a row, and phase III would rise
 * above it: a line fitted to phase III before that flat top, extended to its end, lies more than max(grid step,
 * 0.5 mmHg) + 2 x the line's residual RMS above the top. When fewer than 4 phase III samples lie below the top (the
 * top is reached before or at the start of phase III), phase III shows no rise at all and the flat top counts as
 * clipping. Quantised readings of a rising phase III step up through the grid and end within a step of the line,
 * so they do not count.
 */
export function clippedTop(g: BreathGeometry, vPhase3StartMl: number, gridMmhg: number): boolean {
  const v = g.v_ml;
  const p = g.co2_raw_mmhg;
  const n = Math.min(v.length, p.length);
  if (n < 5) return false;
  let top = -Infinity;
  for (let j = 0; j < n; j++) if (p[j]! > top) top = p[j]!;
  const tol = Math.max(0.5 * gridMmhg, 1e-6);
  // longest run (in samples) at the top
  let best = 0;
  let bestStart = -1;
  for (let j = 0, run = 0; j < n; j++) {
    if (p[j]! >= top - tol) {
      run++;
      if (run > best) {
        best = run;
        bestStart = j - run + 1;
      }
    } else run = 0;
  }
  if (best < 5) return false;
  const runEnd = bestStart + best - 1;
  const from = Number.isFinite(vPhase3StartMl) ? vPhase3StartMl : 0.5 * v[n - 1]!;
  // least-squares line through phase III samples before the run that lie below the top
  let k = 0;
  let sv = 0;
  let sp = 0;
  for (let j = 0; j < bestStart; j++) {
    if (v[j]! < from || p[j]! >= top - tol) continue;
    k++;
    sv += v[j]!;
    sp += p[j]!;
  }
  if (k < 4) return true;
  const mv = sv / k;
  const mp = sp / k;
  let svv = 0;
  let svp = 0;
  for (let j = 0; j < bestStart; j++) {
    if (v[j]! < from || p[j]! >= top - tol) continue;
    svv += (v[j]! - mv) ** 2;
    svp += (v[j]! - mv) * (p[j]! - mp);
  }
  if (!(svv > 0)) return true;
  const b = svp / svv;
  let ss = 0;
  for (let j = 0; j < bestStart; j++) {
    if (v[j]! < from || p[j]! >= top - tol) continue;
    ss += (p[j]! - mp - b * (v[j]! - mv)) ** 2;
  }
  const rms = Math.sqrt(ss / k);
  const predicted = mp + b * (v[runEnd]! - mv);
  return predicted - top > Math.max(gridMmhg, 0.5) + 2 * rms;
}
