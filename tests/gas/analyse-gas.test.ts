// Dead-space arithmetic of analyseGas on hand-built breath rows. Expected values are worked by hand (derived here):
// synthetic curve B (docs/methods.md, Derivations: PaCO2 40, PECO2 26.10, PETCO2 39.0, VDaw 149.648, VT 500 ->
// gradient 1.0, AVDSF 0.025, Enghoff 0.3475, VDphys 173.75, VDalv 24.10, Bohr at L(350) 0.3040), AVDSF (40 - 35)/40
// = 0.125, and predicted body weight male 175 cm 50 + 0.91 x 22.6 = 70.57 kg (ARDS Network 2000 formula, N Engl J Med
// 342:1301-1308).
import { describe, expect, it } from 'vitest';
import { analyseGas } from '../../src/gas/index';
import { expectClose } from '../helpers/expect-close';
import { makeBreath, makeSample } from './make-breath';

// Three ok breaths in the window whose per-field medians are the curve B values, plus decoys that must be ignored:
// a non-ok breath in the window and ok breaths outside it, all with wild values.
const W20_BREATHS = [
  makeBreath({ breath: 1, t_start_s: 10, petco2_mmhg: 60, peco2_mmhg: 5, vt_exp_ml: 2000, vd_aw_ml: 900, vdvt_bohr: 0.9 }),
  makeBreath({ breath: 2, t_start_s: 50, petco2_mmhg: 38.5, peco2_mmhg: 26.3, vt_exp_ml: 490, vd_aw_ml: 151, vdvt_bohr: 0.31 }),
  makeBreath({ breath: 3, t_start_s: 55, status: 'leak', petco2_mmhg: 10, peco2_mmhg: 2, vt_exp_ml: 50, vd_aw_ml: 10, vdvt_bohr: 0.1 }),
  makeBreath({ breath: 4, t_start_s: 60, petco2_mmhg: 39.0, peco2_mmhg: 25.9, vt_exp_ml: 500, vd_aw_ml: 149.648, vdvt_bohr: 0.304 }),
  makeBreath({ breath: 5, t_start_s: 70, petco2_mmhg: 39.6, peco2_mmhg: 26.1, vt_exp_ml: 515, vd_aw_ml: 148, vdvt_bohr: 0.3 }),
  makeBreath({ breath: 6, t_start_s: 99, petco2_mmhg: 60, peco2_mmhg: 5, vt_exp_ml: 2000, vd_aw_ml: 900, vdvt_bohr: 0.9 }), // ends after t
];

describe('analyseGas: dead-space arithmetic (synthetic curve B)', () => {
  const result = analyseGas(W20_BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40 })], {
    pb_mmhg: 760,
    height_cm: 175,
    sex: 'male',
  });
  const row = result.rows[0]!;

  it('uses the 3 ok breaths of the 60 s window and reports the count', () => {
    expect(row.breaths_used).toBe(3);
    expectClose(row.petco2_mmhg, 39.0);
    expectClose(row.peco2_mmhg, 26.1);
    expectClose(row.vt_exp_ml, 500);
    expectClose(row.vd_aw_ml, 149.648);
  });

  it('gradient 1.0 mmHg, AVDSF 0.025', () => {
    expectClose(row.gradient_mmhg, 1.0);
    expectClose(row.avdsf, 0.025);
  });

  it('Enghoff 0.3475, VDphys 173.75 mL, VDalv 24.10 mL; Bohr 0.3040 side by side, difference 0.0435', () => {
    expectClose(row.vdvt_enghoff, 0.3475);
    expectClose(row.vd_phys_ml, 173.75);
    expectClose(row.vd_alv_enghoff_ml, 24.1);
    expectClose(row.vdvt_bohr, 0.304);
    expectClose(row.vdvt_difference, 0.3475 - 0.304);
  });

  it('per-kg values on predicted body weight (male 175 cm -> 70.57 kg) and the basis is recorded', () => {
    expectClose(row.vd_aw_ml_per_kg, 149.648 / 70.57);
    expectClose(row.vd_phys_ml_per_kg, 173.75 / 70.57);
    expectClose(row.vd_alv_enghoff_ml_per_kg, 24.1 / 70.57);
    expect(result.settings.weight_basis).toBe('predicted_body_weight');
    expectClose(result.settings.weight_used_kg as number, 70.57);
  });

  it('no shunt inputs: shunt cells empty and the missing inputs are named', () => {
    expect(Number.isNaN(row.shunt_fraction)).toBe(true);
    expect(Number.isNaN(row.gradient_shunt_mmhg)).toBe(true);
    expect(Number.isNaN(row.gradient_rest_mmhg)).toBe(true);
    expect(row.shunt_method).toBe('');
    expect(row.pvco2_source).toBe('');
    expect(row.missing_inputs.split(';')).toEqual(['sao2_pct', 'svo2_pct', 'pao2_mmhg', 'hb_g_dl', 'fio2_pct']);
  });

  it('records every setting used, with defaults', () => {
    expect(result.settings).toMatchObject({
      window_s: 60,
      pb_mmhg: 760,
      rq: 0.8,
      hb_o2_capacity_ml_per_g: 1.34,
      o2_dissolved_ml_per_dl_per_mmhg: 0.003,
      end_capillary_saturation: 'odc',
      alveolar_gas_form: 'full',
      default_pv_a_co2_mmhg: 6,
      co2_slope_k: 0.67,
      gradient_change_mmhg: 5,
    });
  });

  it('Enghoff from the median PECO2 equals the median of per-breath Enghoff with the same PaCO2 (even count too)', () => {
    const peco2 = [25.0, 26.0, 27.5, 30.0];
    const breaths = peco2.map((p, i) => makeBreath({ breath: i + 1, t_start_s: 50 + 5 * i, peco2_mmhg: p, petco2_mmhg: 38 }));
    const r = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760 }).rows[0]!;
    const perBreath = peco2.map((p) => (40 - p) / 40).sort((a, b) => a - b);
    expectClose(r.vdvt_enghoff, (perBreath[1]! + perBreath[2]!) / 2, { rel: 1e-12 });
    expectClose(r.vdvt_enghoff, (40 - 26.75) / 40, { rel: 1e-12 });
  });
});

