import type { FrontShape } from './params';
import { emgCdf, normalCdf } from './normal-cdf';
import { profileAt, type AlveolarProfile } from './sequential-emptying';

/**
 * True expired CO2 at the airway opening as a function of expired volume v (mL), for one breath:
 *
 *   P(v) = PI + (L(v) - PI) * F(v - VDaw)
 *
 * - phase I: P = PI (inspired level, 0 unless rebreathing);
 * - phase II: F is a smooth front. 'symmetric': F(u) = Phi(u / sigma) (normal distribution function), symmetric
 *   about VDaw, which makes Fowler's equal-area point equal VDaw up to a tiny residual (see `fowlerResidualMl`).
 *   'skewed': F = exponentially modified Gaussian with mean VDaw (tail toward phase III);
 * - phase III: L(v) = Pmix + b (v - (VDaw + V_E)/2), b = slope3 / 1000 mmHg/mL (sequential emptying), whose mean over
 *   [VDaw, V_E] equals the mean alveolar expired PCO2 Pmix from gas exchange, so the breath's CO2 volume
 *   (PI V_E + (Pmix - PI)(V_E - VDaw)) is what the lung eliminates.
 * [common practice, no source: model construction; front shape like synthetic curve C of docs/methods.md]
 */
export interface ExpiredCurve {
  pi_mmhg: number;
  vd_aw_ml: number;
  sigma_ml: number;
  shape: FrontShape;
  tail_ml: number;
  /** phase III line L(v) = a + b v */
  a_mmhg: number;
  b_mmhg_per_ml: number;
  ve_ml: number;
  /** 'compartments' lung model: the alveolar gas as a function of alveolar expired volume (sequential emptying);
   *  then a + b v is the least-squares line of the curve over the middle half of [VDaw + 3 sigma, V_E] */
  profile?: AlveolarProfile;
}

export function makeExpiredCurve(
  piMmhg: number,
  vdAwMl: number,
  sigmaMl: number,
  shape: FrontShape,
  tailMl: number,
  slope3MmhgPerL: number,
  alvMeanMmhg: number,
  veMl: number,
): ExpiredCurve {
  const b = slope3MmhgPerL / 1000;
  const mid = (vdAwMl + veMl) / 2;
  return {
    pi_mmhg: piMmhg,
    vd_aw_ml: vdAwMl,
    sigma_ml: sigmaMl,
    shape,
    tail_ml: shape === 'skewed' ? tailMl : 0,
    a_mmhg: alvMeanMmhg - b * mid,
    b_mmhg_per_ml: b,
    ve_ml: veMl,
  };
}

/**
 * Expired curve of the 'compartments' model: P(v) = PI + (A(v - VDaw) - PI) F(v - VDaw) with A the sequential-emptying
 * profile (A(u) = A(0) for u < 0). Its phase III line a + b v is the least-squares line through 201 evenly spaced
 * volumes of the middle half of [VDaw + 3 sigma, V_E], the window the analysis fits by default (settings.ts
 * phase3_window 'middle_half') [common practice, no source: regression window].
 */
export function makeProfileCurve(
  piMmhg: number,
  vdAwMl: number,
  sigmaMl: number,
  shape: FrontShape,
  tailMl: number,
  profile: AlveolarProfile,
  veMl: number,
): ExpiredCurve {
  const c: ExpiredCurve = {
    pi_mmhg: piMmhg, vd_aw_ml: vdAwMl, sigma_ml: sigmaMl, shape, tail_ml: shape === 'skewed' ? tailMl : 0,
    a_mmhg: 0, b_mmhg_per_ml: 0, ve_ml: veMl, profile,
  };
  const start = vdAwMl + 3 * sigmaMl;
  const from = start + 0.25 * (veMl - start);
  const to = start + 0.75 * (veMl - start);
  const mid = (from + to) / 2;
  const m = 201;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  for (let j = 0; j < m; j++) {
    const x = ((to - from) * j) / (m - 1) - (mid - from);
    const y = curvePco2(c, mid + x);
    sy += y;
    sxx += x * x;
    sxy += x * y;
  }
  // x is centred on mid (sum x = 0), so b = sxy / sxx and the line passes through (mid, mean y)
  const b = sxy / sxx;
  c.b_mmhg_per_ml = b;
  c.a_mmhg = sy / m - b * mid;
  return c;
}

