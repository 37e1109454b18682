// Venous admixture and the split of the PaCO2-PETCO2 gradient inside analyseGas. Expected values are worked by hand
// (derived here; the same arithmetic is written out in tests/derived/alveolar-gas-and-shunt.test.ts and
// tests/derived/shunt-co2-effect.test.ts): alveolar gas equation and shunt from contents 0.2049, saturation shunt
// (0.1/0.3), venous-arterial route (s 0.2, PvCO2 - PaCO2 6 -> 1.50 mmHg), Fick route (s 0.2, V'CO2 200, Q' 5,
// k 0.67 -> 1.49 mmHg), gradient PaCO2 40 - PETCO2 35 = 5. The equations: common practice, no source, and the
// mixing derivation in docs/methods.md.
import { describe, expect, it } from 'vitest';
import { analyseGas } from '../../src/gas/index';
import { expectClose } from '../helpers/expect-close';
import { breathSeries, makeSample } from './make-breath';

// PĀECO2 35 as PETCO2, so the split's alveolar gradient equals the end-tidal one here.
const BREATHS = breathSeries(50, 9, { petco2_mmhg: 35, paeco2_mmhg: 35, peco2_mmhg: 26, vt_exp_ml: 500, vd_aw_ml: 150, vdvt_bohr: 0.3, vtco2_ml: 20, rr_bpm: 10 });

describe('shunt fraction inside analyseGas', () => {
  it('by contents: FiO2 100 %, PaO2 200, SaO2 100 %, SvO2 75 %, PvO2 40, Hb 15 -> PAO2 673, Qs/Qt 0.2049', () => {
    const sample = makeSample({
      time_s: 100, paco2_mmhg: 40, fio2_pct: 100, pao2_mmhg: 200, sao2_pct: 100, svo2_pct: 75, pvo2_mmhg: 40, hb_g_dl: 15,
    });
    const row = analyseGas(BREATHS, [sample], { pb_mmhg: 760 }).rows[0]!;
    expect(row.shunt_method).toBe('contents');
    expectClose(row.pao2_alv_mmhg, 673.0);
    expectClose(row.shunt_fraction, 0.2049);
  });

  // The Severinghaus equation gives 0.7495 at 40 mmHg (tests/derived/severinghaus-equation.test.ts), so SvO2 75 % maps back to about 40 mmHg and the dissolved
  // venous O2 barely changes: Qs/Qt stays 0.2049 within 1e-3 relative.
  it('without PvO2: venous PO2 from SvO2 by the Severinghaus curve (about 40 mmHg) still gives 0.2049', () => {
    const sample = makeSample({
      time_s: 100, paco2_mmhg: 40, fio2_pct: 100, pao2_mmhg: 200, sao2_pct: 100, svo2_pct: 75, hb_g_dl: 15,
    });
    const row = analyseGas(BREATHS, [sample], { pb_mmhg: 760 }).rows[0]!;
    expect(row.shunt_method).toBe('contents');
    expectClose(row.shunt_fraction, 0.2049);
    expect(row.notes).toMatch(/venous PO2 40\.0 mmHg estimated from SvO2/);
  });

  it('saturation-only fallback when PaO2 is missing, and says so: Sc\'O2 1, SaO2 95 %, SvO2 75 % -> 0.2', () => {
    const row = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75, pvco2_mmhg: 46 })], {
      pb_mmhg: 760,
    }).rows[0]!;
    expect(row.shunt_method).toBe('saturations');
    expectClose(row.shunt_fraction, (1 - 0.95) / (1 - 0.75));
    expect(row.notes).toMatch(/shunt from saturations only.*pao2_mmhg, hb_g_dl, fio2_pct missing/);
    expect(row.missing_inputs.split(';')).toEqual(['weight_kg', 'pao2_mmhg', 'hb_g_dl', 'fio2_pct']);
  });

  it('saturation shunt through analyseGas: SaO2 90 %, SvO2 70 % -> 0.3333', () => {
    const row = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 90, svo2_pct: 70, pvco2_mmhg: 46 })], {
      pb_mmhg: 760,
    }).rows[0]!;
    expectClose(row.shunt_fraction, 0.3333);
  });
});

