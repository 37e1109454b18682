// Tabular CUSUM (Page ES. Continuous inspection schemes. Biometrika 1954;41:100-115), in the two-sided "tabular" form
// of Montgomery DC, Introduction to Statistical Quality Control (Wiley), chapter on the cumulative sum chart:
//
//   C+_i = max(0, z_i - k + C+_{i-1})        C-_i = max(0, -z_i - k + C-_{i-1})        C+_0 = C-_0 = 0
//   z_i  = (x_i - mu0) / sigma               (standardised; k and h are in units of sigma)
//
// An alarm is raised at the first i with C+_i > h or C-_i > h. N+ (N-) counts the consecutive periods with C+ (C-)
// above zero; the change is estimated to have happened after the last period with C = 0, i.e. at index i - N + 1, and
// the new mean as mu0 + sigma (k + C/N) (upper side) or mu0 - sigma (k + C/N) (lower side) [Montgomery, same chapter].
// NaN values (bins without data) leave the statistics unchanged.

export interface CusumState {
  hi: number;
  lo: number;
  /** consecutive updates with hi > 0 */
  nHi: number;
  nLo: number;
}

export type CusumSide = 'up' | 'down';

export interface CusumAlarm {
  /** index of the value at which a statistic first exceeded h */
  index: number;
  side: CusumSide;
  /** the statistic at the alarm, sigma units */
  statistic: number;
  /** N+ or N- at the alarm (finite values in the current run) */
  run: number;
  /** estimated first changed value: the index after the last one whose statistic was zero */
  change_index: number;
  /** estimated mean after the change, in the units of x */
  new_mean: number;
}

export function cusumStart(): CusumState {
  return { hi: 0, lo: 0, nHi: 0, nLo: 0 };
}

/** One update with a standardised value z (NaN: no update). Returns a new state. */
export function cusumStep(s: CusumState, z: number, k: number): CusumState {
  if (!Number.isFinite(z)) return s;
  const hi = Math.max(0, z - k + s.hi);
  const lo = Math.max(0, -z - k + s.lo);
  return { hi, lo, nHi: hi > 0 ? s.nHi + 1 : 0, nLo: lo > 0 ? s.nLo + 1 : 0 };
}

export interface CusumTrace {
  hi: number[];
  lo: number[];
  nHi: number[];
  nLo: number[];
  alarm: CusumAlarm | null;
}

/**
 * Runs the two-sided tabular CUSUM over x with target mu0 and standard deviation sigma (k, h in sigma units) until
 * the first alarm (the trace stops there) or the end. Change index counts NaN-free steps back from the alarm, so a
 * NaN inside the run is stepped over.
 */
export function tabularCusum(x: ArrayLike<number>, mu0: number, sigma: number, k: number, h: number): CusumTrace {
  const trace: CusumTrace = { hi: [], lo: [], nHi: [], nLo: [], alarm: null };
  let s = cusumStart();
  const finiteIdx: number[] = [];
  for (let i = 0; i < x.length; i++) {
    const xi = x[i]!;
    s = cusumStep(s, (xi - mu0) / sigma, k);
    if (Number.isFinite(xi)) finiteIdx.push(i);
    trace.hi.push(s.hi);
    trace.lo.push(s.lo);
    trace.nHi.push(s.nHi);
    trace.nLo.push(s.nLo);
    if (Number.isFinite(xi) && (s.hi > h || s.lo > h)) {
      const up = s.hi > h && s.hi - h >= s.lo - h;
      const stat = up ? s.hi : s.lo;
      const run = up ? s.nHi : s.nLo;
      const change = finiteIdx[finiteIdx.length - run] ?? i;
      const shift = sigma * (k + stat / run);
      trace.alarm = { index: i, side: up ? 'up' : 'down', statistic: stat, run, change_index: change, new_mean: up ? mu0 + shift : mu0 - shift };
      break;
    }
  }
  return trace;
}
