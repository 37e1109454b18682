// The inspiratory CO2 fall fit on a quantised reading: two one-sample falls of the same size are one tie, and a change
// in the last digits of the values (1e-12 mmHg, rounding noise) must not move the fit to the other one. Expected
// values: the fit of the unchanged signal (derived here: the same data up to rounding must give the same fit).
import { describe, expect, it } from 'vitest';
import { fitInspiratoryFall } from '../../src/analyse/fall-fit';
import { expectClose } from '../helpers/expect-close';

describe('inspiratory fall fit: equal one-sample falls', () => {
  // 100 Hz; 40 mmHg, then a first-order-like fall sampled to 0.5 mmHg steps with two equal falls of 10 mmHg, then a
  // slow drift down by 0.05 mmHg a sample (so the settled level depends on where the window after the fall starts)
  const t = Float64Array.from({ length: 120 }, (_, i) => i / 100);
  const base = [...Array(40).fill(40), 30, 20, 13.5, 9, 6.5, 5, 4, 3.5, 3, ...Array.from({ length: 71 }, (_, k) => 3 - 0.02 * (k + 1))];
  const fit = (nudge: number) => {
    const co2 = Float64Array.from(base);
    co2[40] = 30 + nudge; // the falls 40 -> 30 and 30 -> 20 differ by 2 x nudge
    return fitInspiratoryFall(t, co2, 0.2, 1.0)!;
  };
  it('a 1e-12 mmHg change of one value leaves the fit where it was', () => {
    const ref = fit(0);
    expect(ref).not.toBeNull();
    for (const nudge of [1e-12, -1e-12]) {
      const f = fit(nudge);
      expectClose(f.tau_s, ref.tau_s, { rel: 1e-9 });
      expectClose(f.t0_s, ref.t0_s, { abs: 1e-9 });
    }
  });
});