describe('gradient split', () => {
  it('W15b with measured PvCO2: s 0.2, PvCO2 - PaCO2 = 6 -> shunt part 1.50, rest 5 - 1.50 = 3.50 mmHg', () => {
    const r = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75, pvco2_mmhg: 46 })], {
      pb_mmhg: 760,
    });
    const row = r.rows[0]!;
    expectClose(row.gradient_mmhg, 5);
    expect(row.pvco2_source).toBe('measured');
    expectClose(row.pvco2_mmhg, 46);
    expectClose(row.gradient_shunt_mmhg, 1.5);
    expectClose(row.gradient_rest_mmhg, 3.5);
    expect(r.warnings.some((w) => w.includes('PvCO2 was not measured'))).toBe(false);
  });

  it('default P(v-a)CO2 (6 mmHg) when PvCO2 is missing: same 1.50 mmHg, source "default", named missing, warned', () => {
    const r = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75 })], { pb_mmhg: 760 });
    const row = r.rows[0]!;
    expect(row.pvco2_source).toBe('default');
    expectClose(row.pvco2_mmhg, 46);
    expectClose(row.gradient_shunt_mmhg, 1.5);
    expect(row.missing_inputs.split(';')).toContain('pvco2_mmhg');
    expect(r.warnings.some((w) => w.startsWith('PvCO2 was not measured for gas sample(s) 1:') && w.includes('6 mmHg'))).toBe(true);
  });

  it('default P(v-a)CO2 is a setting', () => {
    const r = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75 })], {
      pb_mmhg: 760,
      default_pv_a_co2_mmhg: 8,
    });
    expectClose(r.rows[0]!.gradient_shunt_mmhg, 0.25 * 8);
  });

  it('Fick route when a cardiac output is given: V\'CO2 20 mL x 10/min = 200, Q\' 5, k 0.67, s 0.2 -> 1.49 mmHg', () => {
    const r = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75 })], {
      pb_mmhg: 760,
      cardiac_output_l_min: 5,
    });
    const row = r.rows[0]!;
    expect(row.pvco2_source).toBe('fick');
    expectClose(row.gradient_shunt_mmhg, 1.49, { abs: 0.005 });
    expectClose(row.gradient_rest_mmhg, 5 - 1.49, { abs: 0.005 });
  });

  it('contents shunt with measured PvCO2 46: shunt part s/(1-s) x 6 with s = 0.2049', () => {
    const sample = makeSample({
      time_s: 100, paco2_mmhg: 40, fio2_pct: 100, pao2_mmhg: 200, sao2_pct: 100, svo2_pct: 75, pvo2_mmhg: 40, hb_g_dl: 15,
      pvco2_mmhg: 46,
    });
    const row = analyseGas(BREATHS, [sample], { pb_mmhg: 760 }).rows[0]!;
    expectClose(row.gradient_shunt_mmhg, (0.2049 / (1 - 0.2049)) * 6);
    expectClose(row.gradient_rest_mmhg, 5 - (0.2049 / (1 - 0.2049)) * 6);
  });

  it('inconsistent saturations (SaO2 above end-capillary) give a warning and no split', () => {
    const sample = makeSample({ time_s: 100, paco2_mmhg: 40, fio2_pct: 21, sao2_pct: 99, svo2_pct: 75, pvco2_mmhg: 46 });
    const r = analyseGas(BREATHS, [sample], { pb_mmhg: 760, end_capillary_saturation: 'odc' });
    // FiO2 21 %: PAO2 = 0.21 x 713 - 40 x (0.21 + 0.79/0.8) = 101.83 mmHg (full alveolar gas equation) -> Sc'O2 0.9786 < SaO2 0.99
    expectClose(r.rows[0]!.pao2_alv_mmhg, 0.21 * 713 - 40 * (0.21 + 0.79 / 0.8));
    expect(r.rows[0]!.shunt_fraction).toBeLessThan(0);
    expect(Number.isNaN(r.rows[0]!.gradient_shunt_mmhg)).toBe(true);
    expect(r.warnings.some((w) => w.includes('is outside 0-1'))).toBe(true);
  });
});

describe('shunt-corrected Enghoff VD/VT (Kuwabara S, Duncalf D 1969, Anesthesiology 31:575-577)', () => {
  // Hand calculation (derived here, linear mixing): s = (1 - 0.95)/(1 - 0.75) = 0.2, Pc'CO2 = (40 - 0.2 x 46)/0.8 =
  // 38.5 mmHg, VD/VT = (38.5 - 26)/38.5 = 0.3247 against Enghoff's (40 - 26)/40 = 0.35.
  it('SaO2 95 %, SvO2 75 %, PaCO2 40, PvCO2 46, PECO2 26 -> 0.3247 (Enghoff 0.35)', () => {
    const row = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75, pvco2_mmhg: 46 })], {
      pb_mmhg: 760,
    }).rows[0]!;
    expectClose(row.vdvt_enghoff, 0.35, { abs: 1e-9 });
    expectClose(row.vdvt_enghoff_shunt_corrected, (38.5 - 26) / 38.5, { abs: 1e-9 });
  });
});

describe('the split is made on the mean alveolar expired PCO2, so neither part goes negative with a steep phase III', () => {
  // Hand calculation (derived here): s 0.2 (SaO2 95 %, SvO2 75 %), PaCO2 40, PvCO2 46: shunt part 0.2/0.8 x 6 = 1.5,
  // Pc'CO2 = 38.5. A steep phase III puts PETCO2 at 39.5 above Pc'CO2 while PĀECO2 is 36: split on PETCO2 the rest
  // would be 0.5 - 1.5 = -1.0; split on PĀECO2 (Fletcher et al. 1981) the gradient is 4, the rest 4 - 1.5 = 2.5 = Pc'CO2 - PĀECO2.
  const steep = breathSeries(50, 9, { petco2_mmhg: 39.5, paeco2_mmhg: 36, peco2_mmhg: 26, vt_exp_ml: 500, vd_aw_ml: 150, vdvt_bohr: 0.3, vtco2_ml: 20, rr_bpm: 10 });
  it('gradient 0.5 end-tidal, 4 alveolar; shunt part 1.5; rest 2.5', () => {
    const row = analyseGas(steep, [makeSample({ time_s: 100, paco2_mmhg: 40, sao2_pct: 95, svo2_pct: 75, pvco2_mmhg: 46 })], { pb_mmhg: 760 }).rows[0]!;
    expectClose(row.gradient_mmhg, 0.5, { abs: 1e-9 });
    expectClose(row.gradient_alv_mmhg, 4, { abs: 1e-9 });
    expectClose(row.gradient_shunt_mmhg, 1.5, { abs: 1e-9 });
    expectClose(row.gradient_rest_mmhg, 2.5, { abs: 1e-9 });
  });
});
