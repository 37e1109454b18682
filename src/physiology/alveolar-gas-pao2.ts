import { PH2O_37C_MMHG } from './percent-to-mmhg.js';

/** Form of the alveolar gas equation (primer 10.3). */
export type AlveolarGasForm = 'full' | 'simplified';

export interface AlveolarGasInput {
  /** inspired O2 fraction, 0-1 */
  fio2: number;
  /** barometric pressure, mmHg */
  pbMmhg: number;
  /** arterial PCO2, mmHg */
  paco2Mmhg: number;
  /** respiratory exchange ratio R (typically 0.8) */
  rq: number;
  /** water vapour pressure, mmHg (default 47 at 37 C) */
  ph2oMmhg?: number;
  /** 'full' (default) or 'simplified' */
  form?: AlveolarGasForm;
}

/**
 * Alveolar gas equation: ideal alveolar PO2, PAO2 (mmHg).
 *
 * Formula (primer 10.3):
 * - full:       PAO2 = FiO2*(PB - PH2O) - PaCO2 * (FiO2 + (1 - FiO2)/R)
 * - simplified: PAO2 = FiO2*(PB - PH2O) - PaCO2 / R
 * FiO2 as a fraction, pressures in mmHg, R dimensionless.
 * Source: [from memory: alveolar gas equation, standard texts].
 *
 * Returns NaN when R <= 0; NaN propagates.
 *
 * @example alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8 }) // 239.2 (primer W11)
 */
export function alveolarGasPao2(input: AlveolarGasInput): number {
  const { fio2, pbMmhg, paco2Mmhg, rq } = input;
  if (!(rq > 0)) return NaN;
  const ph2o = input.ph2oMmhg ?? PH2O_37C_MMHG;
  const inspiredPo2 = fio2 * (pbMmhg - ph2o);
  if ((input.form ?? 'full') === 'simplified') return inspiredPo2 - paco2Mmhg / rq;
  return inspiredPo2 - paco2Mmhg * (fio2 + (1 - fio2) / rq);
}
