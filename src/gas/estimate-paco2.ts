import { usableForSummary, type SummaryBreaths } from '../analyse/quality';
import { median, normalQuantile } from '../numeric/stats';
import { avdsf } from '../physiology/avdsf';
import { breathEnghoff, inspiredPco2For } from '../analyse/arterial-columns';
import type { BreathRow } from '../types';
import { GAS_DEFAULTS } from './gas-defaults';
import type { GasRow, Paco2Estimate } from './gas-types';

/** Options of the band (defaults in GAS_DEFAULTS). */
export interface EstimateOptions {
  band_level?: number;
  analyser_sd_mmhg?: number;
  drift_prior_mmhg2_per_h?: number;
  summary_breaths?: SummaryBreaths;
  /** apparatus volume between sensor and patient, mL, removed from the estimated Enghoff dead space (default 0) */
  apparatus_ml?: number;
  /** subtract the breath's inspired PCO2 in Enghoff's equation (default true), as `bohr_inspired_term` */
  inspired_term?: boolean;
}

/**
 * PaCO2 between blood gases: for each breath usable for a summary (usableForSummary) with a finite PETCO2 that starts
 * at or after the first gas sample with a gradient, estimated PaCO2 = PETCO2 + the most recent gradient (the last gas
 * row with time_s <= the breath's t_start_s and a finite gradient_mmhg).
 *
 * Band: a prediction interval, estimate ± z SD with z the normal quantile of (1 + band_level)/2 and
 *   SD² = sa² + sp² + sd² × (t − t_gas)
 * sa: the analyser's PCO2 SD (GAS_DEFAULTS.analyser_sd_mmhg); sp: the breath-to-breath SD of PETCO2 (1.4826 × median
 * absolute successive difference / √2 over the usable breaths); sd²: the gradient's drift per second, pooled over the pairs of
 * successive gases so far with one hour of the prior drift as a pseudo-observation,
 *   sd² = (prior × 1 h + Σ (ΔG² − 2 sa²)) / (1 h + Σ Δt), not below 0
 * (a random walk of the gradient seen through analyser error: E[ΔG²] = sd² Δt + 2 sa²), plus m²/3 for a move m of
 * PETCO2 since the gas (petco2Movement). Model derived here; the analyser SD and the normal quantile are cited in
 * GAS_DEFAULTS and normalQuantile.
 */
export function estimatePaco2(breaths: readonly BreathRow[], gasRows: readonly GasRow[], opts: EstimateOptions = {}): Paco2Estimate[] {
  const d = GAS_DEFAULTS;
  const level = opts.band_level ?? d.band_level.value;
  const sa = opts.analyser_sd_mmhg ?? d.analyser_sd_mmhg.value;
  const prior = (opts.drift_prior_mmhg2_per_h ?? d.drift_prior_mmhg2_per_h.value) / 3600;
  const z = normalQuantile((1 + level) / 2);
  const known = gasRows
    .filter((g) => Number.isFinite(g.gradient_mmhg))
    .sort((a, b) => a.time_s - b.time_s || a.sample - b.sample);
  const out: Paco2Estimate[] = [];
  if (known.length === 0) return out;
  const used = breaths.filter((b) => usableForSummary(b, opts) && Number.isFinite(b.petco2_mmhg));
  const sp = petco2NoiseSd(used);
  const drift = driftPerSecond(known, sa, prior);
  // gases at or before each breath (the last of them is the breath's gas)
  const gasesBefore = used.map((b) => {
    let n = 0;
    while (n < known.length && known[n]!.time_s <= b.t_start_s) n++;
    return n;
  });
  const moved = petco2Movement(used, known, gasesBefore);
  for (let i = 0; i < used.length; i++) {
    const b = used[i]!;
    const n = gasesBefore[i]!;
    if (n === 0) continue;
    const gas = known[n - 1]!;
    const estimate = b.petco2_mmhg + gas.gradient_mmhg;
    const move = moved[i]!;
    const sd = Math.sqrt(sa * sa + sp * sp + drift[n - 1]! * Math.max(0, b.t_start_s - gas.time_s) + (4 * move * move) / 3);
    out.push({
      breath: b.breath,
      t_start_s: b.t_start_s,
      petco2_mmhg: b.petco2_mmhg,
      paco2_est_mmhg: estimate,
      band_low_mmhg: estimate - z * sd,
      band_high_mmhg: estimate + z * sd,
      gradient_mmhg: gas.gradient_mmhg,
      gas_sample: gas.sample,
      gases_in_band: n,
      estimate_sd_mmhg: sd,
      petco2_moved_mmhg: move,
      ...estimatedDeadSpace(b, estimate, opts),
      band_method: 'prediction',
    });
  }
  return out;
}

