// Per-kg values of each breath: value / weight (derived here: the arithmetic of a per-kg value), with the weight
// chooseWeight picks: predicted body weight for adults with height and sex (ARDS Network 2000, N Engl J Med
// 342:1301-1308: men 50 + 0.91 (height − 152.4) kg), else the actual weight.
import { describe, expect, it } from 'vitest';
import { applyWeight, chooseWeight } from '../../src/gas/index';
import { perKilogram } from '../../src/physiology/index';
import { expectClose } from '../helpers/expect-close';
import { makeBreath } from './make-breath';

describe('per-kg breath values', () => {
  it('divide by the weight: 500 mL / 70 kg = 7.1429 mL/kg, 150 / 70 = 2.1429, 210 mL/min / 70 = 3 mL/kg/min', () => {
    const rows = [makeBreath({ t_start_s: 0, vt_exp_ml: 500, vd_aw_ml: 150, vd_enghoff_ml: 175, vco2_ml_min: 210 })];
    applyWeight(rows, 70);
    expectClose(rows[0]!.vt_exp_ml_per_kg, 7.142857, { abs: 1e-6 });
    expectClose(rows[0]!.vd_aw_ml_per_kg, 2.142857, { abs: 1e-6 });
    expectClose(rows[0]!.vd_enghoff_ml_per_kg, 2.5, { abs: 1e-12 });
    expectClose(rows[0]!.vco2_ml_kg_min, 3, { abs: 1e-12 });
  });

  it('predicted body weight of a 180 cm man: 50 + 0.91 × 27.6 = 75.116 kg, so 150 mL is 1.9969 mL/kg', () => {
    const w = chooseWeight({ height_cm: 180, sex: 'male', weight_kg: 95 });
    expectClose(w.weight_kg, 75.116, { abs: 1e-9 });
    expectClose(perKilogram(150, w.weight_kg), 1.99691, { abs: 1e-5 });
  });

  it('no weight: empty values, and a missing value stays empty', () => {
    const rows = [makeBreath({ t_start_s: 0, vt_exp_ml: 500, vd_aw_ml: 150, vd_enghoff_ml: NaN })];
    applyWeight(rows, NaN);
    expect(rows[0]!.vt_exp_ml_per_kg).toBeNaN();
    applyWeight(rows, 10);
    expect(rows[0]!.vd_enghoff_ml_per_kg).toBeNaN();
  });
});
