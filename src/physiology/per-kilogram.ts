/**
 * A volume or rate per kilogram of body weight (mL/kg, mL/kg/min): value / weight. The weight is the one
 * chooseWeight picks (predicted body weight for adults with height and sex, else the actual weight; ARDS Network 2000,
 * N Engl J Med 342:1301-1308, for predicted body weight as the basis of per-kg volumes).
 *
 * NaN when the weight is not positive; NaN propagates.
 *
 * @example perKilogram(150, 70) // 2.142857...
 */
export function perKilogram(value: number, weightKg: number): number {
  if (!(weightKg > 0)) return NaN;
  return value / weightKg;
}
