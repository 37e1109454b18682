// The per-breath values that need an arterial PCO2: Enghoff dead space, the alveolar dead-space fraction in its
// arterial form and Fletcher's areas with the CO2 efficiency. One home for both routes that give a breath its PaCO2:
// `--paco2` (the analysis, decompose.ts) and blood gases (src/gas/apply-paco2.ts).
import { alveolarDeadSpaceFractionArterial } from '../physiology/alveolar-dead-space-fraction';
import { enghoffDeadSpaceFraction } from '../physiology/enghoff-dead-space-fraction';
import { fletcherAreas } from '../physiology/fletcher-areas';
import { patientDeadSpace } from '../physiology/patient-dead-space';
import type { BreathRow } from '../types';

/** The inspired PCO2 of the Bohr and Enghoff equations for a breath: its mean inspired PCO2 when the inspired term is
 *  on and the breath has one, else 0. */
export function inspiredPco2For(row: BreathRow, inspiredTerm: boolean): number {
  return inspiredTerm && Number.isFinite(row.fico2_mmhg) ? row.fico2_mmhg : 0;
}

/** The breath's Enghoff dead space for the patient (fraction and mL): at the sensor from PaCO2, PĒCO2 and the inspired
 *  PCO2, apparatus removed (enghoffDeadSpaceFraction, patientDeadSpace). */
export function breathEnghoff(row: BreathRow, paco2Mmhg: number, inspiredMmhg: number, apparatusMl: number): { fraction: number; volume_ml: number } {
  return patientDeadSpace(enghoffDeadSpaceFraction(paco2Mmhg, row.peco2_mmhg, inspiredMmhg), row.vt_exp_ml, apparatusMl);
}

/**
 * Sets the PaCO2-dependent columns of one breath row in place. `inspiredMmhg`: the inspired PCO2 of Enghoff's
 * equation (0 when the inspired term is off). Dead spaces are measured at the sensor and reported for the patient
 * (apparatus removed). Fletcher's areas are those of the single-breath test at the sensor: X = ∫P dV over the
 * expiration (PĒCO2 × V_E), Z = PaCO2 × airway dead space at the sensor (`vd_aw_ml` + `apparatus_ml`), Y = PaCO2 × V_E −
 * X − Z; efficiency = X/(X + Y + Z) (Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88).
 */
export function setArterialColumns(row: BreathRow, paco2Mmhg: number, inspiredMmhg: number, apparatusMl: number): void {
  const vte = row.vt_exp_ml;
  const enghoff = breathEnghoff(row, paco2Mmhg, inspiredMmhg, apparatusMl);
  row.vdvt_enghoff = enghoff.fraction;
  row.vd_enghoff_ml = enghoff.volume_ml;
  row.vdalv_vtalv = alveolarDeadSpaceFractionArterial(paco2Mmhg, row.paeco2_mmhg, inspiredMmhg);
  const areas = fletcherAreas({ paco2Mmhg, vtMl: vte, vdAwMl: row.vd_aw_ml + apparatusMl, areaMmhgMl: row.peco2_mmhg * vte });
  row.fletcher_x_mmhg_ml = areas.x_mmhg_ml;
  row.fletcher_y_mmhg_ml = areas.y_mmhg_ml;
  row.fletcher_z_mmhg_ml = areas.z_mmhg_ml;
  row.co2_efficiency = areas.efficiency;
}
