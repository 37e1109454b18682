// computeTrends on hand-made breath rows. Expected values are worked out by hand in the comments from the definitions
// `[common practice, no source: V'CO2 = sum of VTCO2 over a window / window minutes; V'A = RR x (VT - VDaw), the
// "ventilation reaching alveoli" form]`.
import { describe, expect, it } from 'vitest';
import { computeTrends } from '../../src/trends/compute-trends';
import { DEFAULT_TRENDS } from '../../src/settings';
import { TREND_COLUMNS } from '../../src/trends/trend-row';
import { expectClose } from '../helpers/expect-close';
import { breathRow } from './make-row';
import { analyseGas, estimatePaco2 } from '../../src/gas/index';
import { makeSample } from '../gas/make-breath';

const opts = { bin_s: 60, min_ok_breaths: 3 };

/** breath of duration d starting at t with VTe, VDaw, VTCO2, PETCO2 */
const b = (t: number, d: number, vte: number, vtco2: number, pet: number, extra: Parameters<typeof breathRow>[0] = {}) =>
  breathRow({ t_start_s: t, t_end_s: t + d, vt_exp_ml: vte, vd_aw_ml: 150, vtco2_ml: vtco2, petco2_mmhg: pet, fico2_mmhg: 0, delay_s: 0.1, delay_measured_s: 0.1, vdvt_bohr: 0.3, slope3_mmhg_per_l: 8, ...extra });

describe('computeTrends', () => {
  it('rates over the ok breaths own time; excluded breaths add neither CO2 nor time', () => {
    const rows = [
      b(0, 4, 500, 14, 36),
      b(4, 4, 520, 15, 37),
      b(8, 5, 480, 13, 35),
      b(13, 4, 900, 99, 10, { status: 'large_leak', flags: ['large_leak'], fico2_mmhg: 1 }),
    ];
    const [t] = computeTrends(rows, opts);
    // V'CO2 = (14 + 15 + 13) / ((4 + 4 + 5) / 60) = 42 / 0.216667 = 193.846 mL/min
    expectClose(t!.vco2_ml_min, (42 * 60) / 13, { rel: 1e-12 });
    expectClose(t!.vco2_ml_min, 193.846, { abs: 0.001 });
    // V'E = 1.5 L / 0.216667 min = 6.923 L/min; V'A = (350 + 370 + 330) mL = 1.05 L / 0.216667 = 4.846 L/min
    expectClose(t!.ve_l_min, 6.923, { abs: 0.001 });
    expectClose(t!.va_l_min, 4.846, { abs: 0.001 });
    // RR = 60 x 3 / 13 = 13.846 /min
    expectClose(t!.rr_bpm, 13.846, { abs: 0.001 });
    expect(t!.vte_ml).toBe(500);
    expect(t!.petco2_mmhg).toBe(36);
    expect(t!.ok_share).toBe(0.75);
    expect(t!.breaths).toBe(4);
    // inspired PCO2 over ALL breaths: median of 0, 0, 0, 1 = 0
    expect(t!.fico2_mmhg).toBe(0);
  });

  it('a bin with fewer ok breaths than min_ok_breaths has no values but still counts its breaths', () => {
    const rows = [b(0, 4, 500, 14, 36), b(4, 4, 500, 14, 36, { status: 'outlier' }), b(8, 4, 500, 14, 36, { status: 'outlier' })];
    const [t] = computeTrends(rows, opts);
    expect(Number.isNaN(t!.vco2_ml_min)).toBe(true);
    expect(Number.isNaN(t!.petco2_mmhg)).toBe(true);
    expectClose(t!.ok_share, 1 / 3, { rel: 1e-12 });
    expect(t!.breaths).toBe(3);
  });

  it('breaths go to the bin of their start; empty bins in a gap become rows with breaths = 0', () => {
    const rows = [
      b(50, 4, 500, 14, 36), b(54, 4, 500, 14, 36), b(58, 4, 500, 14, 36),
      b(185, 4, 500, 14, 36), b(189, 4, 500, 14, 36), b(193, 4, 500, 14, 36),
    ];
    const t = computeTrends(rows, opts);
    expect(t.map((r) => r.t_s)).toEqual([0, 60, 120, 180]);
    expect(t.map((r) => r.breaths)).toEqual([3, 0, 0, 3]);
    expect(Number.isNaN(t[1]!.ok_share)).toBe(true);
    // 3 breaths x 14 mL in 12 s: 42 / 0.2 = 210 mL/min in both filled bins, whatever their position in the bin
    expectClose(t[0]!.vco2_ml_min, 210, { rel: 1e-12 });
    expectClose(t[3]!.vco2_ml_min, 210, { rel: 1e-12 });
  });

  it('no breaths -> no rows; columns list every field once', () => {
    expect(computeTrends([], opts)).toEqual([]);
    expect(new Set(TREND_COLUMNS).size).toBe(TREND_COLUMNS.length);
    const [t] = computeTrends([b(0, 4, 500, 14, 36)], { ...opts, min_ok_breaths: 1 });
    expect(Object.keys(t!).sort()).toEqual([...TREND_COLUMNS].sort());
  });

  it('the default bin is 60 s and a 30 s bin halves the breaths per row', () => {
    expect(DEFAULT_TRENDS.bin_s).toBe(60);
    const rows = Array.from({ length: 30 }, (_, i) => b(i * 4, 4, 500, 14, 36));
    expect(computeTrends(rows, { bin_s: 30, min_ok_breaths: 3 }).map((r) => r.breaths)).toEqual([8, 7, 8, 7]);
  });
});

