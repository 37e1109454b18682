import { detExp } from '../numeric/det-math';
import { ALV_VENT_CONSTANT } from './constants';
import type { BreathGas, Co2BodyState, GasInputs } from './gas-exchange';
import type { LungCompartment, SimParams } from './params';
import { arterialPco2ByMixing } from './shunt-mixing';

/**
 * The 'compartments' lung model (see MODEL.md, "Compartment lung model"). Haldane-free, steady state per breath.
 *
 * Compartment i gets the share v_i of alveolar ventilation VA = RR (VT - VDaw) / 1000 (L/min BTPS) and the share q_i
 * of the non-shunted blood flow Q (1 - s). A zone-1 fraction z of every perfused compartment is ventilated but not
 * perfused (West, Dollery, Naimark 1964). With Gv_i = (1 - z) v_i VA / K and Gq_i = k Q (1 - s) q_i, the mass balance of
 * gas-exchange.ts per compartment gives
 *   PA_i = (Gq_i Pv + Gv_i PI) / (Gq_i + Gv_i)          (PA_i = PI when q_i = 0: unperfused units)
 * the gas compartment i expires is PE_i = (1 - z) PA_i + z PI when perfused, PI when not;
 * end-capillary blood mixes by content (one slope k): Pc' = sum q_i PA_i; arterial Pa = Pc' + s (Pv - Pc')
 * (Anderson & Breen 2000, shunt-mixing.ts). Elimination E = VA (Pmix - PI) / K with Pmix = sum v_i PE_i.
 * [derived here: mass balance per compartment, as gas-exchange.ts]
 */

/** Parameters of the zone-1 rule. */
export type Zone1Inputs = Pick<
  SimParams,
  'zone1_lung_height_cm' | 'zone1_pa_level_cm' | 'zone1_pla_mmhg' | 'zone1_pvr_mmhg_min_per_l' | 'zone1_palv_cmh2o'
>;

/** cmH2O per mmHg: 13.5951 (mercury) / 10 [common practice, no source: densities of mercury and water]. */
export const CMH2O_PER_MMHG = 1.35951;
/** Hydrostatic gradient of blood, cmH2O per cm of height (blood density 1.06 g/mL) [common practice, no source]. */
export const BLOOD_CMH2O_PER_CM = 1.06;

/**
 * Zone-1 share of the lung: the share of the lung's height above the level where pulmonary arterial pressure has
 * fallen to alveolar pressure (no flow above that level: West JB, Dollery CT, Naimark A 1964, "Distribution of blood
 * flow in isolated lung; relation to vascular and alveolar pressures", J Appl Physiol 19:713-724). Mean pulmonary
 * arterial pressure Ppa = Pla + PVR Q (mmHg); it falls by 1.06 cmH2O per cm above the pulmonary artery, so zone 1
 * begins h1 = (1.35951 Ppa - Palv) / 1.06 cm above it; z = clamp((H - Lpa - h1) / H, 0, 1), assuming ventilation is
 * spread evenly over the height [derived here]. Returns 0 when the rule is off (H = 0).
 * @example zone1Fraction(1.5, { zone1_lung_height_cm: 16, zone1_pa_level_cm: 8, zone1_pla_mmhg: 8, zone1_pvr_mmhg_min_per_l: 1.5, zone1_palv_cmh2o: 8 }) // 0.150
 */
export function zone1Fraction(qLMin: number, z: Zone1Inputs): number {
  const h = z.zone1_lung_height_cm;
  if (!(h > 0)) return 0;
  const ppaMmhg = z.zone1_pla_mmhg + z.zone1_pvr_mmhg_min_per_l * qLMin;
  const h1Cm = (CMH2O_PER_MMHG * ppaMmhg - z.zone1_palv_cmh2o) / BLOOD_CMH2O_PER_CM;
  const share = (h - z.zone1_pa_level_cm - h1Cm) / h;
  return share < 0 ? 0 : share > 1 ? 1 : share;
}

/** Gas values of each compartment in one breath. */
export interface CompartmentGas {
  /** alveolar (= end-capillary) PCO2 of the perfused part of each compartment, mmHg (PI when unperfused) */
  pa_mmhg: number[];
  /** PCO2 of the gas each compartment expires (its perfused part mixed with its zone-1 part), mmHg */
  pe_mmhg: number[];
  zone1_fraction: number;
  /** share of alveolar ventilation going to unperfused units (perf_share 0 plus zone 1) */
  unperfused_vent_fraction: number;
  /** end-capillary PCO2 (perfusion-weighted mix), mmHg */
  pc_mmhg: number;
  /** ventilation-weighted mean PCO2 of the perfused units, mmHg */
  pa_perfused_vent_mmhg: number;
}

/** Compartment conductances for alveolar ventilation vaLMin (L/min) at zone-1 share z: Gv_i, Gq_i (mL/min/mmHg). */
function conductances(comps: readonly LungCompartment[], g: GasInputs, vaLMin: number, z: number): { gv: number[]; gq: number[] } {
  const qCap = g.co2_slope_ml_dl_mmhg * g.q_l_min * 10 * (1 - g.shunt_fraction);
  const gv = comps.map((c) => ((c.perf_share > 0 ? 1 - z : 1) * c.vent_share * vaLMin) / ALV_VENT_CONSTANT);
  const gq = comps.map((c) => qCap * c.perf_share);
  return { gv, gq };
}

