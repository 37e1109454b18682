export type Sex = 'male' | 'female';

/** Which statement of the predicted body weight formula (primer 12). */
export type PbwFormula = 'ardsnet' | 'devine';

/** Height at which the formula's constant applies: 152.4 cm = 60 in. */
export const PBW_BASE_HEIGHT_CM = 152.4;

/**
 * Predicted body weight (kg) for adults.
 *
 * Formula (primer 12):
 * - 'ardsnet' (default, cm form): men 50 + 0.91 * (height_cm - 152.4); women 45.5 + 0.91 * (height_cm - 152.4)
 * - 'devine' (inch form):         men 50 + 2.3 * (height_in - 60);   women 45.5 + 2.3 * (height_in - 60),
 *   height_in = height_cm / 2.54
 * Source: [published: ARDSNet 2000 NEJM and Devine 1974 as restated in multiple secondary sources]; worked values
 * [published formula: ARDSNet 2000 NEJM via secondary sources; numbers are ours] (primer W17).
 * Adult formulae only; unsuitable for small stature [published: Martin & Richards 2017 BMC Pulm Med].
 * The result can be small or negative for short heights: callers must decide whether the formula applies.
 *
 * NaN propagates.
 *
 * @example predictedBodyWeight(175, 'male') // 70.57 ; predictedBodyWeight(160, 'female') // 52.42
 */
export function predictedBodyWeight(heightCm: number, sex: Sex, formula: PbwFormula = 'ardsnet'): number {
  const base = sex === 'male' ? 50 : 45.5;
  if (formula === 'devine') return base + 2.3 * (heightCm / 2.54 - 60);
  return base + 0.91 * (heightCm - PBW_BASE_HEIGHT_CM);
}
