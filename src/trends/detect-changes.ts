import { mad, median } from '../numeric/stats';
import { decisionInterval } from './arl';
import { cusumStart, cusumStep, type CusumSide, type CusumState } from './cusum';
import type { TrendSettings } from '../settings';
import { minChange, type TrendSignal } from './signals';

/** A confirmed sustained change of one signal. Indices refer to the trend rows. */
export interface SignalChange {
  signal: TrendSignal;
  side: CusumSide;
  /** estimated first changed bin (CUSUM: the bin after the last zero of the statistic) */
  change_index: number;
  /** bin at whose end the statistic crossed h */
  alarm_index: number;
  /** median of the `before_bins` bins before the change */
  before: number;
  /** median of the bins [change + settle_bins, change + settle_bins + sustained bins) */
  after: number;
}

/** Bins in the "after" window: the sustained duration in bins (at least 1). */
export function sustainedBins(o: TrendSettings): number {
  return Math.max(1, Math.ceil(o.min_sustained_s / o.bin_s - 1e-9));
}

/** Two-sided in-control ARL each signal's chart must reach so that all charts together meet the budget, in bins. */
export function chartArlBins(o: TrendSettings, signals: number): number {
  return ((o.false_alarm_hours * 3600) / o.bin_s) * Math.max(1, signals);
}

/** Finite values of x taken backwards from index `end` - 1 down to `start`, at most `count`. */
export function valuesBack(x: ArrayLike<number>, start: number, end: number, count: number): number[] {
  const vals: number[] = [];
  for (let i = end - 1; i >= Math.max(0, start) && vals.length < count; i--) if (Number.isFinite(x[i]!)) vals.push(x[i]!);
  return vals;
}

/** Median of up to `count` finite values of x taken backwards from index `end` - 1 down to `start`. */
export function medianBack(x: ArrayLike<number>, start: number, end: number, count: number): number {
  return median(valuesBack(x, start, end, count));
}

/** Finite values of x in [start, end); empty when fewer than `need` are finite or the window runs past x. */
export function valuesWindow(x: ArrayLike<number>, start: number, end: number, need: number): number[] {
  if (end > x.length || start < 0) return [];
  const vals: number[] = [];
  for (let i = start; i < end; i++) if (Number.isFinite(x[i]!)) vals.push(x[i]!);
  return vals.length >= need ? vals : [];
}

/** Median of the finite values of x in [start, end); NaN when fewer than `need` are finite or the window runs past x. */
export function medianWindow(x: ArrayLike<number>, start: number, end: number, need: number): number {
  return median(valuesWindow(x, start, end, need));
}

/**
 * Smallest step between the medians of nb and na values that is `z` standard errors away from zero for noise SD sigma:
 * z sigma 1.2533 sqrt(1/nb + 1/na) (1.2533 = sqrt(pi/2), the large-sample efficiency loss of a median against a mean
 * for normal data [common practice, no source: large-sample asymptotics]).
 */
export function significantStep(sigma: number, nb: number, na: number, z: number): number {
  return z * sigma * 1.2533 * Math.sqrt(1 / nb + 1 / na);
}

interface Baseline {
  mu0: number;
  sigma: number;
  k: number;
  h: number;
  /** first index of the window the baseline came from */
  start: number;
}

/**
 * Sustained changes of one signal (x = the signal per trend bin, NaN = no value), by Page's tabular CUSUM on values
 * standardised with a robust baseline:
 * 1. Baseline: median mu0 of `reference_bins` finite bins; sigma = the largest of the whole record's bin-to-bin noise
 *    (differenceSd), 1.4826 MAD of the reference bins and sd_floor_fraction x d, where d is the smallest relevant
 *    change (signals.ts minChange) at mu0.
 * 2. CUSUM with k = cusum_k_fraction x d / sigma (Page's choice k = half the shift to detect) and h from the
 *    false-alarm budget (arl.ts, Siegmund): the chart's two-sided in-control ARL is `arlBins`.
 * 3. At an alarm, the change point is the CUSUM estimate (after the last zero). The change is kept only if it is
 *    sustained and a step: |median(after window) - median(before window)| >= d in the alarm's direction, the after
 *    window being the `min_sustained_s` after `settle_bins`, and the step is at least `confirm_z` standard errors
 *    (significantStep) so that noisy signals need larger steps. A kept change restarts the baseline from the after window;
 *    a rejected alarm (single odd bins, slow drift) re-learns the baseline from the latest `reference_bins` bins, so
 *    drifts are absorbed instead of accumulating.
 * No change can be found in the first `reference_bins` bins, nor confirmed when the after window runs past the end.
 */
