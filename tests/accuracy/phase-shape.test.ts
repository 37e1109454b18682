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
  ['slope2_mmhg_per_l', 'slope2_mmhg_per_l', 'slope2_mmhg_per_l'],
  ['vae_vt', 'vae_vt', 'vae_vt'],
  ['angle23_deg', 'angle23_deg', 'angle23_deg'],
];

// Limits of the phase II indices (our choice; no sweep limit exists for them), from what the 50 combinations gave when
// written: mainstream phase II slope within 25 % (worst −19.5 %), VAE/VT within 0.03 (0.022), angle within 1° (0.56°);
// sidestream VAE/VT within 0.15 (0.117) and angle within 3° (2.3°), and no limit on the phase II slope, which reads up
// to 54 % low: a 150 ms sensor response broadens phase II more than its first-order compensation restores, in the
// infant most (docs/accuracy.md).
const PHASE2_LIMITS = {
  mainstream: { slope2_rel: 0.25, vae_vt: 0.03, angle23_deg: 1 },
  sidestream: { slope2_rel: Infinity, vae_vt: 0.15, angle23_deg: 3 },
};

describe('phase-shape indices on simulated recordings (normalised phase III slopes ±15 % of truth, as the phase III slope; phase II indices below)', () => {
  for (const combo of sweepCombos(50)) {
    it(`${combo.name}`, () => {
      const r = runCombo(combo, METRICS);
      expect(r.used).toBeGreaterThan(0.5 * r.breaths);
      const lim = PHASE2_LIMITS[combo.kind];
      const err = (k: string) => r.measured[k]! - r.truth[k]!;
      expect(Math.abs(err('vae_vt')), 'vae_vt').toBeLessThanOrEqual(lim.vae_vt);
      expect(Math.abs(err('angle23_deg')), 'angle23_deg').toBeLessThanOrEqual(lim.angle23_deg);
      expect(Math.abs(err('slope2_mmhg_per_l') / r.truth.slope2_mmhg_per_l!), 'slope2').toBeLessThanOrEqual(lim.slope2_rel);
      for (const [key] of METRICS.slice(0, 3)) {
        const truth = r.truth[key]!;
        expect(Number.isFinite(truth), key).toBe(true);
        const relError = Math.abs(r.measured[key]! - truth) / Math.abs(truth);
        expect(relError, `${key}: measured ${r.measured[key]} truth ${truth}`).toBeLessThanOrEqual(0.15);
      }
    });
  }
});
