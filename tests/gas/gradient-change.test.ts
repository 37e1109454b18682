// Flag when a new blood gas shows the PaCO2-PETCO2 gradient changed by more than the setting.
import { describe, expect, it } from 'vitest';
import { analyseGas } from '../../src/gas/index';
import { expectClose } from '../helpers/expect-close';
import { breathSeries, makeSample } from './make-breath';

const BREATHS = breathSeries(0, 200, { petco2_mmhg: 35, peco2_mmhg: 25, vt_exp_ml: 500, vd_aw_ml: 150 });
const SAMPLES = [
  makeSample({ time_s: 700, paco2_mmhg: 50, line: 4 }), // gradient 15 (given out of order on purpose)
  makeSample({ time_s: 100, paco2_mmhg: 40, line: 2 }), // gradient 5
  makeSample({ time_s: 400, paco2_mmhg: 43, line: 3 }), // gradient 8
];

describe('gradient change flag', () => {
  it('orders samples by time; change = gradient - previous gradient; flagged only above 5 mmHg', () => {
    const r = analyseGas(BREATHS, SAMPLES, { pb_mmhg: 760 });
    expect(r.rows.map((x) => x.time_s)).toEqual([100, 400, 700]);
    expect(r.rows.map((x) => x.sample)).toEqual([1, 2, 3]);
    expectClose(r.rows[0]!.gradient_mmhg, 5);
    expect(Number.isNaN(r.rows[0]!.gradient_change_mmhg)).toBe(true);
    expect(r.rows[0]!.gradient_changed).toBe(false);
    expectClose(r.rows[1]!.gradient_change_mmhg, 3);
    expect(r.rows[1]!.gradient_changed).toBe(false);
    expectClose(r.rows[2]!.gradient_change_mmhg, 7);
    expect(r.rows[2]!.gradient_changed).toBe(true);
    const flagged = r.warnings.filter((w) => w.includes('gradient changed'));
    expect(flagged).toEqual([
      'gas sample 3 (line 4, t = 700.0 s): PaCO2-PETCO2 gradient changed by +7.0 mmHg since sample 2 (8.0 -> 15.0 mmHg; flag threshold 5 mmHg)',
    ]);
  });

  it('the threshold is a setting', () => {
    const r = analyseGas(BREATHS, SAMPLES, { pb_mmhg: 760, gradient_change_mmhg: 2 });
    expect(r.rows.map((x) => x.gradient_changed)).toEqual([false, true, true]);
    expect(r.settings.gradient_change_mmhg).toBe(2);
  });

  it('a falling gradient is flagged too; a sample without breaths is skipped as reference', () => {
    const samples = [
      makeSample({ time_s: 100, paco2_mmhg: 50 }), // gradient 15
      makeSample({ time_s: 5000, paco2_mmhg: 45 }), // no breaths: no gradient
      makeSample({ time_s: 900, paco2_mmhg: 40 }), // gradient 5 -> change -10 versus sample 1
    ];
    const r = analyseGas(BREATHS, samples, { pb_mmhg: 760 });
    expectClose(r.rows[1]!.gradient_change_mmhg, -10);
    expect(r.rows[1]!.gradient_changed).toBe(true);
    expect(Number.isNaN(r.rows[2]!.gradient_change_mmhg)).toBe(true);
    expect(r.rows[2]!.gradient_changed).toBe(false);
  });
});