describe('analyseGas: weights, windows and missing breaths', () => {
  const breaths = [makeBreath({ breath: 1, t_start_s: 50, petco2_mmhg: 35, peco2_mmhg: 26.1, vt_exp_ml: 500, vd_aw_ml: 150 })];

  it('PaCO2 40, PETCO2 35 -> AVDSF 0.125 [derived here: 5/40]', () => {
    const r = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760 }).rows[0]!;
    expectClose(r.avdsf, 0.125);
    expectClose(r.gradient_mmhg, 5);
  });

  it('actual weight when no height/sex; none when nothing is given', () => {
    const withWeight = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760, weight_kg: 20 });
    expect(withWeight.settings.weight_basis).toBe('actual_weight');
    expectClose(withWeight.rows[0]!.vd_aw_ml_per_kg, 7.5);
    const none = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760 });
    expect(none.settings.weight_basis).toBe('none');
    expect(Number.isNaN(none.rows[0]!.vd_aw_ml_per_kg)).toBe(true);
    expect(none.rows[0]!.missing_inputs.split(';')).toContain('weight_kg');
  });

  it('short stature: the adult PBW formula is not used; actual weight instead, with a warning', () => {
    const r = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], {
      pb_mmhg: 760,
      height_cm: 110,
      sex: 'female',
      weight_kg: 18,
    });
    expect(r.settings.weight_basis).toBe('actual_weight');
    expect(r.warnings.some((w) => w.includes('below 152.4 cm'))).toBe(true);
  });

  it('a sample without ok breaths in its window gets empty breath values, a count of 0 and a warning', () => {
    const r = analyseGas(breaths, [makeSample({ time_s: 500, paco2_mmhg: 40, line: 7 })], { pb_mmhg: 760, window_s: 60 });
    const row = r.rows[0]!;
    expect(row.breaths_used).toBe(0);
    expect(Number.isNaN(row.gradient_mmhg)).toBe(true);
    expect(Number.isNaN(row.vdvt_enghoff)).toBe(true);
    expect(row.missing_inputs.split(';')).toContain('ok_breaths_in_window');
    expect(r.warnings.some((w) => w.startsWith('gas sample 1 (line 7, t = 500.0 s): no ok breaths in the 60 s'))).toBe(true);
  });

  it('window_s is a setting: a longer window reaches the breath', () => {
    const r = analyseGas(breaths, [makeSample({ time_s: 500, paco2_mmhg: 40 })], { pb_mmhg: 760, window_s: 600 });
    expect(r.rows[0]!.breaths_used).toBe(1);
    expect(r.settings.window_s).toBe(600);
  });

  it('breath metrics that are NaN in every window breath are named as missing', () => {
    const r = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760 }).rows[0]!;
    expect(r.missing_inputs.split(';')).toContain('breath.vdvt_bohr');
    expect(Number.isNaN(r.vdvt_bohr)).toBe(true);
    expect(Number.isNaN(r.vdvt_difference)).toBe(true);
  });
});
