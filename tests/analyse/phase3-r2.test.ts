// R² of the lag-aware phase III fit must describe the sensor readings in the window: the share of their variance the
// fitted line (seen through the sensor) explains. Expected values derived here: a flat plateau plus noise that is not
// correlated with volume has nothing a line can explain (R² near 0); a noise-free line seen through an exact
// first-order sensor is explained completely (R² = 1).
import { describe, expect, it } from 'vitest';
import { decomposeBreath, type BreathSignals } from '../../src/analyse/decompose';
import { fitPhase3 } from '../../src/analyse/phase3-fit';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';

function lcgNoise(seed: number): () => number {
  let s = seed;
  return () => ((s = (s * 16807) % 2147483647), s / 2147483647 - 0.5);
}

describe('phase III R² against the readings', () => {
  it('a flat noisy plateau read through a lagged sensor has R² near 0', () => {
    const n = 120;
    const T = Float64Array.from({ length: n }, (_, k) => k * 0.01);
    const V = Float64Array.from({ length: n }, (_, k) => 200 + 3 * k);
    const noise = lcgNoise(11);
    const Y = Float64Array.from({ length: n }, () => 40 + noise());
    const fit = fitPhase3(T, V, Y, new Float64Array(n).fill(0.3), 200, 1e9, 0.06, 0, 0)!;
    expect(fit.r2).toBeLessThan(0.2);
  });

  it('a noise-free line read through a lagged sensor (tau 60 ms) has R² = 1', () => {
    const tau = 0.06;
    const dtFine = 1e-4;
    let y = 5;
    const T: number[] = [];
    const V: number[] = [];
    const Y: number[] = [];
    for (let i = 0; i <= 10000; i++) {
      const t = i * dtFine;
      const v = 200 + 300 * t;
      y += (32 + 0.01 * v - y) * (1 - Math.exp(-dtFine / tau));
      if (i % 100 === 0) {
        T.push(t);
        V.push(v);
        Y.push(y);
      }
    }
    const fit = fitPhase3(T, V, Y, new Array(T.length).fill(0.3), 200, 1e9, tau, 0, 0)!;
    expectClose(fit.r2, 1, { abs: 1e-4 });
  });

  it('the min_phase3_r2 gate flags a flat noisy plateau as a poor fit', () => {
    // constant flow 0.5 L/s, 1 s in, 1 s out, 100 Hz; CO2 0 up to 150 mL, then 40 mmHg with +-0.5 mmHg noise
    const rate = 100;
    const n = 2 * rate + 1;
    const noise = lcgNoise(5);
    const t = Float64Array.from({ length: n }, (_, i) => i / rate);
    const flow = Float64Array.from({ length: n }, (_, i) => (i === 0 || i === n - 1 ? 0 : i >= rate ? 0.5 : -0.5));
    const co2 = Float64Array.from({ length: n }, (_, i) => (i >= rate && (i - rate) * 5 >= 150 ? 40 + noise() : 0));
    const signals: BreathSignals = {
      t_s: t, flow_lps: flow, fast_mmhg: co2, raw_mmhg: co2,
      i_insp: 0, i_exp: rate, i_end: n - 1, t_insp_s: 0, t_exp_s: 1, t_end_s: 2,
    };
    const settings = defaultSettings().analysis;
    settings.min_phase3_r2 = 0.5;
    const d = decomposeBreath(signals, { breath: 1, delay_s: 0, tau_s: 0.06, settings });
    expect(d.row.slope3_r2).toBeLessThan(0.5);
    expect(d.flags).toContain('poor_fit');
  });
});
