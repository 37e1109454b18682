// Shapes drawn on the viewer's breath view (web/breath-view.ts) and the report's breath chart (breath-chart.ts), in
// data units (volume mL, CO2 mmHg). Geometry only: every number comes from the core (breath row + BreathGeometry);
// nothing here feeds a result.
//
// Fowler's equal-area construction (Fowler WS 1948, Am J Physiol 154:405-416): with the phase III line L(V) and the
// inspired level b (the baseline the core integrates above),
//   p = area between the curve and b, left of V*               (CO2 that came out "early")
//   q = area between L (above) and the curve, from V* to V_x   (CO2 "missing" after the front)
// and V* is where p = q. The core solves this in closed form (src/physiology/fowler-dead-space.ts); here the two
// areas are only outlined so the reader can see the balance.
//
// Fletcher's areas with a PaCO2 line (Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88):
//   X = under the curve (CO2 eliminated), Y = between PaCO2 and L right of V* (alveolar dead space),
//   Z = the rest under PaCO2 (airway dead space; equals PaCO2 x V* after Fowler's balancing).

import { valueAt } from '../../analyse/breath-integrals';

export type Polygon = [number, number][];

export interface CurveInput {
  v_ml: ArrayLike<number>;
  co2_mmhg: ArrayLike<number>;
  line_intercept_mmhg: number;
  line_slope_mmhg_per_ml: number;
  baseline_mmhg: number;
}

/** Value of the phase III line at volume v. */
export function lineAt(g: CurveInput, v: number): number {
  return g.line_intercept_mmhg + g.line_slope_mmhg_per_ml * v;
}

/** Curve value at volume v by linear interpolation (clamped at the ends). */
export function curveAt(g: CurveInput, v: number): number {
  return g.v_ml.length === 0 ? NaN : valueAt(g.v_ml, g.co2_mmhg, v);
}

/** Curve vertices strictly between a and b, with interpolated end points at a and b. */
export function curveBetween(g: CurveInput, a: number, b: number): Polygon {
  const out: Polygon = [[a, curveAt(g, a)]];
  for (let i = 0; i < g.v_ml.length; i++) {
    const v = g.v_ml[i]!;
    if (v > a && v < b) out.push([v, g.co2_mmhg[i]!]);
  }
  out.push([b, curveAt(g, b)]);
  return out;
}

/** Fowler's two areas p (left of V*) and q (right of V*, up to V_x); null when V* or the line is missing. */
export function fowlerAreas(g: CurveInput, vStarMl: number, vxMl: number): { p: Polygon; q: Polygon } | null {
  if (!(vStarMl > 0) || !(vxMl > vStarMl) || !Number.isFinite(g.line_intercept_mmhg) || g.v_ml.length < 2) return null;
  const base = Number.isFinite(g.baseline_mmhg) ? g.baseline_mmhg : 0;
  const left = curveBetween(g, 0, vStarMl);
  const p: Polygon = [...left, [vStarMl, base], [0, base]];
  const lower = curveBetween(g, vStarMl, vxMl);
  const q: Polygon = [...lower, [vxMl, lineAt(g, vxMl)], [vStarMl, lineAt(g, vStarMl)]];
  return { p, q };
}

/** Fletcher's X, Y, Z regions for a given PaCO2; null when V*, the line or PaCO2 is missing. */
export function fletcherRegions(g: CurveInput, vStarMl: number, vtMl: number, paco2Mmhg: number): { x: Polygon; y: Polygon; z: Polygon } | null {
  if (!(vStarMl > 0) || !(vtMl > vStarMl) || !(paco2Mmhg > 0) || !Number.isFinite(g.line_intercept_mmhg)) return null;
  const curve = curveBetween(g, 0, vtMl);
  const x: Polygon = [...curve, [vtMl, 0], [0, 0]];
  // Z: upper edge PaCO2 left of V*, then min(L, PaCO2); lower edge the curve (never above the upper edge)
  const top = (v: number) => (v <= vStarMl ? paco2Mmhg : Math.min(lineAt(g, v), paco2Mmhg));
  const zTop: Polygon = [[0, paco2Mmhg], [vStarMl, paco2Mmhg]];
  for (const [v] of curve) if (v > vStarMl) zTop.push([v, top(v)]);
  const zBottom: Polygon = curve.map(([v, p]) => [v, Math.min(p, top(v))]).reverse() as Polygon;
  const z: Polygon = [...zTop, ...zBottom];
  // Y: between PaCO2 (top) and min(L, PaCO2) from V* to VT
  const yBottom: Polygon = [];
  for (const [v] of curve) if (v >= vStarMl) yBottom.push([v, top(v)]);
  if (yBottom.length === 0 || yBottom[0]![0] > vStarMl) yBottom.unshift([vStarMl, top(vStarMl)]);
  const y: Polygon = [[vStarMl, paco2Mmhg], [vtMl, paco2Mmhg], ...yBottom.reverse()];
  return { x, y, z };
}

/** Shoelace area of a simple polygon (absolute value), in mmHg x mL. */
export function polygonArea(poly: Polygon): number {
  let s = 0;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) s += (poly[j]![0] + poly[i]![0]) * (poly[j]![1] - poly[i]![1]);
  return Math.abs(s / 2);
}
