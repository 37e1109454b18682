// Accuracy of the whole analysis against simulated recordings with known truth (limits in docs/accuracy.md).
// 50 seeded combinations across adult / child / infant volumes, square (volume control), decelerating (pressure
// control) and spontaneous flow, inspiratory pause, mainstream and sidestream sensors (delay, 10-90 % rise time up to
// 60 ms mainstream and 150 ms sidestream), CO2 and flow noise, and rebreathing. Truth is the simulator's noise-free
// model (src/simulate/MODEL.md); the limits are those of docs/accuracy.md. Simulated data are
// ground truth for the pipeline only, never for a formula (formulas are checked in tests/published).
import { describe, expect, it } from 'vitest';
import { checkLimits, runCombo, sweepCombos, type ComboResult } from './sweep';

const combos = sweepCombos(50);
const results: ComboResult[] = [];

describe('accuracy sweep: 50 seeded simulator combinations through the full analysis', () => {
  for (const combo of combos) {
    it(`${combo.name} is within the limits`, () => {
      const r = runCombo(combo);
      results.push(r);
      expect(checkLimits(r)).toEqual([]);
    });
  }
  it('reports accuracy per metric over the sweep', () => {
    const keys = ['vd_aw_ml', 'petco2_mmhg', 'peco2_mmhg', 'slope3_mmhg_per_l', 'vdvt_enghoff'];
    const lines = keys.map((k) => {
      const rel = results.map((r) => Math.abs(r.measured[k]! - r.truth[k]!) / Math.abs(r.truth[k]!));
      const abs = results.map((r) => Math.abs(r.measured[k]! - r.truth[k]!));
      return `${k}: worst |error| ${Math.max(...abs).toFixed(3)} (${(100 * Math.max(...rel)).toFixed(1)} %), mean ${(abs.reduce((a, b) => a + b, 0) / abs.length).toFixed(3)}`;
    });
    console.log(`accuracy over ${results.length} combinations\n  ${lines.join('\n  ')}`);
    expect(results.length).toBe(50);
  });
});
