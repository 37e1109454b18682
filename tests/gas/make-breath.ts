// Hand-built BreathRow values for the blood-gas tests (not a test file). Unset numeric fields are NaN.
import type { BreathRow } from '../../src/types.js';
import type { GasSample } from '../../src/gas/index.js';

export function makeBreath(fields: Partial<BreathRow> & { t_start_s: number }): BreathRow {
  const nan = NaN;
  return {
    breath: 0,
    t_exp_start_s: nan,
    t_end_s: fields.t_start_s + 4,
    status: 'ok',
    rr_bpm: nan,
    ti_s: nan,
    te_s: nan,
    vt_insp_ml: nan,
    vt_exp_ml: nan,
    vd_aw_ml: nan,
    vd_inflection_ml: nan,
    v_phase2_start_ml: nan,
    v_phase3_start_ml: nan,
    slope2_mmhg_per_l: nan,
    slope3_mmhg_per_l: nan,
    slope3_norm_per_l: nan,
    slope3_r2: nan,
    petco2_mmhg: nan,
    peco2_mmhg: nan,
    paeco2_mmhg: nan,
    alv_co2_mmhg: nan,
    vtco2_ml: nan,
    veco2_ml: nan,
    vico2_ml: nan,
    fico2_mmhg: nan,
    vd_bohr_ml: nan,
    vdvt_bohr: nan,
    vd_alv_ml: nan,
    vd_enghoff_ml: nan,
    vdvt_enghoff: nan,
    delay_s: nan,
    delay_measured_s: nan,
    flags: [],
    ...fields,
  };
}

/** Numbered breaths every 5 s from `fromS` (each 4 s long), all with the same fields. */
export function breathSeries(fromS: number, count: number, fields: Partial<BreathRow>): BreathRow[] {
  return Array.from({ length: count }, (_, i) => makeBreath({ ...fields, breath: i + 1, t_start_s: fromS + 5 * i }));
}

export function makeSample(fields: Partial<GasSample> & { time_s: number; paco2_mmhg: number }): GasSample {
  return {
    line: 2,
    pao2_mmhg: NaN,
    sao2_pct: NaN,
    svo2_pct: NaN,
    pvco2_mmhg: NaN,
    pvo2_mmhg: NaN,
    hb_g_dl: NaN,
    fio2_pct: NaN,
    temp_c: NaN,
    ...fields,
  };
}
