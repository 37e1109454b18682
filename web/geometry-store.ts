// Per-breath capnogram geometry (BreathGeometry from src/analyse/decompose.ts), packed into a few flat typed arrays
// so that 20-30 thousand breaths of a 24-hour file cost tens of megabytes and move from the worker to the page as
// transferable buffers (no copy). Curves are stored as Float32 (display only; every number shown comes from the
// breath rows, which keep full precision).

import type { BreathGeometry } from '../src/index';

/** Scalar fields kept per breath, in this order. */
export const GEOMETRY_SCALARS = [
  'line_intercept_mmhg',
  'line_slope_mmhg_per_ml',
  'fit_from_ml',
  'fit_to_ml',
  'fowler_limit_ml',
  'baseline_mmhg',
] as const;

export type GeometryScalar = (typeof GEOMETRY_SCALARS)[number];

/** The packed buffers (what the worker transfers). */
export interface PackedGeometry {
  /** start of breath i's points in the point arrays; offsets[count] = total points */
  offsets: Int32Array;
  v_ml: Float32Array;
  co2_mmhg: Float32Array;
  co2_raw_mmhg: Float32Array;
  /** count x GEOMETRY_SCALARS.length, row-major */
  scalars: Float64Array;
  count: number;
}

/** One breath's geometry as the breath view draws it. */
export interface BreathCurve {
  v_ml: Float32Array;
  co2_mmhg: Float32Array;
  co2_raw_mmhg: Float32Array;
  line_intercept_mmhg: number;
  line_slope_mmhg_per_ml: number;
  fit_from_ml: number;
  fit_to_ml: number;
  fowler_limit_ml: number;
  baseline_mmhg: number;
}

export class GeometryWriter {
  private offsets: number[] = [0];
  private v = new Float32Array(1 << 16);
  private c = new Float32Array(1 << 16);
  private r = new Float32Array(1 << 16);
  private s: number[] = [];
  private points = 0;

  add(g: BreathGeometry): void {
    const m = g.v_ml.length;
    if (this.points + m > this.v.length) {
      const cap = Math.max(this.points + m, this.v.length * 2);
      const grow = (a: Float32Array) => {
        const b = new Float32Array(cap);
        b.set(a.subarray(0, this.points));
        return b;
      };
      this.v = grow(this.v);
      this.c = grow(this.c);
      this.r = grow(this.r);
    }
    this.v.set(g.v_ml, this.points);
    this.c.set(g.co2_mmhg, this.points);
    this.r.set(g.co2_raw_mmhg, this.points);
    this.points += m;
    this.offsets.push(this.points);
    for (const k of GEOMETRY_SCALARS) this.s.push(g[k]);
  }

  get count(): number {
    return this.offsets.length - 1;
  }

  pack(): PackedGeometry {
    return {
      offsets: Int32Array.from(this.offsets),
      v_ml: this.v.slice(0, this.points),
      co2_mmhg: this.c.slice(0, this.points),
      co2_raw_mmhg: this.r.slice(0, this.points),
      scalars: Float64Array.from(this.s),
      count: this.count,
    };
  }
}

/** Breath i (0-based, = breath number - 1) of a packed store; null when out of range. */
export function breathCurve(p: PackedGeometry, i: number): BreathCurve | null {
  if (!(i >= 0 && i < p.count)) return null;
  const a = p.offsets[i]!;
  const b = p.offsets[i + 1]!;
  const k = i * GEOMETRY_SCALARS.length;
  return {
    v_ml: p.v_ml.subarray(a, b),
    co2_mmhg: p.co2_mmhg.subarray(a, b),
    co2_raw_mmhg: p.co2_raw_mmhg.subarray(a, b),
    line_intercept_mmhg: p.scalars[k]!,
    line_slope_mmhg_per_ml: p.scalars[k + 1]!,
    fit_from_ml: p.scalars[k + 2]!,
    fit_to_ml: p.scalars[k + 3]!,
    fowler_limit_ml: p.scalars[k + 4]!,
    baseline_mmhg: p.scalars[k + 5]!,
  };
}

/** Buffers to list as transferables when posting a packed store. */
export function transferables(p: PackedGeometry): ArrayBuffer[] {
  return [p.offsets.buffer, p.v_ml.buffer, p.co2_mmhg.buffer, p.co2_raw_mmhg.buffer, p.scalars.buffer] as ArrayBuffer[];
}
