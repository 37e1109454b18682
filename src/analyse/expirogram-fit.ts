// Airway dead space from a curve fit of the whole expirogram (CO2 against expired volume), a third estimate beside
// Fowler's equal-area point and the phase II inflection.
//
// Fitting a function to the whole volumetric capnogram by Levenberg-Marquardt and reading the airway dead space from
// its parameters was proposed by Tusman G, Scandurra A, Böhm SH, Suarez-Sipmann F, Clara F 2009, "Model fitting of
// volumetric capnograms improves calculations of airway dead space and slope of phase III", J Clin Monit Comput
// 23:197-206. Their functional form could not be checked here, so this module uses a form of its own (derived here):
//
//   P(V) - P_base = (a + b V) / (1 + exp(-(V - m) / w))
//
// a logistic rise of width w centred on m onto the sloping phase III line a + b V (CO2 above the inspired level,
// mmHg; V expired volume, mL). The airway dead space is the midpoint m (derived here), for this reason: Fowler's
// equal-area point V* solves  integral (a + b V) [H(V - V*) - s(V)] dV = 0  (s the logistic, H the unit step).
// Split H(V - V*) - s = [H(V - V*) - H(V - m)] + [H(V - m) - s]. The second bracket is odd about m (s(m + u) =
// 1 - s(m - u)), so it holds no area and only its first moment remains:
//   integral u [H(u) - s(m + u)] du = 2 w^2 integral_0^inf z / (1 + e^z) dz = 2 w^2 pi^2 / 12 = w^2 pi^2 / 6.
// The first bracket gives L(m) (m - V*) to first order, L = a + b V. Hence
//   V* = m + b w^2 pi^2 / (6 L(m))
// so for a symmetric transition onto a flat phase III (b = 0) the midpoint IS Fowler's equal-area point, and with a
// phase III slope the two differ by b w^2 pi^2 / (6 L(m)) (an adult with b = 8 mmHg/L, w = 9 mL, L = 35 mmHg: 0.03 mL).
//
// The curve is the response-compensated expirogram of decompose.ts, resampled on a uniform volume grid of V_E / 100
// (every part of the expired volume weighs the same, however the flow varied, and the cost per breath does not grow
// with the sampling rate). The fit runs in scaled units (V / V_E), bounded: m in [0, V_E], w in [V_E / 1000, V_E / 2].

import { detExp } from '../numeric/det-math';
import { levenbergMarquardt, type LmProblem, type NormalEquations } from '../numeric/levenberg-marquardt';
import type { MonotoneCurve } from './breath-integrals';
import { workArray, type BreathWorkspace } from './breath-workspace';
import { resampleOnVolumeGrid } from './phase-geometry';

/** Steps of the uniform volume grid of the fit (V_E / 100 per step; 101 points from 0 to V_E). */
export const FIT_GRID_STEPS = 100;

/** Iteration limit of the fit; a breath that needs more gets no fitted value. */
export const FIT_MAX_ITERATIONS = 50;

/** Grid positions as fractions of V_E (the fit's x values). */
const GRID_FRACTION = Float64Array.from({ length: FIT_GRID_STEPS + 1 }, (_, g) => g / FIT_GRID_STEPS);

/** Scaled bounds of [a, b V_E, m / V_E, w / V_E]. */
const LOWER = [-Infinity, -Infinity, 0, 1e-3];
const UPPER = [Infinity, Infinity, 1, 0.5];

export interface ExpirogramFit {
  /** fitted parameters: phase III line a + b V above the inspired level (mmHg, mmHg/mL), midpoint and width (mL) */
  a_mmhg: number;
  b_mmhg_per_ml: number;
  mid_ml: number;
  width_ml: number;
  /** root mean square residual over the grid points, mmHg */
  rms_mmhg: number;
  iterations: number;
}

/** Starting values, mL and mmHg (clipped into the bounds). */
export type ExpirogramStart = Pick<ExpirogramFit, 'a_mmhg' | 'b_mmhg_per_ml' | 'mid_ml' | 'width_ml'>;

/**
 * The model, CO2 above the inspired level (mmHg) at expired volume v (mL): (a + b v) / (1 + exp(-(v - m) / w)).
 * Derived here (see the head of this file).
 */
export function logisticLinePco2(vMl: number, a: number, b: number, midMl: number, widthMl: number): number {
  // 1 / (1 + e^-z) from t = e^-|z|, without overflow for large |z|
  const z = (vMl - midMl) / widthMl;
  const t = detExp(z >= 0 ? -z : z);
  return ((a + b * vMl) * (z >= 0 ? 1 : t)) / (1 + t);
}

/**
 * Normal equations of the scaled fit, accumulated point by point: x = V / V_E, p = [a, B = b V_E, M = m / V_E,
 * W = w / V_E], model f = (a + B x) s(z), z = (x - M) / W, so
 *   df/da = s,  df/dB = x s,  df/dM = -(a + B x) s' / W,  df/dW = -(a + B x) s' z / W,   s' = s (1 - s).
 */
class ExpirogramSums {
  a = 0; B = 0; M = 0; W = 1; invW = 1;
  sse = 0;
  r0 = 0; r1 = 0; r2 = 0; r3 = 0;
  j00 = 0; j01 = 0; j02 = 0; j03 = 0; j11 = 0; j12 = 0; j13 = 0; j22 = 0; j23 = 0; j33 = 0;

  constructor(readonly y: Float64Array) {}

