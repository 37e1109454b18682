// PaCO2 between blood gases: PETCO2 + most recent gradient, with a band from the observed gradients.
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

  it('single gas: PETCO2 + 5 with a stated default band of +/- 5 mmHg', () => {
    const e = byBreath.get(21)!; // t = 100, PETCO2 34
    expect(e).toMatchObject({ t_start_s: 100, petco2_mmhg: 34, gas_sample: 1, gases_in_band: 1, band_method: 'single_gas_spread' });
    expectClose(e.paco2_est_mmhg, 39);
    expectClose(e.band_low_mmhg, 34);
    expectClose(e.band_high_mmhg, 44);
  });

  it('two gases: most recent gradient 8, band from the observed range 5..8', () => {
    const e = byBreath.get(82)!; // t = 405, PETCO2 36
    expect(e).toMatchObject({ t_start_s: 405, gas_sample: 2, gases_in_band: 2, band_method: 'observed_range' });
    expectClose(e.paco2_est_mmhg, 44);
    expectClose(e.band_low_mmhg, 41);
    expectClose(e.band_high_mmhg, 44);
  });

  it('three gases: gradient 15, band 5..15', () => {
    const e = byBreath.get(200)!; // t = 995, PETCO2 36
    expect(e.gas_sample).toBe(3);
    expectClose(e.paco2_est_mmhg, 51);
    expectClose(e.band_low_mmhg, 41);
    expectClose(e.band_high_mmhg, 51);
  });

  it('the single-gas spread is a setting; gas rows without a gradient are not used', () => {
    const rows = analyseGas(BREATHS, [makeSample({ time_s: 100, paco2_mmhg: 40 }), makeSample({ time_s: 9000, paco2_mmhg: 60 })], {
      pb_mmhg: 760,
    }).rows;
    const est = estimatePaco2([makeBreath({ breath: 1, t_start_s: 9500, petco2_mmhg: 30 })], rows, { single_gas_spread_mmhg: 3 });
    expect(est).toHaveLength(1);
    expect(est[0]).toMatchObject({ gas_sample: 1, band_method: 'single_gas_spread', gases_in_band: 1 });
    expectClose(est[0]!.paco2_est_mmhg, 35);
    expectClose(est[0]!.band_low_mmhg, 32);
    expectClose(est[0]!.band_high_mmhg, 38);
  });

  it('no gas with a gradient: no estimates', () => {
    expect(estimatePaco2(BREATHS, [])).toEqual([]);
  });
});
