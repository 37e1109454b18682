import type { SimParams } from './params';
import { ALV_VENT_CONSTANT } from './constants';
import { arterialPco2ByMixing } from './shunt-mixing';

/**
 * Lung and circulation model of the simulator, evaluated once per breath (see MODEL.md).
 *
 * Perfused alveolar ventilation (L/min BTPS):   VA_p = RR (VT - VDaw) (1 - f_ads) / 1000
 * Elimination from perfused units (mL/min STPD): E = VA_p (PA - PI) / K,   K = 0.86296 (derived here)
 * Delivery by capillary blood (mL/min STPD):     D = k Q (1 - s) (Pv - PA),  k mL/dL/mmHg, Q in dL/min (derived here)
 * D = E gives the perfused alveolar (= end-capillary) PCO2:
 *   PA = (Gq Pv + Gv PI) / (Gq + Gv),   Gq = k Q (1 - s),  Gv = VA_p / K   (both mL/min/mmHg)
 * Unperfused units (fraction f_ads of alveolar ventilation) return inspired gas, so the mean alveolar expired PCO2 is
 *   Pmix = PA (1 - f_ads) + PI f_ads.
 * Arterial PCO2 by linear content mixing (derived here, docs/methods.md): Pa = PA + s (Pv - PA).
 * Body CO2 store (one compartment, capacity C mL/mmHg): dPv/dt = (V'CO2 - E) / C, integrated per breath with the CO2
 * actually eliminated in that breath, so CO2 mass is conserved exactly.
 * VA_p entering the balance is smoothed between breaths with time constant tau_mix (the lung gas volume buffers
 * breath-to-breath changes); the CO2 eliminated in a breath uses that breath's own alveolar volume.
 * [derived here: mass balance; the constants as cited above]
 */
export type GasInputs = Pick<
  SimParams,
  | 'vco2_ml_min'
  | 'q_l_min'
  | 'shunt_fraction'
  | 'co2_slope_ml_dl_mmhg'
  | 'co2_store_ml_per_mmhg'
  | 'pi_co2_mmhg'
  | 'alv_dead_space_fraction'
  | 'alv_mixing_tau_s'
  | 'vd_aw_ml'
>;

export interface Co2BodyState {
  pv_mmhg: number;
  va_smooth_l_min: number;
}

export interface BreathGas {
  pa_perfused_mmhg: number;
  pv_mmhg: number;
  paco2_mmhg: number;
  /** mean alveolar expired PCO2 (perfused and unperfused alveolar gas mixed), mmHg */
  alv_mean_mmhg: number;
  va_perfused_l_min: number;
  /** CO2 leaving the body through the lungs in this breath (lung side, before any leak), mL STPD */
  eliminated_ml: number;
}

/** Capillary CO2 conductance Gq = k Q (1 - s), mL/min/mmHg. */
export function capillaryConductance(g: GasInputs): number {
  return g.co2_slope_ml_dl_mmhg * g.q_l_min * 10 * (1 - g.shunt_fraction);
}

/** Perfused alveolar ventilation of a breath, L/min BTPS. */
export function perfusedAlveolarVentilation(vtLungMl: number, periodS: number, g: GasInputs): number {
  return ((vtLungMl - g.vd_aw_ml) * (1 - g.alv_dead_space_fraction) * 60) / periodS / 1000;
}

/** Steady state for a constant breathing pattern: Pv such that elimination equals production. */
export function steadyCo2State(vtLungMl: number, periodS: number, g: GasInputs): Co2BodyState {
  const va = perfusedAlveolarVentilation(vtLungMl, periodS, g);
  const pa = g.pi_co2_mmhg + (ALV_VENT_CONSTANT * g.vco2_ml_min) / va;
  return { pv_mmhg: pa + g.vco2_ml_min / capillaryConductance(g), va_smooth_l_min: va };
}

/** One breath of gas exchange: returns its gas values and the state after the breath. */
export function breathGasExchange(
  state: Co2BodyState,
  g: GasInputs,
  vtLungMl: number,
  periodS: number,
): { gas: BreathGas; next: Co2BodyState } {
  const va = perfusedAlveolarVentilation(vtLungMl, periodS, g);
  const mix = g.alv_mixing_tau_s > 0 ? 1 - Math.exp(-periodS / g.alv_mixing_tau_s) : 1;
  const vaSmooth = state.va_smooth_l_min + (va - state.va_smooth_l_min) * mix;
  const gq = capillaryConductance(g);
  const gv = vaSmooth / ALV_VENT_CONSTANT;
  const pa = (gq * state.pv_mmhg + gv * g.pi_co2_mmhg) / (gq + gv);
  const alveolarLitres = (va * periodS) / 60;
  const eliminated = (alveolarLitres * (pa - g.pi_co2_mmhg)) / ALV_VENT_CONSTANT;
  const pvNext = state.pv_mmhg + ((g.vco2_ml_min * periodS) / 60 - eliminated) / g.co2_store_ml_per_mmhg;
  const gas: BreathGas = {
    pa_perfused_mmhg: pa,
    pv_mmhg: state.pv_mmhg,
    paco2_mmhg: arterialPco2ByMixing(pa, state.pv_mmhg, g.shunt_fraction),
    alv_mean_mmhg: pa * (1 - g.alv_dead_space_fraction) + g.pi_co2_mmhg * g.alv_dead_space_fraction,
    va_perfused_l_min: va,
    eliminated_ml: eliminated,
  };
  return { gas, next: { pv_mmhg: pvNext, va_smooth_l_min: vaSmooth } };
}
