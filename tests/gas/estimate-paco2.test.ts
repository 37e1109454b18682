// PaCO2 between blood gases: PETCO2 + most recent gradient, with a prediction band.
import { describe, expect, it } from 'vitest';
import { analyseGas, estimatePaco2 } from '../../src/gas/index';
import { expectClose } from '../helpers/expect-close';
import { breathSeries, makeBreath, makeSample } from './make-breath';

// PETCO2 alternates 34 / 36 so each estimate must follow its own breath.
const BREATHS = breathSeries(0, 200, { peco2_mmhg: 25, vt_exp_ml: 500, vd_aw_ml: 150 }).map((b, i) => ({
  ...b,
  petco2_mmhg: i % 2 === 0 ? 34 : 36,
}));
BREATHS[150] = { ...BREATHS[150]!, status: 'leak' }; // t = 750: not ok, no estimate
BREATHS[151] = { ...BREATHS[151]!, petco2_mmhg: NaN }; // t = 755: no PETCO2, no estimate

// Window medians of PETCO2 over 34/36 alternation: 35 (even count) -> gradients 5, 8, 15 at 100, 400, 700 s.
const SAMPLES = [
  makeSample({ time_s: 100, paco2_mmhg: 40 }),
  makeSample({ time_s: 400, paco2_mmhg: 43 }),
  makeSample({ time_s: 700, paco2_mmhg: 50 }),
];

