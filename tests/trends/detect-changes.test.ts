// Sustained-change detection on made-up trend series (behaviour of our confirmation rules; no outside values).
import { describe, expect, it } from 'vitest';
import { createRng } from '../../src/simulate/prng';
import { chartArlBins, detectSignalChanges, differenceSd, significantStep } from '../../src/trends/detect-changes';
import { trendSettings } from '../../src/trends/settings';
import { expectClose } from '../helpers/expect-close';

const o = trendSettings();
const arl = chartArlBins(o, 7);

/** 200 +/- noise (relative SD `cv`), with an optional change from bin `at` */
function series(n: number, cv: number, seed: number, change: (i: number) => number = () => 0): number[] {
  const rng = createRng(seed);
  return Array.from({ length: n }, (_, i) => 200 * (1 + cv * rng.normal()) + change(i));
}

describe('detectSignalChanges', () => {
  it('finds a -20 % step at its bin, with before/after medians', () => {
    const x = series(40, 0.005, 1, (i) => (i >= 17 ? -40 : 0));
    const c = detectSignalChanges(x, 'vco2_ml_min', o, arl);
    expect(c).toHaveLength(1);
    expect(c[0]!.change_index).toBe(17);
    expect(c[0]!.side).toBe('down');
    expect(c[0]!.alarm_index).toBe(17);
    expectClose(c[0]!.before, 200, { rel: 0.02 });
    expectClose(c[0]!.after, 160, { rel: 0.02 });
  });

  it('ignores a single odd bin (not sustained)', () => {
    const x = series(40, 0.005, 2, (i) => (i === 20 ? -80 : 0));
    expect(detectSignalChanges(x, 'vco2_ml_min', o, arl)).toEqual([]);
  });

  it('ignores a step smaller than the smallest relevant change (6 % < 10 %)', () => {
    const x = series(40, 0.005, 3, (i) => (i >= 17 ? -12 : 0));
    expect(detectSignalChanges(x, 'vco2_ml_min', o, arl)).toEqual([]);
  });

  it('absorbs a slow drift (+30 % over 60 bins) instead of reporting it', () => {
    const x = series(80, 0.005, 4, (i) => (i >= 10 ? Math.min(60, i - 10) : 0));
    expect(detectSignalChanges(x, 'vco2_ml_min', o, arl)).toEqual([]);
  });

  it('steps over bins without data', () => {
    const x = series(40, 0.005, 5, (i) => (i >= 17 ? -40 : 0));
    x[15] = NaN;
    x[18] = NaN;
    const c = detectSignalChanges(x, 'vco2_ml_min', o, arl);
    expect(c).toHaveLength(1);
    expect(c[0]!.change_index).toBe(17);
  });

  it('noisy signal: a 12 % step is not confirmed (below 3 standard errors), a 30 % step is', () => {
    const small = series(60, 0.06, 6, (i) => (i >= 30 ? -24 : 0));
    expect(detectSignalChanges(small, 'vco2_ml_min', o, arl)).toEqual([]);
    const large = series(60, 0.06, 6, (i) => (i >= 30 ? -60 : 0));
    const c = detectSignalChanges(large, 'vco2_ml_min', o, arl);
    expect(c).toHaveLength(1);
    expect(Math.abs(c[0]!.change_index - 30)).toBeLessThanOrEqual(1);
  });

  it('finds two separate steps and re-learns the baseline after each', () => {
    const x = series(60, 0.005, 7, (i) => (i >= 15 ? -40 : 0) + (i >= 40 ? 60 : 0));
    const c = detectSignalChanges(x, 'vco2_ml_min', o, arl);
    expect(c.map((e) => [e.change_index, e.side])).toEqual([[15, 'down'], [40, 'up']]);
  });

  it('nothing can be found during the first reference bins', () => {
    const x = series(30, 0.005, 8, (i) => (i >= 3 ? -40 : 0));
    const c = detectSignalChanges(x, 'vco2_ml_min', o, arl);
    expect(c.every((e) => e.change_index >= o.reference_bins)).toBe(true);
  });
});

describe('noise helpers', () => {
  it('differenceSd recovers the SD of white noise and ignores a level shift', () => {
    const rng = createRng(9);
    const x = Array.from({ length: 4000 }, (_, i) => 2 * rng.normal() + (i >= 2000 ? 50 : 0));
    expectClose(differenceSd(x), 2, { rel: 0.05 });
  });
  it('significantStep: z sigma sqrt(pi/2) sqrt(1/nb + 1/na)', () => {
    // 3 x 1 x 1.2533 x sqrt(2/3) = 3.0700
    expectClose(significantStep(1, 3, 3, 3), 3.07, { abs: 0.001 });
  });
  it('the false-alarm budget is shared by the charts: ARL per chart = hours x 3600 / bin x signals', () => {
    expect(chartArlBins(o, 7)).toBe(24 * 60 * 7);
  });
});
