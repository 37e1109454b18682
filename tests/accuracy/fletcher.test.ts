// Fletcher's areas and the CO2 elimination efficiency recovered from simulated recordings. Truth per breath from the
// simulator's noise-free curve and arterial PCO2 (src/simulate/breath-truth.ts), by Fletcher's construction (Fletcher R,
// Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88): X = PĒCO2 × V_E, Z = PaCO2 × VDaw, Y = PaCO2 × V_E − X − Z,
// efficiency = X/(X + Y + Z) = PĒCO2/PaCO2. The analysis is given the median true PaCO2 (as the accuracy sweep).
// Limits derived here from the sweep's (docs/accuracy.md): PĒCO2 within 3 % gives X within 3 % and the efficiency
// within 0.03 × efficiency; Z carries the airway dead-space limit (mainstream max(2 mL, 3 %), sidestream max(3 mL, 8 %))
// times PaCO2; Y = PaCO2 V_E − X − Z carries both.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { median } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals } from '../../src/simulate/index';

const CASES = [
  { scenario: 'adult-healthy', seed: 41, sidestream: false },
  { scenario: 'adult-congested-region', seed: 42, sidestream: false },
  { scenario: 'infant-cardiac-shunt', seed: 43, sidestream: false },
  { scenario: 'child-sidestream', seed: 44, sidestream: true },
];

describe("Fletcher's areas and efficiency against the simulator's truth", () => {
  for (const c of CASES) {
    it(c.scenario, () => {
      const truth: { peco2_mmhg: number; paco2_mmhg: number; vt_exp_ml: number; vd_aw_ml: number }[] = [];
      const blocks = [];
      for (const chunk of simulateSignals(scenarioParams(c.scenario, { minutes: 2 }), c.seed)) {
        blocks.push(chunk.block);
        truth.push(...chunk.breaths);
      }
      const settings = defaultSettings();
      const pa = median(truth.map((b) => b.paco2_mmhg));
      settings.analysis.paco2_mmhg = pa;
      const analyser = createAnalyser(settings);
      for (const b of blocks) analyser.push(b);
      const used = analyser.finish().breaths.filter((b) => usableForSummary(b));
      expect(used.length).toBeGreaterThan(10);
      const m = (f: (b: (typeof used)[number]) => number) => median(used.map(f));
      const t = (f: (b: (typeof truth)[number]) => number) => median(truth.map(f));
      const x = t((b) => b.peco2_mmhg * b.vt_exp_ml);
      const z = t((b) => pa * b.vd_aw_ml);
      const y = t((b) => pa * b.vt_exp_ml - b.peco2_mmhg * b.vt_exp_ml - pa * b.vd_aw_ml);
      const eff = t((b) => b.peco2_mmhg / pa);
      const vd = t((b) => b.vd_aw_ml);
      const vdLimit = c.sidestream ? Math.max(3, 0.08 * vd) : Math.max(2, 0.03 * vd);
      expect(Math.abs(m((b) => b.co2_efficiency) - eff)).toBeLessThanOrEqual(0.03 * eff);
      expect(Math.abs(m((b) => b.fletcher_x_mmhg_ml) - x)).toBeLessThanOrEqual(0.03 * x);
      expect(Math.abs(m((b) => b.fletcher_z_mmhg_ml) - z)).toBeLessThanOrEqual(pa * vdLimit);
      expect(Math.abs(m((b) => b.fletcher_y_mmhg_ml) - y)).toBeLessThanOrEqual(pa * vdLimit + 0.03 * x);
    });
  }
});