/** Alveolar ventilation of a breath, L/min BTPS (all alveolar units, perfused or not). */
export function totalAlveolarVentilation(vtLungMl: number, periodS: number, vdAwMl: number): number {
  return ((vtLungMl - vdAwMl) * 60) / periodS / 1000;
}

/** Steady state of the compartment model for a constant pattern: Pv = PI + V'CO2 / sum Gv_i Gq_i / (Gv_i + Gq_i). */
export function steadyCompartmentState(
  vtLungMl: number,
  periodS: number,
  g: GasInputs,
  comps: readonly LungCompartment[],
  zone1: Zone1Inputs,
): Co2BodyState {
  const va = totalAlveolarVentilation(vtLungMl, periodS, g.vd_aw_ml);
  const { gv, gq } = conductances(comps, g, va, zone1Fraction(g.q_l_min, zone1));
  let gTotal = 0;
  for (let i = 0; i < comps.length; i++) if (gq[i]! > 0) gTotal += (gv[i]! * gq[i]!) / (gv[i]! + gq[i]!);
  return { pv_mmhg: g.pi_co2_mmhg + g.vco2_ml_min / gTotal, va_smooth_l_min: va };
}

/** PCO2 of every compartment for mixed-venous pv and smoothed alveolar ventilation vaSmooth. */
export function compartmentPco2(
  comps: readonly LungCompartment[],
  g: GasInputs,
  pvMmhg: number,
  vaSmooth: number,
  z: number,
): CompartmentGas {
  const { gv, gq } = conductances(comps, g, vaSmooth, z);
  const pi = g.pi_co2_mmhg;
  const pa = comps.map((_, i) => (gq[i]! > 0 ? (gq[i]! * pvMmhg + gv[i]! * pi) / (gq[i]! + gv[i]!) : pi));
  const pe = comps.map((c, i) => (c.perf_share > 0 ? (1 - z) * pa[i]! + z * pi : pi));
  let pc = 0;
  let ventPerf = 0;
  let ventPerfP = 0;
  for (let i = 0; i < comps.length; i++) {
    const c = comps[i]!;
    pc += c.perf_share * pa[i]!;
    if (c.perf_share > 0) {
      ventPerf += (1 - z) * c.vent_share;
      ventPerfP += (1 - z) * c.vent_share * pa[i]!;
    }
  }
  return {
    pa_mmhg: pa,
    pe_mmhg: pe,
    zone1_fraction: z,
    unperfused_vent_fraction: 1 - ventPerf,
    pc_mmhg: pc,
    pa_perfused_vent_mmhg: ventPerf > 0 ? ventPerfP / ventPerf : pi,
  };
}

/**
 * One breath of the compartment model: its gas values (BreathGas, with pa_perfused_mmhg = Pc'), each compartment's
 * PCO2 and the state after the breath (body CO2 store as gas-exchange.ts).
 */
export function compartmentBreathGas(
  state: Co2BodyState,
  g: GasInputs,
  comps: readonly LungCompartment[],
  zone1: Zone1Inputs,
  vtLungMl: number,
  periodS: number,
): { gas: BreathGas; comp: CompartmentGas; next: Co2BodyState } {
  const va = totalAlveolarVentilation(vtLungMl, periodS, g.vd_aw_ml);
  const mix = g.alv_mixing_tau_s > 0 ? 1 - detExp(-periodS / g.alv_mixing_tau_s) : 1;
  const vaSmooth = state.va_smooth_l_min + (va - state.va_smooth_l_min) * mix;
  const comp = compartmentPco2(comps, g, state.pv_mmhg, vaSmooth, zone1Fraction(g.q_l_min, zone1));
  let pmix = 0;
  for (let i = 0; i < comps.length; i++) pmix += comps[i]!.vent_share * comp.pe_mmhg[i]!;
  const eliminated = (((va * periodS) / 60) * (pmix - g.pi_co2_mmhg)) / ALV_VENT_CONSTANT;
  const pvNext = state.pv_mmhg + ((g.vco2_ml_min * periodS) / 60 - eliminated) / g.co2_store_ml_per_mmhg;
  const gas: BreathGas = {
    pa_perfused_mmhg: comp.pc_mmhg,
    pv_mmhg: state.pv_mmhg,
    paco2_mmhg: arterialPco2ByMixing(comp.pc_mmhg, state.pv_mmhg, g.shunt_fraction),
    alv_mean_mmhg: pmix,
    va_perfused_l_min: va * (1 - comp.unperfused_vent_fraction),
    eliminated_ml: eliminated,
  };
  return { gas, comp, next: { pv_mmhg: pvNext, va_smooth_l_min: vaSmooth } };
}

/**
 * The compartments with an embolism: compartment `which` (1-based; 0 = none) loses the share `blocked` of its blood
 * flow, and the other perfused compartments take it in proportion to their shares (the total stays Q (1 - s))
 * [derived here]. Returns the same list when nothing is blocked.
 */
export function embolisedCompartments(comps: readonly LungCompartment[], which: number, blocked: number): readonly LungCompartment[] {
  if (which < 1 || !(blocked > 0)) return comps;
  const target = comps[which - 1]!;
  const lost = target.perf_share * blocked;
  const others = 1 - target.perf_share;
  return comps.map((c, i) =>
    i === which - 1 ? { ...c, perf_share: c.perf_share - lost } : { ...c, perf_share: c.perf_share + (lost * c.perf_share) / others },
  );
}
