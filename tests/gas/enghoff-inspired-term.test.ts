// gas.csv's Enghoff VD/VT and the per-breath Enghoff of the same breaths with the same PaCO2 are one formula:
// VD/VT = (PaCO2 - PĒCO2) / (PaCO2 - PICO2) (Bohr 1891 mass balance with arterial PCO2, Enghoff 1938), inspired term
// included when bohr_inspired_term is on. Expected values derived here: PaCO2 40, PĒCO2 26, PICO2 4 ->
// 14 / 36 = 0.38889; without the inspired term 14 / 40 = 0.35.
import { describe, it } from 'vitest';
import { analyseGas, applyArterialPco2 } from '../../src/gas/index';
import { expectClose } from '../helpers/expect-close';
import { makeBreath, makeSample } from './make-breath';

const breaths = () =>
  [50, 60, 70].map((t, i) =>
    makeBreath({ breath: i + 1, t_start_s: t, petco2_mmhg: 38, peco2_mmhg: 26, fico2_mmhg: 4, vt_exp_ml: 500, vd_aw_ml: 150 }),
  );
const sample = makeSample({ time_s: 100, paco2_mmhg: 40 });

describe('Enghoff with inspired CO2: gas.csv and per breath agree', () => {
  it('gas.csv uses the inspired term: 0.38889, VDphys 194.44 mL', () => {
    const row = analyseGas(breaths(), [sample], { pb_mmhg: 760 }).rows[0]!;
    expectClose(row.vdvt_enghoff, 14 / 36, { abs: 1e-12 });
    expectClose(row.vd_phys_ml, (14 / 36) * 500, { abs: 1e-9 });
  });
  it('per breath, with the same PaCO2, gives the same value', () => {
    const rows = breaths();
    applyArterialPco2(rows, [makeSample({ time_s: 0, paco2_mmhg: 40 })], true, 0);
    for (const r of rows) expectClose(r.vdvt_enghoff, 14 / 36, { abs: 1e-12 });
  });
  it('without the inspired term both give 0.35', () => {
    const row = analyseGas(breaths(), [sample], { pb_mmhg: 760 }, { apparatus_ml: 0, inspired_term: false }).rows[0]!;
    expectClose(row.vdvt_enghoff, 0.35, { abs: 1e-12 });
    const rows = breaths();
    applyArterialPco2(rows, [makeSample({ time_s: 0, paco2_mmhg: 40 })], false, 0);
    for (const r of rows) expectClose(r.vdvt_enghoff, 0.35, { abs: 1e-12 });
  });
});
