// Sample store of the worker: the whole recording at full resolution (time Float64, flow and CO2 Float32) plus a
// min/max pyramid, so any time window can be served to the overview chart in a few milliseconds, even on a 24-hour
// file. Display only: the analysis never reads from here (it gets the SampleBlocks directly).
//
// Memory: 16 bytes per sample (about 140 MB for 24 h at 100 Hz) + about 1/16 of that for the pyramid.
// Values are kept as the file gives them after unit conversion (flow sign and offset not yet applied); the window
// query applies `sign * (flow - offset)` from the calibration so the chart shows positive = expiration.

/** Samples per bucket of pyramid level 1; each further level groups this many buckets of the level below. */
export const PYRAMID_FACTOR = 32;

export interface SignalWindow {
  t_s: number[];
  /** L/s, positive = expiration; null = gap */
  flow_lps: (number | null)[];
  /** mmHg; null = gap */
  co2_mmhg: (number | null)[];
  /** true when the window holds min/max pairs per pixel column rather than raw samples */
  decimated: boolean;
}

interface Level {
  /** samples per bucket at this level */
  span: number;
  fmin: Float32Array;
  fmax: Float32Array;
  cmin: Float32Array;
  cmax: Float32Array;
}

export class SignalStore {
  private t: Float64Array;
  private f: Float32Array;
  private c: Float32Array;
  length = 0;
  private levels: Level[] = [];

  constructor(expectedSamples = 1 << 16) {
    const cap = Math.max(1024, Math.ceil(expectedSamples));
    this.t = new Float64Array(cap);
    this.f = new Float32Array(cap);
    this.c = new Float32Array(cap);
  }

  append(t: ArrayLike<number>, flow: ArrayLike<number>, co2: ArrayLike<number>, n: number): void {
    if (this.length + n > this.t.length) this.grow(this.length + n);
    const o = this.length;
    for (let i = 0; i < n; i++) {
      this.t[o + i] = t[i]!;
      this.f[o + i] = flow[i]!;
      this.c[o + i] = co2[i]!;
    }
    this.length += n;
  }

  private grow(min: number): void {
    const cap = Math.max(min, Math.ceil(this.t.length * 1.5));
    const t = new Float64Array(cap);
    t.set(this.t.subarray(0, this.length));
    const f = new Float32Array(cap);
    f.set(this.f.subarray(0, this.length));
    const c = new Float32Array(cap);
    c.set(this.c.subarray(0, this.length));
    this.t = t;
    this.f = f;
    this.c = c;
  }

  /** Builds the min/max pyramid (call once after the last append). NaN samples are skipped; an all-NaN bucket is NaN. */
  finalize(): void {
    this.levels = [];
    let span = PYRAMID_FACTOR;
    let below: Level | null = null;
    while (this.length / span >= 2) {
      const nb = Math.ceil(this.length / span);
      const L: Level = { span, fmin: new Float32Array(nb), fmax: new Float32Array(nb), cmin: new Float32Array(nb), cmax: new Float32Array(nb) };
      for (let b = 0; b < nb; b++) {
        let fmin = Infinity, fmax = -Infinity, cmin = Infinity, cmax = -Infinity;
        if (below === null) {
          const end = Math.min(this.length, (b + 1) * span);
          for (let i = b * span; i < end; i++) {
            const fv = this.f[i]!, cv = this.c[i]!;
            if (fv < fmin) fmin = fv;
            if (fv > fmax) fmax = fv;
            if (cv < cmin) cmin = cv;
            if (cv > cmax) cmax = cv;
          }
        } else {
          const end = Math.min(below.fmin.length, (b + 1) * PYRAMID_FACTOR);
          for (let i = b * PYRAMID_FACTOR; i < end; i++) {
            if (below.fmin[i]! < fmin) fmin = below.fmin[i]!;
            if (below.fmax[i]! > fmax) fmax = below.fmax[i]!;
            if (below.cmin[i]! < cmin) cmin = below.cmin[i]!;
            if (below.cmax[i]! > cmax) cmax = below.cmax[i]!;
          }
        }
        L.fmin[b] = fmin === Infinity ? NaN : fmin;
        L.fmax[b] = fmax === -Infinity ? NaN : fmax;
        L.cmin[b] = cmin === Infinity ? NaN : cmin;
        L.cmax[b] = cmax === -Infinity ? NaN : cmax;
      }
      this.levels.push(L);
      below = L;
      span *= PYRAMID_FACTOR;
    }
  }

  get firstTime(): number {
    return this.length ? this.t[0]! : NaN;
  }

  get lastTime(): number {
    return this.length ? this.t[this.length - 1]! : NaN;
  }

