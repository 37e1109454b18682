// The lag-aware phase III fit against a reference library: with no sensor lag (tau = 0) it is ordinary least squares
// and must equal ml-regression's SimpleLinearRegression (reference implementation: mljs regression-simple-linear);
// with a lag, a line seen through an exact first-order sensor is recovered (common practice, no source).
import { SimpleLinearRegression } from 'ml-regression';
import { describe, it } from 'vitest';
import { fitPhase3 } from '../../src/analyse/phase3-fit';
import { expectClose } from '../helpers/expect-close';

describe('fitPhase3', () => {
  it('equals ml-regression SimpleLinearRegression when tau = 0 (noisy data)', () => {
    const n = 80;
    const T = Float64Array.from({ length: n }, (_, k) => k * 0.01);
    const V = Float64Array.from({ length: n }, (_, k) => 150 + 4 * k + 0.3 * Math.sin(k));
    let s = 3;
    const noise = () => ((s = (s * 16807) % 2147483647), s / 2147483647 - 0.5);
    const Y = Float64Array.from(V, (v) => 30 + 0.012 * v + noise());
    const F = new Float64Array(n).fill(0.4);
    const fit = fitPhase3(T, V, Y, F, 150, 1e9, 0, 0, 0)!;
    // the first window sample is the recursion's anchor and is not a regression row
    const ref = new SimpleLinearRegression(Array.from(V.slice(1)), Array.from(Y.slice(1)));
    expectClose(fit.b, ref.slope, { rel: 1e-9 });
    expectClose(fit.a, ref.intercept, { rel: 1e-9 });
    expectClose(fit.r2, ref.score(Array.from(V.slice(1)), Array.from(Y.slice(1))).r2, { rel: 1e-9 });
  });

  it('recovers a line seen through a first-order sensor (tau 60 ms) from the lagged reading', () => {
    const tau = 0.06;
    const fine = 10000;
    const dtFine = 1 / fine;
    let y = 5; // sensor still far below the line at the window start
    const T: number[] = [];
    const V: number[] = [];
    const Y: number[] = [];
    for (let i = 0; i <= fine * 1.0; i++) {
      const t = i * dtFine;
      const v = 200 + 300 * t;
      const x = 32 + 0.01 * v;
      y += (x - y) * (1 - Math.exp(-dtFine / tau));
      if (i % 100 === 0) {
        T.push(t);
        V.push(v);
        Y.push(y);
      }
    }
    const fit = fitPhase3(T, V, Y, new Array(T.length).fill(0.3), 200, 1e9, tau, 0, 0)!;
    expectClose(fit.b * 1000, 10, { rel: 2e-3 });
    expectClose(fit.a, 32, { abs: 0.02 });
  });
});