describe('computeTrends with PaCO2 estimates between blood gases', () => {
  // Three ok breaths in bin 0 (PETCO2 36, 37, 35; PĒCO2 28, VTe 500, no inspired CO2), one gas at t = 0 with a
  // gradient of 4 mmHg: estimates 40, 41, 39 by the definition PETCO2 + gradient. Hand-worked from Enghoff's equation
  // (Enghoff 1938; VD/VT = (PaCO2 − PĒCO2)/PaCO2 without inspired CO2) and AVDSF = (PaCO2 − PETCO2)/PaCO2 (Hardman &
  // Aitkenhead 2003): Enghoff 12/40 = 0.3, 13/41 = 0.31707, 11/39 = 0.28205 -> median 0.3; AVDSF 4/40 = 0.1,
  // 4/41 = 0.09756, 4/39 = 0.10256 -> median 0.1.
  const rows = [b(0, 4, 500, 14, 36, { peco2_mmhg: 28 }), b(4, 4, 500, 14, 37, { peco2_mmhg: 28 }), b(8, 4, 500, 14, 35, { peco2_mmhg: 28 }),
    b(60, 4, 500, 14, 36, { peco2_mmhg: 28 })];
  // one gas row (the table's other columns as analyseGas makes them), placed at t = 0 with gradient 4 and PETCO2 36
  const gasRows = analyseGas(rows, [makeSample({ time_s: 20, paco2_mmhg: 40 })], { pb_mmhg: 760 }).rows.map((g) => ({
    ...g, time_s: 0, petco2_mmhg: 36, gradient_mmhg: 4,
  }));

  it('the bin medians of the estimated PaCO2, Enghoff VD/VT and AVDSF', () => {
    const est = estimatePaco2(rows, gasRows);
    expect(est.map((e) => e.paco2_est_mmhg)).toEqual([40, 41, 39, 40]);
    expectClose(est[1]!.vdvt_enghoff_est, 13 / 41, { abs: 1e-12 });
    expectClose(est[2]!.avdsf_est, 4 / 39, { abs: 1e-12 });
    const [t0, t1] = computeTrends(rows, opts, 0, est);
    expect(t0!.paco2_est_mmhg).toBe(40);
    expectClose(t0!.vdvt_enghoff_est, 0.3, { abs: 1e-12 });
    expectClose(t0!.avdsf_est, 0.1, { abs: 1e-12 });
    // bin 1 has one ok breath, fewer than min_ok_breaths (3): no value, as for the other columns
    expect(t1!.paco2_est_mmhg).toBeNaN();
    expect(t1!.petco2_mmhg).toBeNaN();
  });

  it('without estimates the columns are empty', () => {
    const [t0] = computeTrends(rows, opts);
    expect(t0!.paco2_est_mmhg).toBeNaN();
    expect(t0!.vdvt_enghoff_est).toBeNaN();
    expect(t0!.avdsf_est).toBeNaN();
  });
});