describe('estimatePaco2', () => {
  const result = analyseGas(BREATHS, SAMPLES, { pb_mmhg: 760 });
  const byBreath = new Map(result.estimates.map((e) => [e.breath, e]));

  it('the window median PETCO2 is 35 so the gradients are 5, 8 and 15 mmHg', () => {
    expect(result.rows.map((r) => r.gradient_mmhg)).toEqual([5, 8, 15]);
  });

  it('no estimate before the first gas, for non-ok breaths or without PETCO2', () => {
    expect(Math.min(...result.estimates.map((e) => e.t_start_s))).toBe(100);
    expect(byBreath.has(151)).toBe(false);
    expect(byBreath.has(152)).toBe(false);
    expect(result.estimates).toHaveLength(200 - 20 - 2);
  });

  // Band (derived here, the model in src/gas/estimate-paco2.ts): estimate ± z SD, z = 1.281552 for 80 % (standard
  // normal table, Abramowitz & Stegun 1964 Table 26.1), SD² = 1.02² (analyser; Kampelmacher et al. 1997) + sp² +
  // drift × (t − t_gas) + 4/3 m². PETCO2 alternates 34/36: successive differences ±2, median absolute difference 2,
  // sp = 1.4826 × 2 / √2; the running median of 9 breaths is 34 or 36 against the window median 35, so PETCO2 has
  // moved by m = 1 since each gas.
  const z80 = 1.281552;
  const sp = (1.4826 * 2) / Math.SQRT2;
  const prior = 4 / 3600;
  const moved = 4 / 3;

  it('single gas: PETCO2 + 5, band from analyser and PETCO2 noise plus the prior drift', () => {
    const e = byBreath.get(21)!; // t = 100, PETCO2 34, gas at 100 s
    expect(e).toMatchObject({ t_start_s: 100, petco2_mmhg: 34, gas_sample: 1, gases_in_band: 1, band_method: 'prediction' });
    const sd = Math.sqrt(1.02 ** 2 + sp ** 2 + moved);
    expectClose(e.paco2_est_mmhg, 39);
    expectClose(e.estimate_sd_mmhg, sd, { abs: 1e-9 });
    expectClose(e.band_low_mmhg, 39 - z80 * sd, { abs: 2e-3 });
    expectClose(e.band_high_mmhg, 39 + z80 * sd, { abs: 2e-3 });
    const later = byBreath.get(80)!; // t = 395, still gas 1: 295 s of prior drift
    expectClose(later.estimate_sd_mmhg, Math.sqrt(1.02 ** 2 + sp ** 2 + prior * 295 + moved), { abs: 1e-9 });
  });

  it('two gases: most recent gradient 8; drift pooled from the change 5 -> 8 over 300 s with one hour of prior', () => {
    const e = byBreath.get(82)!; // t = 405, PETCO2 36
    expect(e).toMatchObject({ t_start_s: 405, gas_sample: 2, gases_in_band: 2, band_method: 'prediction' });
    const drift = (prior * 3600 + (3 ** 2 - 2 * 1.02 ** 2)) / (3600 + 300);
    expectClose(e.paco2_est_mmhg, 44);
    expectClose(e.estimate_sd_mmhg, Math.sqrt(1.02 ** 2 + sp ** 2 + drift * 5 + moved), { abs: 1e-9 });
  });

  it('three gases: gradient 15; a larger band level widens the band by the ratio of the quantiles', () => {
    const e = byBreath.get(200)!; // t = 995, PETCO2 36
    expect(e.gas_sample).toBe(3);
    expectClose(e.paco2_est_mmhg, 51);
    const wide = analyseGas(BREATHS, SAMPLES, { pb_mmhg: 760, band_level: 0.95 }).estimates.find((x) => x.breath === 200)!;
    expectClose((wide.band_high_mmhg - wide.paco2_est_mmhg) / (e.band_high_mmhg - e.paco2_est_mmhg), 1.959964 / z80, { abs: 1e-3 });
  });

  it('gas rows without a gradient are not used; the analyser SD is a setting', () => {
    const rows = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40 }), makeSample({ time_s: 9000, paco2_mmhg: 60 })], {
      pb_mmhg: 760,
    }).rows;
    const est = estimatePaco2([makeBreath({ breath: 1, t_start_s: 9500, petco2_mmhg: 30 })], rows, { analyser_sd_mmhg: 2 });
    expect(est).toHaveLength(1);
    expect(est[0]).toMatchObject({ gas_sample: 1, band_method: 'prediction', gases_in_band: 1 });
    expectClose(est[0]!.paco2_est_mmhg, 35);
    // one breath: no PETCO2 noise estimate (sp 0); 9400 s of prior drift; PETCO2 30 against the gas window's 35: m = 5
    expect(est[0]!.petco2_moved_mmhg).toBe(5);
    expectClose(est[0]!.estimate_sd_mmhg, Math.sqrt(4 + prior * 9400 + (4 / 3) * 25), { abs: 1e-9 });
  });

  it('a move of PETCO2 after the gas widens the band by 4/3 m² (m the largest move of the 9-breath running median)', () => {
    // 20 breaths at PETCO2 36 then 20 at 30, one gas at t = 0 with gradient 4 and window median 36 (hand-built row).
    const rows = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40 })], { pb_mmhg: 760 }).rows.map((g) => ({
      ...g, time_s: 0, petco2_mmhg: 36, gradient_mmhg: 4,
    }));
    const series = Array.from({ length: 40 }, (_, i) => makeBreath({ breath: i + 1, t_start_s: 5 * i, petco2_mmhg: i < 20 ? 36 : 30 }));
    const est = estimatePaco2(series, rows, { drift_prior_mmhg2_per_h: 0 });
    // breath 24: the last 9 PETCO2 are five 36s and four 30s -> median 36, no move yet; breath 25: five 30s -> 30, m = 6
    expect(est[23]!.petco2_moved_mmhg).toBe(0);
    expect(est[24]!.petco2_moved_mmhg).toBe(6);
    // sp: successive differences are 0 but one 6, median 0 -> sp 0; SD² = 1.02² + 4/3 × 36 = 1.0404 + 48
    expectClose(est[24]!.estimate_sd_mmhg, Math.sqrt(1.02 ** 2 + 48), { abs: 1e-9 });
    expectClose(est[24]!.paco2_est_mmhg, 34);
  });

  it('no gas with a gradient: no estimates', () => {
    expect(estimatePaco2(BREATHS, [])).toEqual([]);
  });
});
