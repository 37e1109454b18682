// PaCO2 at the patient's temperature (temp_c): blood gases are measured at 37 °C; the gradient and dead space use
// PaCO2 corrected to temp_c with PCO2(T) = PCO2(37) x 10^(0.019 (T - 37)) (Nunn JF, Bergman NA, Bunatyan A, Coleman AJ
// 1965, J Appl Physiol 20:23-26) unless the setting paco2_temperature is 'measured'. Worked by hand (derived here):
//   PaCO2 40 at 32 °C -> 40 x 10^-0.095 = 32.1410 mmHg; PETCO2 30 -> gradient 2.1410 mmHg, AVDSF 2.1410/32.1410 =
//   0.066613; Enghoff with PECO2 20 (no inspired CO2, no apparatus): (32.1410 - 20)/32.1410 = 0.377747 (measured:
//   (40 - 20)/40 = 0.5); PvCO2 46 measured -> 46 x 0.803526 = 36.9622 mmHg.
import { describe, expect, it } from 'vitest';
import { analyseGas, parseGasCsv } from '../../src/gas/index';
import { applyArterialPco2 } from '../../src/gas/apply-paco2';
import { expectClose } from '../helpers/expect-close';
import { breathSeries, makeSample } from './make-breath';

const breaths = () => breathSeries(5, 12, { petco2_mmhg: 30, peco2_mmhg: 20, fico2_mmhg: 0, vt_exp_ml: 500, vd_aw_ml: 150, vdvt_bohr: 0.3 });

describe('PaCO2 corrected to temp_c (analyseGas)', () => {
  const parsed = parseGasCsv('time_s,paco2_mmhg,temp_c\n60,40,32\n', 'g.csv');
  const result = analyseGas(breaths(), parsed.samples, { pb_mmhg: 760 });
  const row = result.rows[0]!;

  it('gas.csv keeps the measured PaCO2 and adds the corrected one', () => {
    expect(row.paco2_mmhg).toBe(40);
    expect(row.temp_c).toBe(32);
    expectClose(row.paco2_corrected_mmhg, 32.141, { abs: 1e-3 });
  });

  it('by default the gradient, AVDSF and Enghoff dead space use the corrected PaCO2', () => {
    expectClose(row.gradient_mmhg, 2.141, { abs: 1e-3 });
    expectClose(row.avdsf, 0.066613, { abs: 1e-5 });
    expectClose(row.vdvt_enghoff, 0.377747, { abs: 1e-5 });
    expectClose(row.vd_phys_ml, 0.377747 * 500, { abs: 5e-3 });
    expect(row.notes).toContain('PaCO2 corrected to 32.0 °C (32.1 mmHg) used');
    expect(result.warnings).toContain(
      "gas sample(s) 1: PaCO2 corrected to the patient's temperature (temp_c) for the gradient, AVDSF and dead spaces " +
        '(setting paco2_temperature corrected); the PaCO2 column shows the value measured at 37 °C, paco2_corrected_mmhg the one used',
    );
  });

  it('the setting is recorded; paco2_temperature measured keeps the 37 °C value for the gradient', () => {
    expect(result.settings.paco2_temperature).toBe('corrected');
    const measured = analyseGas(breaths(), parsed.samples, { pb_mmhg: 760, paco2_temperature: 'measured' });
    expect(measured.settings.paco2_temperature).toBe('measured');
    const m = measured.rows[0]!;
    expectClose(m.gradient_mmhg, 10, { abs: 1e-12 });
    expectClose(m.vdvt_enghoff, 0.5, { abs: 1e-12 });
    expectClose(m.paco2_corrected_mmhg, 32.141, { abs: 1e-3 });
  });

  it('without temp_c nothing is corrected and the corrected column is empty', () => {
    const r = analyseGas(breaths(), [makeSample({ time_s: 60, paco2_mmhg: 40 })], { pb_mmhg: 760 }).rows[0]!;
    expect(Number.isNaN(r.paco2_corrected_mmhg)).toBe(true);
    expectClose(r.gradient_mmhg, 10, { abs: 1e-12 });
    expect(r.notes).not.toContain('corrected');
    expect(analyseGas(breaths(), [makeSample({ time_s: 60, paco2_mmhg: 40 })], { pb_mmhg: 760 }).warnings.join()).not.toContain('temp_c');
  });

  it('a measured PvCO2 is corrected with the same factor for the shunt part of the gradient', () => {
    const s = makeSample({ time_s: 60, paco2_mmhg: 40, temp_c: 32, sao2_pct: 97, svo2_pct: 70, pvco2_mmhg: 46 });
    const r = analyseGas(breaths(), [s], { pb_mmhg: 760 }).rows[0]!;
    expect(r.pvco2_source).toBe('measured');
    expectClose(r.pvco2_mmhg, 36.9622, { abs: 1e-3 });
    const sf = r.shunt_fraction;
    expectClose(r.gradient_shunt_mmhg, (sf / (1 - sf)) * (36.9622 - 32.141), { abs: 1e-3 });
  });
});

describe('per-breath Enghoff from the gas samples follows the same PaCO2', () => {
  it('corrected by default, measured with the setting', () => {
    const sample = makeSample({ time_s: 0, paco2_mmhg: 40, temp_c: 32 });
    const corrected = breaths();
    applyArterialPco2(corrected, [sample], false, 0);
    expectClose(corrected[0]!.vdvt_enghoff, 0.377747, { abs: 1e-5 });
    const measured = breaths();
    applyArterialPco2(measured, [sample], false, 0, 'measured');
    expectClose(measured[0]!.vdvt_enghoff, 0.5, { abs: 1e-12 });
  });
});
