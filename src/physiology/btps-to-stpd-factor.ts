import { PH2O_37C_MMHG } from './percent-to-mmhg.js';

/**
 * BTPS -> STPD volume conversion factor (multiply a BTPS volume to get STPD).
 *
 * Formula (primer 7.3): F_STPD = (PB - 47) / 760 * 273.15 / 310.15, PB in mmHg, result dimensionless
 * (0.8262 at PB = 760). PH2O at 37 C fixed at the conventional 47 mmHg.
 * Source: [common practice, no source: gas laws].
 *
 * NaN propagates.
 *
 * @example btpsToStpdFactor(760) // 0.8262 (primer W7)
 */
export function btpsToStpdFactor(pbMmhg: number): number {
  return ((pbMmhg - PH2O_37C_MMHG) / 760) * (273.15 / 310.15);
}