/** Alveolar gas reaching the airway at expired volume v before the front is applied: the profile or the line, mmHg. */
export function alveolarAt(c: ExpiredCurve, vMl: number): number {
  return c.profile ? profileAt(c.profile, vMl - c.vd_aw_ml) : lineAt(c, vMl);
}

/** Front F(u), u = v - VDaw. */
export function frontFraction(c: ExpiredCurve, uMl: number): number {
  return c.shape === 'skewed' && c.tail_ml > 0 ? emgCdf(uMl + c.tail_ml, c.sigma_ml, c.tail_ml) : normalCdf(uMl / c.sigma_ml);
}

/** Phase III line value at v, mmHg. */
export function lineAt(c: ExpiredCurve, vMl: number): number {
  return c.a_mmhg + c.b_mmhg_per_ml * vMl;
}

/** True PCO2 at expired volume v, mmHg. */
export function curvePco2(c: ExpiredCurve, vMl: number): number {
  return c.pi_mmhg + (alveolarAt(c, vMl) - c.pi_mmhg) * frontFraction(c, vMl - c.vd_aw_ml);
}

/**
 * integral_0^{V_E} (P(v) - offset) dv by composite Simpson's rule with steps of at most sigma/4 and V_E/400, mmHg mL.
 */
export function curveArea(c: ExpiredCurve, offsetMmhg = 0): number {
  const hMax = Math.min(c.sigma_ml / 4, c.ve_ml / 400);
  let n = Math.ceil(c.ve_ml / hMax);
  if (n % 2 === 1) n += 1;
  const h = c.ve_ml / n;
  let sum = curvePco2(c, 0) + curvePco2(c, c.ve_ml) - 2 * offsetMmhg;
  for (let i = 1; i < n; i++) sum += (i % 2 === 1 ? 4 : 2) * (curvePco2(c, i * h) - offsetMmhg);
  return (sum * h) / 3;
}

/**
 * Fowler's equal-area airway dead space in closed form (derived here, docs/methods.md): with A = integral_0^{Vx} P dV and
 * the phase III line a + b V, solve (b/2) V*^2 + a V* - K = 0, K = a Vx + (b/2) Vx^2 - A, stable root
 * V* = 2K / (a + sqrt(a^2 + 2 b K)) [derived here: algebraic restatement of Fowler's area equality].
 * Returns NaN when not computable. @example fowlerEqualArea(13050, 34, 0.01, 500) // 149.648 (synthetic curve B)
 */
export function fowlerEqualArea(areaMmhgMl: number, aMmhg: number, bMmhgPerMl: number, vxMl: number): number {
  const k = aMmhg * vxMl + (bMmhgPerMl / 2) * vxMl * vxMl - areaMmhgMl;
  if (Math.abs(bMmhgPerMl * vxMl) < 1e-12 * Math.abs(aMmhg)) return aMmhg > 0 ? vxMl - areaMmhgMl / aMmhg : NaN;
  const disc = aMmhg * aMmhg + 2 * bMmhgPerMl * k;
  if (!(aMmhg > 0) || disc < 0) return NaN;
  return (2 * k) / (aMmhg + Math.sqrt(disc));
}

/**
 * Analytic residual of Fowler (on P - PI, V_x = V_E) for the symmetric front: the area lost by the front is
 * b sigma^2 / 2 (the first moment of 1 - Phi on a half line is sigma^2/4 on each side), so
 * V* - VDaw ~ b sigma^2 / (2 (L(VDaw) - PI))  (mL; about 0.03 mL for an adult with b = 10 mmHg/L, sigma = 15 mL)
 * [common practice, no source: derivation in MODEL.md].
 */
export function fowlerResidualMl(c: ExpiredCurve): number {
  return (c.b_mmhg_per_ml * c.sigma_ml * c.sigma_ml) / (2 * (lineAt(c, c.vd_aw_ml) - c.pi_mmhg));
}
