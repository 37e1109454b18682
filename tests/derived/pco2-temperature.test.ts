// Temperature correction of blood PCO2 measured at 37 °C: PCO2(T) = PCO2(37) x 10^(0.019 (T - 37)), the exponential
// constant 0.019 per °C measured on fresh human blood over 18 °C (Nunn JF, Bergman NA, Bunatyan A, Coleman AJ 1965,
// Temperature coefficients for PCO2 and PO2 of blood in vitro, J Appl Physiol 20:23-26). The expected values are
// worked by hand from that formula (derived here):
//   40 mmHg at 32 °C: 10^(0.019 x -5) = 10^-0.095 = 0.803526; x 40 = 32.1410 mmHg
//   40 mmHg at 40 °C: 10^(0.019 x 3) = 10^0.057 = 1.140250; x 40 = 45.6100 mmHg
//   one degree: 10^-0.019 = 0.957194 (a 4.3 % fall per °C of cooling)
import { describe, expect, it } from 'vitest';
import { PCO2_TEMPERATURE_COEFFICIENT_PER_C, pco2AtTemperature } from '../../src/physiology/pco2-temperature';
import { expectClose } from '../helpers/expect-close';

describe('pco2AtTemperature (Nunn et al. 1965 coefficient)', () => {
  it('uses the published exponential constant 0.019 per °C', () => {
    expect(PCO2_TEMPERATURE_COEFFICIENT_PER_C).toBe(0.019);
  });

  it('40 mmHg measured at 37 °C is 32.141 mmHg at 32 °C and 45.610 mmHg at 40 °C', () => {
    expectClose(pco2AtTemperature(40, 32), 32.141, { abs: 0.001 });
    expectClose(pco2AtTemperature(40, 40), 45.61, { abs: 0.001 });
  });

  it('a 1 °C fall lowers PCO2 by the factor 0.957194', () => {
    expectClose(pco2AtTemperature(100, 36) / 100, 0.957194, { abs: 1e-6 });
  });

  it('is the identity at 37 °C and NaN without a temperature', () => {
    expect(pco2AtTemperature(40, 37)).toBe(40);
    expect(Number.isNaN(pco2AtTemperature(40, NaN))).toBe(true);
  });
});