  /** Overall range of flow (file units after conversion, before sign) and CO2; NaN-safe. */
  ranges(): { flow: [number, number]; co2: [number, number] } {
    let fmin = Infinity, fmax = -Infinity, cmin = Infinity, cmax = -Infinity;
    const top = this.levels[this.levels.length - 1];
    if (top) {
      for (let b = 0; b < top.fmin.length; b++) {
        if (top.fmin[b]! < fmin) fmin = top.fmin[b]!;
        if (top.fmax[b]! > fmax) fmax = top.fmax[b]!;
        if (top.cmin[b]! < cmin) cmin = top.cmin[b]!;
        if (top.cmax[b]! > cmax) cmax = top.cmax[b]!;
      }
    } else {
      for (let i = 0; i < this.length; i++) {
        if (this.f[i]! < fmin) fmin = this.f[i]!;
        if (this.f[i]! > fmax) fmax = this.f[i]!;
        if (this.c[i]! < cmin) cmin = this.c[i]!;
        if (this.c[i]! > cmax) cmax = this.c[i]!;
      }
    }
    return { flow: [fmin, fmax], co2: [cmin, cmax] };
  }

  /** First index with t >= x. */
  private lowerBound(x: number): number {
    let lo = 0, hi = this.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.t[mid]! < x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  /**
   * Samples between t0 and t1 (one sample of margin on each side) for a chart `columns` pixels wide. Up to
   * 3 x columns samples are returned as they are; beyond that each of `columns` buckets gives its minimum and its
   * maximum (two points, at the bucket's first and middle sample times), read from the coarsest pyramid level that
   * still resolves the buckets.
   */
  window(t0: number, t1: number, columns: number, sign: number, offsetLps: number): SignalWindow {
    const out: SignalWindow = { t_s: [], flow_lps: [], co2_mmhg: [], decimated: false };
    if (!this.length) return out;
    const i0 = Math.max(0, this.lowerBound(t0) - 1);
    const i1 = Math.min(this.length, this.lowerBound(t1) + 1);
    const n = i1 - i0;
    const cols = Math.max(16, Math.floor(columns));
    const flow = (v: number) => (!Number.isNaN(v) ? sign * (v - offsetLps) : null);
    const co2 = (v: number) => (!Number.isNaN(v) ? v : null);
    if (n <= 3 * cols) {
      for (let i = i0; i < i1; i++) {
        out.t_s.push(this.t[i]!);
        out.flow_lps.push(flow(this.f[i]!));
        out.co2_mmhg.push(co2(this.c[i]!));
      }
      return out;
    }
    out.decimated = true;
    const per = n / cols;
    let level: Level | null = null;
    for (const L of this.levels) if (L.span <= per / 2) level = L;
    for (let k = 0; k < cols; k++) {
      const a = i0 + Math.floor(k * per);
      const b = Math.min(i1, i0 + Math.floor((k + 1) * per));
      if (b <= a) continue;
      let fmin = Infinity, fmax = -Infinity, cmin = Infinity, cmax = -Infinity;
      const scan = (from: number, to: number) => {
        for (let i = from; i < to; i++) {
          const fv = this.f[i]!, cv = this.c[i]!;
          if (fv < fmin) fmin = fv;
          if (fv > fmax) fmax = fv;
          if (cv < cmin) cmin = cv;
          if (cv > cmax) cmax = cv;
        }
      };
      if (level) {
        const s = level.span;
        const ba = Math.ceil(a / s);
        const bb = Math.floor(b / s);
        if (bb > ba) {
          scan(a, ba * s);
          for (let q = ba; q < bb; q++) {
            if (level.fmin[q]! < fmin) fmin = level.fmin[q]!;
            if (level.fmax[q]! > fmax) fmax = level.fmax[q]!;
            if (level.cmin[q]! < cmin) cmin = level.cmin[q]!;
            if (level.cmax[q]! > cmax) cmax = level.cmax[q]!;
          }
          scan(bb * s, b);
        } else scan(a, b);
      } else scan(a, b);
      const none = (x: number) => x === Infinity || x === -Infinity;
      const lo = none(fmin) ? NaN : fmin;
      const hi = none(fmax) ? NaN : fmax;
      const first = sign >= 0 ? lo : hi;
      const second = sign >= 0 ? hi : lo;
      out.t_s.push(this.t[a]!, this.t[(a + b) >>> 1]!);
      out.flow_lps.push(flow(first), flow(second));
      out.co2_mmhg.push(co2(none(cmin) ? NaN : cmin), co2(none(cmax) ? NaN : cmax));
    }
    return out;
  }
}
