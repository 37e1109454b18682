// Breath quality codes. A breath is `ok` only when no code applies; every summary uses ok breaths only and reports
// how many were excluded and why. Codes are our own short names; thresholds are settings (src/settings.ts).

import type { AnalysisSettings } from '../settings.js';
import type { BreathRow } from '../types.js';
import type { BreathGeometry } from './decompose.js';
import { quantileSorted } from '../numeric/stats.js';

/** Every reason code with its meaning (the README table is generated from this list). */
export const REASON_CODES: Record<string, string> = {
  short_exp: 'expiration too short or too small to analyse',
  no_phase3: 'no usable phase III (too few points or too little volume after phase II)',
  poor_fit: 'phase III regression fits poorly (residual RMS above max_phase3_rms_mmhg or R² below min_phase3_r2)',
  no_fowler: "Fowler's construction has no valid solution for this breath",
  leak: 'inspired and expired tidal volumes differ by more than leak_fraction',
  rebreathing: 'mean inspired PCO2 above rebreathing_mmhg',
  outlier: 'tidal volume or breath duration far from its neighbours (more than outlier_mad robust deviations)',
  co2_clipped: 'CO2 stays at its maximum for several samples in a row (sensor range or clipping)',
  low_co2: 'end-tidal PCO2 below min_petco2_mmhg (no real capnogram: disconnection, sampling line blocked)',
  implausible: 'negative or implausible values (CO2 above max_co2_mmhg or well below zero)',
  gap: 'breath touches a gap or skipped rows',
  delay_uncertain: "this breath's CO2 downstroke disagrees with the delay used by more than delay_spread_s, or has none",
};

export interface BreathCheckInput {
  row: BreathRow;
  geometry: BreathGeometry;
  flags: string[];
  /** delay measured on this breath's own inspiratory downstroke (NaN if none) */
  breath_delay_s: number;
  /** delay used for alignment */
  delay_s: number;
  median_dt_s: number;
}

/** Adds the per-breath codes that need only this breath; returns the full list. */
export function checkBreath(input: BreathCheckInput, cfg: AnalysisSettings): string[] {
  const { row, geometry: g } = input;
  const flags = [...input.flags];
  const add = (c: string) => {
    if (!flags.includes(c)) flags.push(c);
  };
  const vmax = Math.max(row.vt_insp_ml, row.vt_exp_ml);
  if (vmax > 0 && Math.abs(row.vt_insp_ml - row.vt_exp_ml) / vmax > cfg.leak_fraction) add('leak');
  if (row.fico2_mmhg > cfg.rebreathing_mmhg) add('rebreathing');
  if (g.top_run >= 5 && g.max_co2_mmhg > 0) add('co2_clipped');
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

export function statusOf(flags: string[]): string {
  return flags.length ? flags.join('+') : 'ok';
}
