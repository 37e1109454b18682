/** A dead space of the patient alone: volume (mL) and its share of the tidal volume. */
export interface PatientDeadSpace {
  volume_ml: number;
  fraction: number;
}

/**
 * Patient dead-space volume from one measured at the airway sensor: VD_patient = VD_sensor - V_apparatus, mL.
 *
 * The apparatus between sensor and patient (connectors, filter, elbow: the apparatus_ml setting) is breathed in and
 * out but never reaches alveoli, so every dead space measured at the sensor (Fowler airway, Bohr, Enghoff) holds its
 * whole volume and alveolar dead space (Bohr or Enghoff minus Fowler) holds none of it. This is the one place where
 * the apparatus volume is removed.
 * Source: derived here.
 *
 * NaN propagates.
 *
 * @example patientDeadSpaceMl(180, 30) // 150
 */
export function patientDeadSpaceMl(deadSpaceAtSensorMl: number, apparatusMl: number): number {
  return deadSpaceAtSensorMl - apparatusMl;
}

/**
 * Inverse of patientDeadSpaceMl: the dead space at the sensor from the patient's, VD_sensor = VD_patient +
 * V_apparatus, mL (for drawing on the curve measured at the sensor). Source: derived here.
 *
 * NaN propagates.
 */
export function deadSpaceAtSensorMl(patientDeadSpaceMlValue: number, apparatusMl: number): number {
  return patientDeadSpaceMlValue + apparatusMl;
}

/**
 * Patient dead space (volume and VD/VT) from a dead-space fraction measured at the sensor (Bohr or Enghoff).
 *
 * Formula: VD_patient = patientDeadSpaceMl(VD/VT_sensor x VT, V_apparatus); VD/VT_patient = VD_patient / VT, with VT
 * measured at the sensor (the patient breathes the same volume). VD/VT fractions are reported for the patient alone,
 * so that fraction x VT = volume and a change of the breathing circuit does not show as a change of the patient;
 * without apparatus volume the fraction is the one measured (and needs no VT).
 * Source: derived here.
 *
 * NaN propagates.
 *
 * @example patientDeadSpace(0.36, 500, 30) // { volume_ml: 150, fraction: 0.3 }
 */
export function patientDeadSpace(fractionAtSensor: number, tidalVolumeMl: number, apparatusMl: number): PatientDeadSpace {
  const volume = patientDeadSpaceMl(fractionAtSensor * tidalVolumeMl, apparatusMl);
  return { volume_ml: volume, fraction: apparatusMl === 0 ? fractionAtSensor : volume / tidalVolumeMl };
}

/**
 * Alveolar part of a tidal volume, mL: VT - VDaw (patient airway) - V_apparatus, the gas that reaches alveoli; alveolar
 * ventilation as "ventilation reaching alveoli" is RR x this volume.
 * Source: Fowler WS 1948, Am J Physiol 154:405-416 (airway dead space as the volume not reaching alveoli); the
 * apparatus term derived here (see patientDeadSpaceMl).
 *
 * NaN propagates.
 */
export function alveolarTidalVolumeMl(
  tidalVolumeMl: number,
  patientAirwayDeadSpaceMl: number,
  apparatusMl: number,
): number {
  return tidalVolumeMl - patientAirwayDeadSpaceMl - apparatusMl;
}
