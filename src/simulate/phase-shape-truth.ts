// True phase-shape indices of a breath, on its noise-free expired curve, by the definitions the analysis uses
// (src/analyse/phase-geometry.ts and decompose.ts): the steepest phase II slope, the start of phase III (the first
// volume after the steepest point where the curve above the inspired level reaches 95 % of the phase III line above
// it), and from them the normalised phase II slope, the II/III angle and VAE/VT by the same functions as breaths.csv
// (src/physiology/). Numerical, derived here: central differences on a grid of sigma/10 over VDaw ± 6 sigma, the phase
// III start refined by bisection.
import { alveolarEjectionFraction } from '../physiology/alveolar-ejection-fraction';
import { normalisedSlope } from '../physiology/normalised-slope';
import { phase23AngleDeg } from '../physiology/phase23-angle';
import { curvePco2, lineAt, type ExpiredCurve } from './expired-curve';

export interface PhaseShapeTruth {
  slope2_mmhg_per_l: number;
  v_phase3_start_ml: number;
  slope2_norm_paeco2_per_l: number;
  angle23_deg: number;
  vae_vt: number;
}

/** The indices of one breath; `paeco2Mmhg` and `slope3MmhgPerL` are the breath's true values. */
export function phaseShapeTruth(c: ExpiredCurve, paeco2Mmhg: number, slope3MmhgPerL: number): PhaseShapeTruth {
  const h = c.sigma_ml / 10;
  const from = Math.max(h, c.vd_aw_ml - 6 * c.sigma_ml);
  const to = Math.min(c.ve_ml - h, c.vd_aw_ml + 6 * c.sigma_ml);
  let steepest = -Infinity;
  let atMl = NaN;
  for (let v = from; v <= to; v += h) {
    const slope = (curvePco2(c, v + h) - curvePco2(c, v - h)) / (2 * h);
    if (slope > steepest) {
      steepest = slope;
      atMl = v;
    }
  }
  const reached = (v: number) => curvePco2(c, v) - c.pi_mmhg >= 0.95 * (lineAt(c, v) - c.pi_mmhg);
  let v3 = NaN;
  for (let v = atMl; v <= c.ve_ml; v += h) {
    if (!reached(v)) continue;
    let lo = v - h;
    let hi = v;
    for (let k = 0; k < 30; k++) {
      const mid = 0.5 * (lo + hi);
      if (reached(mid)) hi = mid;
      else lo = mid;
    }
    v3 = hi;
    break;
  }
  const slope2 = 1000 * steepest;
  const sn2 = normalisedSlope(slope2, paeco2Mmhg);
  return {
    slope2_mmhg_per_l: slope2,
    v_phase3_start_ml: v3,
    slope2_norm_paeco2_per_l: sn2,
    angle23_deg: phase23AngleDeg(sn2, normalisedSlope(slope3MmhgPerL, paeco2Mmhg)),
    vae_vt: alveolarEjectionFraction(c.ve_ml, v3),
  };
}
