// Shared helpers for the simulator tests: clean parameter sets and an independent per-window CO2 integral.
import { BASE_PARAMS, type SimParams } from '../../src/simulate/index';
import type { SampleBlock } from '../../src/types';

/** Mainstream, zero delay, zero rise time, no noise, no offset, no ripple, no leak, no breath-to-breath variation. */
export function cleanParams(overrides: Partial<SimParams> = {}): SimParams {
  return {
    ...BASE_PARAMS,
    minutes: 3,
    delay_s: 0,
    rise_ms: 0,
    co2_noise_mmhg: 0,
    flow_noise_lps: 0,
    flow_offset_lps: 0,
    cardio_flow_lps: 0,
    cardio_co2_mmhg: 0,
    leak_fraction: 0,
    vt_cv: 0,
    rr_cv: 0,
    ...overrides,
  };
}

/**
 * Net CO2 volume (mL STPD) crossing the airway opening in [t0, t1): trapezoid integral of P x flow over time with
 * flow in mL/s (expiration positive, so inspired CO2 is subtracted), times 1.1588e-3 mL STPD per mmHg mL.
 * Source of the constant: `[derived here: ideal gas law, docs/methods.md]` (273.15/310.15/760,
 * written out here, not imported from the simulator).
 */
export function netCo2Ml(block: SampleBlock, t0: number, t1: number): number {
  const stpd = 273.15 / 310.15 / 760;
  let sum = 0;
  for (let i = 0; i + 1 < block.n; i++) {
    const ta = block.t_s[i]!;
    if (ta < t0 || ta >= t1) continue;
    const dt = block.t_s[i + 1]! - ta;
    const a = block.co2_mmhg[i]! * block.flow_lps[i]! * 1000;
    const b = block.co2_mmhg[i + 1]! * block.flow_lps[i + 1]! * 1000;
    sum += ((a + b) / 2) * dt;
  }
  return stpd * sum;
}
