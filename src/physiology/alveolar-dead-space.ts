/**
 * Alveolar dead space, mL: the part of a physiological (Bohr or Enghoff) dead space that is not airway (Fowler) dead
 * space, VDalv = VD - VDaw. Both volumes must be taken at the same place (both at the sensor or both for the patient,
 * see patientDeadSpace): the apparatus volume then cancels.
 * Source: Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88 (division of physiological dead space
 * into airway and alveolar parts).
 *
 * NaN propagates.
 *
 * @example alveolarDeadSpaceMl(173.75, 149.648) // 24.10
 */
export function alveolarDeadSpaceMl(deadSpaceMl: number, airwayDeadSpaceMl: number): number {
  return deadSpaceMl - airwayDeadSpaceMl;
}
