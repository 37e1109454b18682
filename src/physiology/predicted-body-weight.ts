export type Sex = 'male' | 'female';

/** Which statement of the predicted body weight formula. */
export type PbwFormula = 'ardsnet' | 'devine';

/** Height at which the formula's constant applies: 152.4 cm = 60 in. */
export const PBW_BASE_HEIGHT_CM = 152.4;

/**
 * Predicted body weight (kg) for adults.
 *
 * Formula:
 * - 'ardsnet' (default, cm form): men 50 + 0.91 * (height_cm - 152.4); women 45.5 + 0.91 * (height_cm - 152.4)
 * - 'devine' (inch form):         men 50 + 2.3 * (height_in - 60);   women 45.5 + 2.3 * (height_in - 60),
 *   height_in = height_cm / 2.54
 * Source: The Acute Respiratory Distress Syndrome Network 2000, N Engl J Med 342:1301-1308 (cm form);
 * Devine BJ 1974, Drug Intell Clin Pharm 8:650-655 (inch form); worked values are ours.
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
