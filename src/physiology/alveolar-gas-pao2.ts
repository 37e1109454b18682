import { PH2O_37C_MMHG } from './constants';

/** Form of the alveolar gas equation. */
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
 * Formula:
 * - full:       PAO2 = FiO2*(PB - PH2O) - PaCO2 * (FiO2 + (1 - FiO2)/R)
 * - simplified: PAO2 = FiO2*(PB - PH2O) - PaCO2 / R
 * FiO2 as a fraction, pressures in mmHg, R dimensionless.
 * Source: Riley RL, Cournand A 1949, J Appl Physiol 1:825-847 ("ideal" alveolar air); the simplified form drops the
 * FiO2 term: common practice, no source.
 *
 * Returns NaN when R <= 0; NaN propagates.
 *
 * @example alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8 }) // 239.2
 */
export function alveolarGasPao2(input: AlveolarGasInput): number {
  const { fio2, pbMmhg, paco2Mmhg, rq } = input;
  if (!(rq > 0)) return NaN;
  const ph2o = input.ph2oMmhg ?? PH2O_37C_MMHG;
  const inspiredPo2 = fio2 * (pbMmhg - ph2o);
  if ((input.form ?? 'full') === 'simplified') return inspiredPo2 - paco2Mmhg / rq;
  return inspiredPo2 - paco2Mmhg * (fio2 + (1 - fio2) / rq);
}
