// Choice of blood gases around an event and the arterial share (arithmetic checked by hand in the comments).
import { describe, expect, it } from 'vitest';
import { blankTrendRow } from '../../src/metrics/registry';
import { compareGases, petco2At } from '../../src/trends/blood-gas';
import { trendSettings } from '../../src/trends/settings';
import type { TrendRow } from '../../src/trends/trend-row';
import { expectClose } from '../helpers/expect-close';

const o = trendSettings();
const rows: TrendRow[] = Array.from({ length: 30 }, (_, i) => ({
  ...blankTrendRow(),
  t_s: i * 60, vco2_ml_min: 200, ve_l_min: 7, va_l_min: 4.9, rr_bpm: 14, vte_ml: 500, petco2_mmhg: i < 12 ? 36 : 29,
  vd_aw_ml: 150, vdvt_bohr: 0.3, slope3_mmhg_per_l: 8, fico2_mmhg: 0, delay_s: 0, ok_share: 1, breaths: 14,
}));

describe('compareGases', () => {
  it('uses the latest gas before and the first gas after the settle time', () => {
    const gases = [
      { time_s: 100, paco2_mmhg: 41 },
      { time_s: 500, paco2_mmhg: 40 },
      { time_s: 740, paco2_mmhg: 35 }, // within gas_settle_s (60 s) of the onset at 720: skipped
      { time_s: 900, paco2_mmhg: 33 },
      { time_s: 1200, paco2_mmhg: 30 },
    ];
    const g = compareGases(gases, rows, 720, o)!;
    expect(g.before.time_s).toBe(500);
    expect(g.after.time_s).toBe(900);
    // (33 - 40) / (29 - 36) = 1
    expectClose(g.arterial_share, 1, { rel: 1e-12 });
  });
  it('a gradient that widens gives a negative share: (42 - 40) / (29 - 36) = -0.2857', () => {
    const g = compareGases([{ time_s: 500, paco2_mmhg: 40 }, { time_s: 900, paco2_mmhg: 42 }], rows, 720, o)!;
    expectClose(g.arterial_share, -2 / 7, { rel: 1e-12 });
  });
  it('null without a gas on both sides, or when PETCO2 barely moved between the gas times', () => {
    expect(compareGases([{ time_s: 900, paco2_mmhg: 33 }], rows, 720, o)).toBeNull();
    expect(compareGases([{ time_s: 500, paco2_mmhg: 40 }], rows, 720, o)).toBeNull();
    expect(compareGases([{ time_s: 100, paco2_mmhg: 40 }, { time_s: 500, paco2_mmhg: 40 }], rows, 600, o)).toBeNull();
    // before gas older than gas_before_max_s
    expect(compareGases([{ time_s: 100, paco2_mmhg: 40 }, { time_s: 900, paco2_mmhg: 33 }], rows, 720, { ...o, gas_before_max_s: 300 })).toBeNull();
    // a gas before an earlier event is not used
    expect(compareGases([{ time_s: 500, paco2_mmhg: 40 }, { time_s: 900, paco2_mmhg: 33 }], rows, 720, o, 600)).toBeNull();
  });
  it('petco2At reads the bin holding the time, or the nearest bin with a value', () => {
    expect(petco2At(rows, 719, 60)).toBe(36);
    expect(petco2At(rows, 720, 60)).toBe(29);
    const gap = rows.map((r, i) => (i === 13 ? { ...r, petco2_mmhg: NaN } : r));
    expect(petco2At(gap, 13 * 60 + 5, 60)).toBe(29);
  });
});
