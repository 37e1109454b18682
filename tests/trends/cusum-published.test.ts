// The change-point method (tabular CUSUM, Page 1954) against a published worked example and published run lengths.
import { describe, expect, it } from 'vitest';
import { createRng } from '../../src/simulate/prng';
import { decisionInterval, siegmundArl, twoSidedArl } from '../../src/trends/arl';
import { cusumStart, cusumStep, tabularCusum } from '../../src/trends/cusum';
import { expectClose } from '../helpers/expect-close';

// Montgomery DC, Introduction to Statistical Quality Control (6th ed., Wiley 2009), chapter 9, Example 9.1
// and Table 9.1: 30 observations, the first 20 from N(10, 1), the last 10 from N(11, 1); tabular CUSUM with target 10,
// sigma 1, K = 0.5, H = 5. Published results: C+ first exceeds H at observation 29 with C+_29 = 5.28 and N+ = 7, so the
// shift is placed after observation 22 and the new mean estimated as 10 + 0.5 + 5.28/7 = 11.25.
const MONTGOMERY_9_1 = [
  9.45, 7.99, 9.29, 11.66, 12.16, 10.18, 8.04, 11.46, 9.2, 10.34, 9.03, 11.47, 10.51, 9.4, 10.08, 9.37, 10.62, 10.31, 8.52,
  10.84, 10.9, 9.33, 12.29, 11.5, 10.6, 11.08, 10.38, 11.62, 11.31, 10.52,
];

describe('tabular CUSUM: Montgomery Example 9.1 (Montgomery, Introduction to SQC, 6th ed., Table 9.1)', () => {
  const trace = tabularCusum(MONTGOMERY_9_1, 10, 1, 0.5, 5);

  it('alarms at observation 29 on the upper side with C+ = 5.28 and N+ = 7', () => {
    expect(trace.alarm).not.toBeNull();
    const a = trace.alarm!;
    expect(a.index + 1).toBe(29);
    expect(a.side).toBe('up');
    expectClose(a.statistic, 5.28, { abs: 0.005 }, 'C+_29');
    expect(a.run).toBe(7);
  });

  it('places the shift after observation 22 and estimates the new mean as 11.25', () => {
    const a = trace.alarm!;
    expect(a.change_index + 1).toBe(23);
    expectClose(a.new_mean, 11.25, { abs: 0.005 }, 'new mean');
  });

  it('the lower statistic never reaches H in this example', () => {
    expect(Math.max(...trace.lo)).toBeLessThan(5);
  });

  it('NaN values are stepped over without changing the result', () => {
    const withGaps = [...MONTGOMERY_9_1.slice(0, 24), NaN, ...MONTGOMERY_9_1.slice(24)];
    const t = tabularCusum(withGaps, 10, 1, 0.5, 5);
    expect(t.alarm!.index).toBe(29); // one place later because of the inserted gap
    expectClose(t.alarm!.statistic, 5.28, { abs: 0.005 });
    expect(t.alarm!.run).toBe(7);
    expect(t.alarm!.change_index).toBe(22);
  });
});

describe("Siegmund's ARL approximation (Montgomery, Introduction to SQC, 6th ed., section 9.1, k = 0.5, h = 5)", () => {
  it('one-sided in-control ARL 938.2, two-sided 469.1', () => {
    expectClose(siegmundArl(0.5, 5, 0), 938.2, { abs: 0.05 });
    expectClose(twoSidedArl(0.5, 5, 0), 469.1, { abs: 0.05 });
  });
  it('ARL for a one-sigma shift 10.34', () => {
    expectClose(siegmundArl(0.5, 5, 1), 10.34, { abs: 0.005 });
    expectClose(twoSidedArl(0.5, 5, 1), 10.34, { abs: 0.005 });
  });
  it('decisionInterval inverts it: the budget 469.1 gives h = 5', () => {
    expectClose(decisionInterval(0.5, 469.1), 5, { abs: 0.001 });
  });
  it('a larger false-alarm budget needs a larger h', () => {
    expect(decisionInterval(0.5, 10000)).toBeGreaterThan(decisionInterval(0.5, 1000));
  });
});

/** Mean run length of the two-sided tabular CUSUM (cusumStep + the alarm rule of tabularCusum) by simulation. */
function simulatedArl(k: number, h: number, shift: number, runs: number, seed: number): number {
  const rng = createRng(seed);
  let total = 0;
  for (let r = 0; r < runs; r++) {
    let s = cusumStart();
    let n = 0;
    do {
      s = cusumStep(s, shift + rng.normal(), k);
      n++;
    } while (!(s.hi > h || s.lo > h));
    total += n;
  }
  return total / runs;
}

// Montgomery, Introduction to SQC, 6th ed., Table 9.3 "ARL performance of the tabular CUSUM with k = 1/2
// and h = 4 or h = 5" (two-sided, exact Markov-chain values): h = 4 -> ARL0 168, ARL(1 sigma) 8.38;
// h = 5 -> ARL0 465, ARL(1 sigma) 10.4. The simulated run lengths of our implementation must match them within
// about 3 standard errors (SE ~ ARL / sqrt(runs) in control).
describe('run lengths of the implementation against the published ARL table (Montgomery, 6th ed., Table 9.3)', () => {
  it('h = 5, in control: 465', () => {
    expectClose(simulatedArl(0.5, 5, 0, 4000, 101), 465, { rel: 0.05 });
  });
  it('h = 4, in control: 168', () => {
    expectClose(simulatedArl(0.5, 4, 0, 4000, 102), 168, { rel: 0.05 });
  });
  it('h = 5, one-sigma shift: 10.4', () => {
    expectClose(simulatedArl(0.5, 5, 1, 4000, 103), 10.4, { rel: 0.03 });
  });
  it('h = 4, one-sigma shift: 8.38', () => {
    expectClose(simulatedArl(0.5, 4, 1, 4000, 104), 8.38, { rel: 0.03 });
  });
});
