import { STPD_ML_PER_MMHG_ML } from './constants';
import { curveArea, curvePco2, fowlerEqualArea, lineAt, type ExpiredCurve } from './expired-curve';
import type { BreathGas } from './gas-exchange';
import type { CompartmentGas } from './lung-compartments';
import { phaseShapeTruth } from './phase-shape-truth';
import type { TruthBreath } from './truth';

export interface BreathTiming {
  breath: number;
  t_start_s: number;
  t_exp_start_s: number;
  t_end_s: number;
}

export interface BreathConditions {
  shunt_fraction: number;
  alv_dead_space_fraction: number;
  q_l_min: number;
  vco2_ml_min: number;
  slope3_mmhg_per_l: number;
}

/** What only the 'compartments' model or a sidestream sample flow adds to a breath's truth. */
export interface BreathExtras {
  comp?: CompartmentGas;
  /** sample flow, mL/s, with the breath's inspiratory and expiratory times, s */
  sample?: { ml_per_s: number; ti_s: number; te_s: number };
}

/**
 * The parts of PaCO2 - PETCO2 in the compartment model (each a difference of true values, so they add up exactly):
 * shunt Pa - Pc', V/Q mismatch Pc' - PA(perfused, ventilation-weighted), alveolar dead space PA(perfused) - Pmix,
 * sequential emptying Pmix - PETCO2 [derived here].
 */
export function gradientParts(gas: BreathGas, comp: CompartmentGas, petco2Mmhg: number): Partial<TruthBreath> {
  return {
    pcco2_mmhg: comp.pc_mmhg,
    pa_perfused_vent_mmhg: comp.pa_perfused_vent_mmhg,
    zone1_fraction: comp.zone1_fraction,
    grad_total_mmhg: gas.paco2_mmhg - petco2Mmhg,
    grad_shunt_mmhg: gas.paco2_mmhg - comp.pc_mmhg,
    grad_vq_mmhg: comp.pc_mmhg - comp.pa_perfused_vent_mmhg,
    grad_dead_space_mmhg: comp.pa_perfused_vent_mmhg - gas.alv_mean_mmhg,
    grad_emptying_mmhg: gas.alv_mean_mmhg - petco2Mmhg,
  };
}

function extraFields(curve: ExpiredCurve, gas: BreathGas, petco2Mmhg: number, extras: BreathExtras): Partial<TruthBreath> {
  const out: Partial<TruthBreath> = extras.comp ? gradientParts(gas, extras.comp, petco2Mmhg) : {};
  if (extras.comp) out.petco2_line_end_mmhg = lineAt(curve, curve.ve_ml);
  if (extras.sample) {
    out.sample_loss_exp_ml = extras.sample.ml_per_s * extras.sample.te_s;
    out.sample_gain_insp_ml = extras.sample.ml_per_s * extras.sample.ti_s;
  }
  return out;
}

/**
 * True values of one breath from its noise-free expired curve and gas exchange (definitions in truth.ts).
 * VTCO2 = 1.1588e-3 (integral P dV_exp - PI VTi) mL STPD (derived here, docs/methods.md); PECO2 = integral / V_E;
 * PAECO2 = integral / (V_E - VDaw); normalised phase III slopes = true slope / PAECO2 (and x V_E / 1000); Bohr and
 * Enghoff with the inspired term (Bohr 1891, Enghoff 1938).
 */
export function breathTruth(
  timing: BreathTiming,
  curve: ExpiredCurve,
  gas: BreathGas,
  vtInspMl: number,
  cond: BreathConditions,
  extras: BreathExtras = {},
): TruthBreath {
  const ve = curve.ve_ml;
  const vd = curve.vd_aw_ml;
  const pi = curve.pi_mmhg;
  const area = curveArea(curve);
  const peco2 = area / ve;
  const vMid = (vd + 3 * curve.sigma_ml + ve) / 2;
  const alv = lineAt(curve, vMid);
  const pa = gas.paco2_mmhg;
  const vdvtBohr = (alv - peco2) / (alv - pi);
  const vdvtEnghoff = (pa - peco2) / (pa - pi);
  const veco2 = STPD_ML_PER_MMHG_ML * area;
  const vico2 = STPD_ML_PER_MMHG_ML * pi * vtInspMl;
  const fowlerRaw = fowlerEqualArea(area, curve.a_mmhg, curve.b_mmhg_per_ml, ve);
  const fowlerNet = fowlerEqualArea(area - pi * ve, curve.a_mmhg - pi, curve.b_mmhg_per_ml, ve);
  const paeco2 = area / (ve - vd);
  const petco2 = curvePco2(curve, ve);
  return {
    ...timing,
    rr_bpm: 60 / (timing.t_end_s - timing.t_start_s),
    vt_insp_ml: vtInspMl,
    vt_exp_ml: ve,
    vd_aw_ml: vd,
    vd_fowler_exact_ml: fowlerRaw,
    vd_fowler_net_exact_ml: fowlerNet,
    vd_alv_enghoff_ml: ((ve - vd) * (pa - gas.alv_mean_mmhg)) / (pa - pi),
    vd_alv_unperfused_ml: cond.alv_dead_space_fraction * (ve - vd),
    vd_phys_ml: vdvtEnghoff * ve,
    vd_bohr_ml: vdvtBohr * ve,
    vdvt_bohr: vdvtBohr,
    vdvt_enghoff: vdvtEnghoff,
    paco2_mmhg: pa,
    pvco2_mmhg: gas.pv_mmhg,
    pa_perfused_mmhg: gas.pa_perfused_mmhg,
    petco2_mmhg: petco2,
    peco2_mmhg: peco2,
    paeco2_mmhg: paeco2,
    alv_co2_mmhg: alv,
    slope3_mmhg_per_l: cond.slope3_mmhg_per_l,
    slope3_norm_paeco2_per_l: cond.slope3_mmhg_per_l / paeco2,
    slope3_vt_norm: (cond.slope3_mmhg_per_l * (ve / 1000)) / paeco2,
    ...phaseShapeTruth(curve, paeco2, cond.slope3_mmhg_per_l),
    vtco2_ml: veco2 - vico2,
    veco2_ml: veco2,
    vico2_ml: vico2,
    fico2_mmhg: pi,
    shunt_fraction: cond.shunt_fraction,
    alv_dead_space_fraction: cond.alv_dead_space_fraction,
    q_l_min: cond.q_l_min,
    vco2_ml_min: cond.vco2_ml_min,
    eliminated_ml: gas.eliminated_ml,
    ...extraFields(curve, gas, petco2, extras),
  };
}