export function detectSignalChanges(x: ArrayLike<number>, signal: TrendSignal, o: TrendSettings, arlBins: number): SignalChange[] {
  const out: SignalChange[] = [];
  const n = x.length;
  const sdDiff = differenceSd(x) || 0; // NaN (too few values) counts as 0
  const after = sustainedBins(o);
  const needAfter = Math.ceil(after / 2);
  const hCache = new Map<number, number>();
  const makeBaseline = (vals: number[], start: number): Baseline | null => {
    const mu0 = median(vals);
    const d = minChange(signal, mu0, o);
    if (!Number.isFinite(mu0) || !(d > 0)) return null;
    const sigma = Math.max(sdDiff, 1.4826 * mad(vals), o.sd_floor_fraction * d, 1e-12 * Math.max(1, Math.abs(mu0)));
    const k = (o.cusum_k_fraction * d) / sigma;
    const key = Math.round(k * 1e6);
    let h = hCache.get(key);
    if (h === undefined) {
      h = decisionInterval(k, arlBins);
      hCache.set(key, h);
    }
    return { mu0, sigma, k, h, start };
  };
  /** learns a baseline from the first reference_bins finite values at or after `from`; returns it and the next index */
  const learnForward = (from: number): { base: Baseline | null; next: number } => {
    const vals: number[] = [];
    let i = from;
    for (; i < n && vals.length < o.reference_bins; i++) if (Number.isFinite(x[i]!)) vals.push(x[i]!);
    return { base: vals.length === o.reference_bins ? makeBaseline(vals, from) : null, next: i };
  };

  let { base, next: i } = learnForward(0);
  let s: CusumState = cusumStart();
  const finiteSince: number[] = []; // finite indices since the baseline was set (for the change-point estimate)
  while (base && i < n) {
    const xi = x[i]!;
    if (Number.isFinite(xi)) {
      s = cusumStep(s, (xi - base.mu0) / base.sigma, base.k);
      finiteSince.push(i);
      if (s.hi > base.h || s.lo > base.h) {
        const side: CusumSide = s.hi - base.h >= s.lo - base.h ? 'up' : 'down';
        const run = side === 'up' ? s.nHi : s.nLo;
        const change = finiteSince[finiteSince.length - run] ?? i;
        const beforeVals = valuesBack(x, base.start, change, o.before_bins);
        const afterVals = valuesWindow(x, change + o.settle_bins, change + o.settle_bins + after, needAfter);
        const before = median(beforeVals);
        const afterMed = median(afterVals);
        const step = afterMed - before;
        const d = minChange(signal, before, o);
        const noise = significantStep(base.sigma, beforeVals.length, afterVals.length, o.confirm_z);
        const kept = Math.abs(step) >= d && Math.abs(step) >= noise && (side === 'up' ? step > 0 : step < 0);
        if (kept) {
          out.push({ signal, side, change_index: change, alarm_index: i, before, after: afterMed });
          ({ base, next: i } = learnForward(change + o.settle_bins));
        } else {
          const vals: number[] = [];
          let j = i;
          for (; j >= 0 && vals.length < o.reference_bins; j--) if (Number.isFinite(x[j]!)) vals.push(x[j]!);
          base = makeBaseline(vals, j + 1);
          i += 1;
        }
        s = cusumStart();
        finiteSince.length = 0;
        continue;
      }
    }
    i += 1;
  }
  return out;
}

/**
 * Bin-to-bin noise of a whole series: 1.4826 x median |x_i - x_(i-1)| / sqrt(2) over consecutive finite values. For
 * independent normal noise this estimates its SD; level shifts and slow drifts barely move it, because a step spoils
 * only one difference (the robust "MAD of first differences" used to set noise levels in change-point analysis)
 * [common practice, no source]. NaN when fewer than 2 finite values.
 */
export function differenceSd(x: ArrayLike<number>): number {
  const diffs: number[] = [];
  let prev = NaN;
  for (let i = 0; i < x.length; i++) {
    const v = x[i]!;
    if (!Number.isFinite(v)) continue;
    if (Number.isFinite(prev)) diffs.push(Math.abs(v - prev));
    prev = v;
  }
  return diffs.length ? (1.4826 * median(diffs)) / Math.SQRT2 : NaN;
}
