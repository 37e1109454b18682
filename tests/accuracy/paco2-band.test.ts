// The band around the PaCO2 estimated between blood gases is a prediction interval: over simulated recordings with
// the gradient changing between gases (steps in perfusion and dead space, a tidal-volume change, a shunting infant,
// a stable hour), a nominal 80 % band must hold the true PaCO2 in 70-90 % of the estimated breaths and a nominal
// 95 % band in 90-99 % (limits our choice: within 10 and 5 points of the nominal level). Ground truth: the
// simulator's arterial PCO2 per breath; blood gases with analyser error as in paco2-band.ts.
// A step in the gradient between two gases (the dead-space rise) cannot be seen in the gradients so far; the band
// widens with how far PETCO2 has moved since the gas (src/gas/estimate-paco2.ts, petco2Movement). Without that term
// the 95 % band held 89.7 % (an expected failure here until then).
import { describe, expect, it } from 'vitest';
import { COVERAGE_CASES, coverage } from './paco2-band';

const KNOWN_SHORTFALLS = new Set<number>([]);

describe('coverage of the PaCO2 band over the simulated scenarios', () => {
  for (const [level, lo, hi] of [[0.8, 0.7, 0.9], [0.95, 0.9, 0.99]] as const) {
    (KNOWN_SHORTFALLS.has(level) ? it.fails : it)(`nominal ${100 * level} % covers ${100 * lo}-${100 * hi} % of the estimated breaths`, () => {
      let breaths = 0;
      let inside = 0;
      for (const c of COVERAGE_CASES) {
        const r = coverage(c, level);
        breaths += r.breaths;
        inside += r.inside;
      }
      expect(breaths).toBeGreaterThan(1000);
      const share = inside / breaths;
      expect(share).toBeGreaterThanOrEqual(lo);
      expect(share).toBeLessThanOrEqual(hi);
    });
  }
});
