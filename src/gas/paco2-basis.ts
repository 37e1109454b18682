// Which PaCO2 the gradient and the dead spaces use: the value measured at 37 deg C, or the value at the patient's
// temperature (temp_c) by pco2AtTemperature. Every caller (analyseGas, the shunt part, per-breath Enghoff) goes
// through paco2Basis so they cannot disagree.
import { pco2AtTemperature } from '../physiology/pco2-temperature';
import type { GasSample, Paco2Temperature } from './gas-types';

export interface Paco2Basis {
  /** PaCO2 as measured (at 37 deg C), mmHg */
  measured_mmhg: number;
  /** PaCO2 at temp_c, mmHg; NaN without temp_c */
  corrected_mmhg: number;
  /** the PaCO2 the gradient and dead spaces use, mmHg */
  used_mmhg: number;
  /** true when used_mmhg is the corrected value */
  corrected: boolean;
  /** a PCO2 measured at 37 deg C in this sample (PvCO2) on the same basis as used_mmhg */
  onBasis: (pco2At37Mmhg: number) => number;
}

/**
 * The PaCO2 of a sample on the chosen basis: corrected to temp_c when the setting is 'corrected' and temp_c is given,
 * else as measured.
 */
export function paco2Basis(sample: Pick<GasSample, 'paco2_mmhg' | 'temp_c'>, setting: Paco2Temperature): Paco2Basis {
  const hasTemp = Number.isFinite(sample.temp_c);
  const correctedMmhg = hasTemp ? pco2AtTemperature(sample.paco2_mmhg, sample.temp_c) : NaN;
  const corrected = hasTemp && setting === 'corrected';
  return {
    measured_mmhg: sample.paco2_mmhg,
    corrected_mmhg: correctedMmhg,
    used_mmhg: corrected ? correctedMmhg : sample.paco2_mmhg,
    corrected,
    onBasis: (pco2) => (corrected ? pco2AtTemperature(pco2, sample.temp_c) : pco2),
  };
}
