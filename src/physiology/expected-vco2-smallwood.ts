/**
 * Expected CO2 elimination of mechanically ventilated children (Smallwood), mL/kg/min.
 *
 * Formula (primer W25): V'CO2 [mL/kg/min] = 115 * height_cm^-0.71.
 * Source: [published: Smallwood et al., Respir Care, abstract; numbers are ours] (Smallwood CD, Walsh BK, Bechard
 * LJ, Mehta NM. "Carbon dioxide elimination and oxygen consumption in mechanically ventilated children").
 *
 * For display as a reference expectation only. Returns NaN for height <= 0; NaN propagates.
 *
 * @example expectedVco2SmallwoodPerKg(100) // 4.37
 */
export function expectedVco2SmallwoodPerKg(heightCm: number): number {
  if (!(heightCm > 0)) return NaN;
  return 115 * heightCm ** -0.71;
}
