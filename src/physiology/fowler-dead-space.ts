/**
 * Fowler's equal-area airway dead space, closed form, mL.
 *
 * With the phase III line L(V) = a + b V (CO2 above the inspired level, mmHg; V in mL) and
 * A = integral of the measured curve from 0 to the upper limit V_x (mmHg x mL), Fowler's construction asks for the
 * V* at which the area under the measured curve left of V* equals the area between the line and the curve right of
 * V*; equivalently the square front at V* under L holds the same CO2 as the curve:
 *   integral_{V*}^{V_x} (a + b V) dV = A  =>  (b/2) V*^2 + a V* - K = 0,  K = a V_x + (b/2) V_x^2 - A
 *   V* = 2K / (a + sqrt(a^2 + 2 b K))     (the numerically stable root; valid for any sign of b)
 *
 * Source: Fowler WS 1948, Am J Physiol 154:405-416 (the equal-area construction, on the nitrogen single-breath
 * curve); applied to CO2 by Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88. The closed form is
 * an algebraic restatement: derived here.
 *
 * Returns NaN when a <= 0, the discriminant is negative or L(V*) <= 0.
 * @example fowlerDeadSpace(40, 0, 500, 14000) // => 150 (flat plateau at 40 mmHg, derived here)
 */
export function fowlerDeadSpace(a: number, b: number, vxMl: number, areaMmhgMl: number): number {
  if (!(a > 0)) return NaN;
  const K = a * vxMl + 0.5 * b * vxMl * vxMl - areaMmhgMl;
  const disc = a * a + 2 * b * K;
  if (!(disc >= 0)) return NaN;
  const vStar = Math.abs(b) < 1e-12 ? vxMl - areaMmhgMl / a : (2 * K) / (a + Math.sqrt(disc));
  if (!(a + b * vStar > 0)) return NaN;
  return vStar;
}
