import { usableForSummary, type SummaryBreaths } from '../analyse/quality';
import type { BreathRow } from '../types';
import { GAS_DEFAULTS } from './gas-defaults';
import type { GasRow, Paco2Estimate } from './gas-types';

/**
 * PaCO2 between blood gases: for each breath usable for a summary (usableForSummary) with a finite PETCO2 that starts at or after the first
 * gas sample with a gradient, estimated PaCO2 = PETCO2 + the most recent gradient (the last gas row with
 * time_s <= the breath's t_start_s and a finite gradient_mmhg).
 *
 * Band: PETCO2 + [min, max] of all gradients observed up to that breath ('observed_range'). While only one gradient
 * is known the band is estimate +/- single_gas_spread_mmhg ('single_gas_spread'; default 5 mmHg, our choice, no
 * source). The estimate assumes the gradient stays as last measured; a new gas can show otherwise.
 */
export function estimatePaco2(
  breaths: readonly BreathRow[],
  gasRows: readonly GasRow[],
  opts: { single_gas_spread_mmhg?: number; summary_breaths?: SummaryBreaths } = {},
): Paco2Estimate[] {
  const spread = opts.single_gas_spread_mmhg ?? GAS_DEFAULTS.single_gas_spread_mmhg.value;
  const known = gasRows
    .filter((g) => Number.isFinite(g.gradient_mmhg))
    .sort((a, b) => a.time_s - b.time_s || a.sample - b.sample);
  const out: Paco2Estimate[] = [];
  if (known.length === 0) return out;

  for (const b of breaths) {
    if (!usableForSummary(b, opts) || !Number.isFinite(b.petco2_mmhg)) continue;
    let n = 0;
    let lo = Infinity;
    let hi = -Infinity;
    while (n < known.length && known[n]!.time_s <= b.t_start_s) {
      lo = Math.min(lo, known[n]!.gradient_mmhg);
      hi = Math.max(hi, known[n]!.gradient_mmhg);
      n++;
    }
    if (n === 0) continue;
    const gas = known[n - 1]!;
    const estimate = b.petco2_mmhg + gas.gradient_mmhg;
    const single = n === 1;
    out.push({
      breath: b.breath,
      t_start_s: b.t_start_s,
      petco2_mmhg: b.petco2_mmhg,
      paco2_est_mmhg: estimate,
      band_low_mmhg: single ? estimate - spread : b.petco2_mmhg + lo,
      band_high_mmhg: single ? estimate + spread : b.petco2_mmhg + hi,
      gradient_mmhg: gas.gradient_mmhg,
      gas_sample: gas.sample,
      gases_in_band: n,
      band_method: single ? 'single_gas_spread' : 'observed_range',
    });
  }
  return out;
}
