// A breath row with every field NaN except the ones given (tests only).
import type { BreathRow } from '../../src/types';

export function breathRow(fields: Partial<BreathRow>): BreathRow {
  return {
    breath: 0, t_start_s: NaN, t_exp_start_s: NaN, t_end_s: NaN, status: 'ok', rr_bpm: NaN, ti_s: NaN, te_s: NaN,
    vt_insp_ml: NaN, vt_exp_ml: NaN, vd_aw_ml: NaN, vd_inflection_ml: NaN, v_phase2_start_ml: NaN, v_phase3_start_ml: NaN,
    slope2_mmhg_per_l: NaN, slope3_mmhg_per_l: NaN, slope3_norm_per_l: NaN, slope3_r2: NaN, petco2_mmhg: NaN,
    peco2_mmhg: NaN, paeco2_mmhg: NaN, alv_co2_mmhg: NaN, vtco2_ml: NaN, veco2_ml: NaN, vico2_ml: NaN, fico2_mmhg: NaN,
    vd_bohr_ml: NaN, vdvt_bohr: NaN, vd_alv_ml: NaN, vd_enghoff_ml: NaN, vdvt_enghoff: NaN, delay_s: NaN, delay_measured_s: NaN, flags: [],
    ...fields,
  };
}