/**
 * The breath's Enghoff VD/VT and arterial–end-tidal fraction with the estimated PaCO2 in place of a measured one, by
 * the functions the per-breath columns use (breathEnghoff, inspiredPco2For, avdsf): the
 * trends of these follow PaCO2 between gases, where `vdvt_enghoff` of breaths.csv keeps the last gas's PaCO2.
 */
function estimatedDeadSpace(b: BreathRow, paco2EstMmhg: number, opts: EstimateOptions): { vdvt_enghoff_est: number; avdsf_est: number } {
  const enghoff = breathEnghoff(b, paco2EstMmhg, inspiredPco2For(b, opts.inspired_term ?? true), opts.apparatus_ml ?? 0);
  return { vdvt_enghoff_est: enghoff.fraction, avdsf_est: avdsf(paco2EstMmhg, b.petco2_mmhg) };
}

/**
 * Breath-to-breath SD of PETCO2: 1.4826 × the median absolute successive difference / √2 (0 with fewer than 3 breaths).
 * For independent normal noise of SD s a difference has SD s√2 and a median absolute value 0.6745 s√2 (derived here).
 */
function petco2NoiseSd(used: readonly BreathRow[]): number {
  if (used.length < 3) return 0;
  const diffs: number[] = [];
  for (let i = 1; i < used.length; i++) diffs.push(Math.abs(used[i]!.petco2_mmhg - used[i - 1]!.petco2_mmhg));
  return (1.4826 * median(diffs)) / Math.SQRT2;
}

/**
 * How far PETCO2 has moved since the breath's gas: the largest |running median of PETCO2 over the last 9 usable
 * breaths − the gas row's window median PETCO2| over the usable breaths from the gas up to this breath (0 before the
 * first gas or when the gas row has no PETCO2). Why it widens the band (derived here): when PETCO2 moves by m after a
 * gas, a change of ventilation moves PaCO2 with it (the gradient holds, the estimate is right), a change of dead space
 * or perfusion leaves PaCO2 where it was and the gradient changes by up to about m/(1 − alveolar dead-space fraction),
 * as PaCO2 then climbs while body CO2 stores fill; not knowing which, the error is taken as uniform between 0 and 2m
 * (fractions up to 0.5), whose mean square is 4m²/3. The largest move since the gas is kept because
 * PETCO2 returning later (PaCO2 rising as body CO2 stores fill) does not undo a changed gradient.
 */
function petco2Movement(used: readonly BreathRow[], known: readonly GasRow[], gasesBefore: readonly number[]): number[] {
  const out: number[] = [];
  let gasIndex = -1;
  let largest = 0;
  for (let i = 0; i < used.length; i++) {
    if (gasesBefore[i]! - 1 !== gasIndex) {
      gasIndex = gasesBefore[i]! - 1;
      largest = 0;
    }
    const ref = gasIndex >= 0 ? known[gasIndex]!.petco2_mmhg : NaN;
    if (Number.isFinite(ref)) {
      const recent = used.slice(Math.max(0, i - 8), i + 1).map((b) => b.petco2_mmhg);
      largest = Math.max(largest, Math.abs(median(recent) - ref));
    }
    out.push(largest);
  }
  return out;
}

/** Drift of the gradient per second known after each gas (index k: gases 0..k), pooled with the prior. */
function driftPerSecond(known: readonly GasRow[], sa: number, prior: number): number[] {
  const out: number[] = [prior];
  let sumSq = 0;
  let sumDt = 0;
  for (let k = 1; k < known.length; k++) {
    const dg = known[k]!.gradient_mmhg - known[k - 1]!.gradient_mmhg;
    sumSq += dg * dg - 2 * sa * sa;
    sumDt += Math.max(0, known[k]!.time_s - known[k - 1]!.time_s);
    out.push(Math.max(0, (prior * 3600 + sumSq) / (3600 + sumDt)));
  }
  return out;
}
