// The PĀECO2-normalised phase III slopes recovered from simulated recordings: the median over the usable breaths of
// `slope3_norm_paeco2_per_l` (SIII / PĀECO2) and `slope3_vt_norm` (SIII x VT / PĀECO2) against the simulator's truth
// (true slope / true PĀECO2, and x V_E / 1000; src/simulate/breath-truth.ts), within the sweep's phase III slope limit
// of 15 % (docs/accuracy.md), over all 50 of the sweep's seeded combinations (adult, congested-region, child and
// infant subjects; mainstream and sidestream; worst errors 8.2 % and 9.5 % when written). Simulated data check the
// pipeline, not the formulas (those are in tests/derived/phase-shape-indices.test.ts).
import { describe, expect, it } from 'vitest';
import { runCombo, sweepCombos, type SweepMetric } from './sweep';

const METRICS: SweepMetric[] = [
  ['slope3_mmhg_per_l', 'slope3_mmhg_per_l', 'slope3_mmhg_per_l'],
  ['slope3_norm_paeco2_per_l', 'slope3_norm_paeco2_per_l', 'slope3_norm_paeco2_per_l'],
  ['slope3_vt_norm', 'slope3_vt_norm', 'slope3_vt_norm'],
];

describe('normalised phase III slopes on simulated recordings (limit ±15 % of truth, as the phase III slope)', () => {
  for (const combo of sweepCombos(50)) {
    it(`${combo.name}`, () => {
      const r = runCombo(combo, METRICS);
      expect(r.used).toBeGreaterThan(0.5 * r.breaths);
      for (const [key] of METRICS) {
        const truth = r.truth[key]!;
        expect(Number.isFinite(truth), key).toBe(true);
        const relError = Math.abs(r.measured[key]! - truth) / Math.abs(truth);
        expect(relError, `${key}: measured ${r.measured[key]} truth ${truth}`).toBeLessThanOrEqual(0.15);
      }
    });
  }
});