  reset(p: readonly number[]): void {
    this.a = p[0]!;
    this.B = p[1]!;
    this.M = p[2]!;
    this.W = p[3]!;
    this.invW = 1 / this.W;
    this.sse = this.r0 = this.r1 = this.r2 = this.r3 = 0;
    this.j00 = this.j01 = this.j02 = this.j03 = this.j11 = this.j12 = this.j13 = this.j22 = this.j23 = this.j33 = 0;
  }

  /** Grid point g, given t = exp(-|z|) and the side of the midpoint (s = 1 / (1 + t) on the rising side, else t / (1 + t)). */
  add(g: number, t: number, rising: boolean): void {
    const x = GRID_FRACTION[g]!;
    const q = 1 / (1 + t);
    const s = rising ? q : t * q;
    const line = this.a + this.B * x;
    const d2 = -line * t * q * q * this.invW;
    const d3 = d2 * (x - this.M) * this.invW;
    const d1 = x * s;
    const r = this.y[g]! - line * s;
    this.sse += r * r;
    this.r0 += s * r; this.r1 += d1 * r; this.r2 += d2 * r; this.r3 += d3 * r;
    this.j00 += s * s; this.j01 += s * d1; this.j02 += s * d2; this.j03 += s * d3;
    this.j11 += d1 * d1; this.j12 += d1 * d2; this.j13 += d1 * d3;
    this.j22 += d2 * d2; this.j23 += d2 * d3; this.j33 += d3 * d3;
  }

  write(out: NormalEquations): void {
    out.sse = this.sse;
    out.jtr[0] = this.r0; out.jtr[1] = this.r1; out.jtr[2] = this.r2; out.jtr[3] = this.r3;
    const j = out.jtj;
    j[0] = this.j00; j[1] = this.j01; j[2] = this.j02; j[3] = this.j03;
    j[5] = this.j11; j[6] = this.j12; j[7] = this.j13;
    j[10] = this.j22; j[11] = this.j23; j[15] = this.j33;
  }
}

/**
 * The fit's problem for levenbergMarquardt on the grid values y (CO2 above the inspired level at x_g = g / steps).
 * The exponentials t_g = exp(-|z_g|) are walked outward from the midpoint by one factor exp(-1 / (steps W)) per grid
 * step (three detExp calls per evaluation instead of one per point: the fit runs on every breath; the products add a
 * relative rounding below 1e-13). One fused pass accumulates the normal equations.
 */
function expirogramProblem(y: Float64Array): LmProblem {
  const sums = new ExpirogramSums(y);
  const steps = FIT_GRID_STEPS;
  return (p, out) => {
    sums.reset(p);
    const M = sums.M;
    const W = sums.W;
    const ratio = detExp(-1 / (steps * W));
    let first = Math.min(steps + 1, Math.max(0, Math.ceil(M * steps)));
    while (first > 0 && GRID_FRACTION[first - 1]! - M >= 0) first--;
    while (first <= steps && GRID_FRACTION[first]! - M < 0) first++;
    // rising side (z >= 0): t = exp(-z), smaller with each step up; falling side (z < 0): t = exp(z), smaller each step down
    let t = first <= steps ? detExp(-(GRID_FRACTION[first]! - M) / W) : 0;
    for (let g = first; g <= steps; g++, t *= ratio) sums.add(g, t, true);
    t = first > 0 ? detExp((GRID_FRACTION[first - 1]! - M) / W) : 0;
    for (let g = first - 1; g >= 0; g--, t *= ratio) sums.add(g, t, false);
    sums.write(out);
  };
}

/**
 * Fits the model to the whole compensated curve from 0 to V_E (CO2 above `base`). Null when the fit does not
 * converge within FIT_MAX_ITERATIONS, or ends with its midpoint or width on a bound (no rise inside the expirate).
 */
export function fitExpirogram(
  curve: MonotoneCurve,
  tidalVolumeMl: number,
  base: number,
  start: ExpirogramStart,
  workspace: BreathWorkspace,
): ExpirogramFit | null {
  if (!(tidalVolumeMl > 0) || curve.volume_ml.length < 2) return null;
  const y = workArray(workspace, 'fit_grid_mmhg', FIT_GRID_STEPS + 1);
  resampleOnVolumeGrid(curve.volume_ml, curve.compensated_mmhg, tidalVolumeMl / FIT_GRID_STEPS, y);
  for (let g = 0; g < y.length; g++) y[g] = y[g]! - base;
  const v = tidalVolumeMl;
  const scaledStart = [start.a_mmhg, start.b_mmhg_per_ml * v, start.mid_ml / v, start.width_ml / v];
  const fit = levenbergMarquardt(expirogramProblem(y), scaledStart, {
    lower: LOWER,
    upper: UPPER,
    max_iterations: FIT_MAX_ITERATIONS,
    tolerance: 1e-6,
  });
  const a = fit.params[0]!;
  const B = fit.params[1]!;
  const M = fit.params[2]!;
  const W = fit.params[3]!;
  if (!fit.converged || !(M > LOWER[2]! && M < UPPER[2]!) || !(W > LOWER[3]! && W < UPPER[3]!)) return null;
  return {
    a_mmhg: a,
    b_mmhg_per_ml: B / v,
    mid_ml: M * v,
    width_ml: W * v,
    rms_mmhg: Math.sqrt(fit.sse / y.length),
    iterations: fit.iterations,
  };
}
