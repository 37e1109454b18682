// The apparatus volume between sensor and patient (--apparatus-ml) is part of every dead space measured at the sensor
// (Fowler, Bohr, Enghoff) and of no alveolar dead space. Expected values derived here: with apparatus volume A, each
// patient dead-space volume is the one measured at the sensor minus A, each VD/VT is that volume over VT, alveolar
// dead space (Bohr or Enghoff minus Fowler) does not change, and alveolar ventilation RR x (VT - Fowler at the sensor)
// does not change either.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { decomposeBreath } from '../../src/analyse/decompose';
import { analyseGas } from '../../src/gas/index';
import { analyseText } from '../../src/pipeline/analyse-text';
import { composeOutputs } from '../../src/report/outputs';
import { defaultSettings } from '../../src/settings';
import { computeTrends } from '../../src/trends/compute-trends';
import { expectClose } from '../helpers/expect-close';
import { makeBreath, makeSample } from '../gas/make-breath';
import { breathFromCurve } from './analytic-breath';

const curveB = (v: number) => (v < 100 ? 0 : v < 200 ? (36 * (v - 100)) / 100 : 34 + 0.01 * v);

function decomposeWith(apparatusMl: number) {
  const settings = defaultSettings().analysis;
  settings.paco2_mmhg = 40;
  settings.apparatus_ml = apparatusMl;
  return decomposeBreath(breathFromCurve(curveB), { breath: 1, delay_s: 0, tau_s: 0, settings }).row;
}

describe('apparatus volume in the per-breath dead spaces', () => {
  const plain = decomposeWith(0);
  const withApparatus = decomposeWith(30);
  it('Fowler, inflection, Bohr and Enghoff volumes lose exactly 30 mL', () => {
    expectClose(withApparatus.vd_aw_ml, plain.vd_aw_ml - 30, { abs: 1e-9 });
    expectClose(withApparatus.vd_inflection_ml, plain.vd_inflection_ml - 30, { abs: 1e-9 });
    expectClose(withApparatus.vd_bohr_ml, plain.vd_bohr_ml - 30, { abs: 1e-9 });
    expectClose(withApparatus.vd_enghoff_ml, plain.vd_enghoff_ml - 30, { abs: 1e-9 });
  });
  it('VD/VT fractions are the patient volumes over VT', () => {
    expectClose(withApparatus.vdvt_bohr, plain.vdvt_bohr - 30 / plain.vt_exp_ml, { abs: 1e-12 });
    expectClose(withApparatus.vdvt_enghoff, plain.vdvt_enghoff - 30 / plain.vt_exp_ml, { abs: 1e-12 });
  });
  it('alveolar dead space does not change', () => {
    expectClose(withApparatus.vd_alv_bohr_ml, plain.vd_alv_bohr_ml, { abs: 1e-9 });
  });
});

describe('apparatus volume in gas.csv and trends.csv', () => {
  // breath rows as the analysis writes them with 30 mL apparatus: Fowler at the sensor 150 mL -> patient 120 mL
  const breaths = [50, 60, 70].map((t, i) =>
    makeBreath({ breath: i + 1, t_start_s: t, petco2_mmhg: 38, peco2_mmhg: 26, vt_exp_ml: 500, vd_aw_ml: 120, vdvt_bohr: 0.25, vtco2_ml: 14 }),
  );
  it('gas.csv: VDphys = Enghoff x VT - 30, VDalv = Enghoff x VT - 150 (PaCO2 40, PECO2 26: Enghoff at the sensor 0.35)', () => {
    const row = analyseGas(breaths, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760 }, { apparatus_ml: 30, inspired_term: true }).rows[0]!;
    expectClose(row.vd_phys_ml, 0.35 * 500 - 30, { abs: 1e-9 });
    expectClose(row.vd_alv_enghoff_ml, 0.35 * 500 - 150, { abs: 1e-9 });
    expectClose(row.vdvt_enghoff, (0.35 * 500 - 30) / 500, { abs: 1e-12 });
  });
  it('trends.csv: V\'A = RR x (VT - 120 - 30)', () => {
    const rows = [0, 4, 8].map((t, i) => makeBreath({ breath: i + 1, t_start_s: t, t_end_s: t + 4, vt_exp_ml: 500, vd_aw_ml: 120 }));
    const [trend] = computeTrends(rows, { bin_s: 60, min_ok_breaths: 3 }, 30);
    // 3 x 350 mL over 12 s = 1.05 L / 0.2 min = 5.25 L/min
    expectClose(trend!.va_l_min, 5.25, { abs: 1e-9 });
  });
});

describe('apparatus volume end to end (adult-healthy sample, blood gas at 60 and 100 s)', () => {
  const text = readFileSync('sample-waveforms/adult-healthy.csv', 'utf8');
  const samples = [makeSample({ time_s: 60, paco2_mmhg: 39.5 }), makeSample({ time_s: 100, paco2_mmhg: 39.2 })];
  const run = (apparatusMl: number) => {
    const settings = defaultSettings();
    settings.analysis.apparatus_ml = apparatusMl;
    const { core, report } = analyseText(text, settings, new Set(), 'adult-healthy.csv');
    return composeOutputs(core, report, settings, new Set(), new Map(), { file: 'gas.csv', samples, rejected: [] });
  };
  const plain = run(0);
  const withApparatus = run(30);
  it('gas.csv vd_alv_enghoff_ml does not change; vd_phys_ml and vd_aw_ml lose 30 mL', () => {
    for (let i = 0; i < 2; i++) {
      const a = plain.gas!.rows[i]!;
      const b = withApparatus.gas!.rows[i]!;
      expect(Number.isFinite(a.vd_alv_enghoff_ml)).toBe(true);
      expectClose(b.vd_alv_enghoff_ml, a.vd_alv_enghoff_ml, { abs: 1e-9 });
      expectClose(b.vd_phys_ml, a.vd_phys_ml - 30, { abs: 1e-9 });
      expectClose(b.vd_aw_ml, a.vd_aw_ml - 30, { abs: 1e-9 });
    }
  });
  it('trends.csv alveolar ventilation does not change', () => {
    const a = plain.trends.filter((t) => Number.isFinite(t.va_l_min));
    expect(a.length).toBeGreaterThan(0);
    a.forEach((t, i) => expectClose(withApparatus.trends[i]!.va_l_min, t.va_l_min, { abs: 1e-9 }));
  });
});
