// Phase-shape indices of the volumetric capnogram: slopes normalised by PĀECO2 (Tusman G, Gogniat E, Bohm SH et al.
// 2013, "Reference values for volumetric capnography-derived non-invasive parameters in healthy individuals", J Clin
// Monit Comput 27:281-288, name a normalised phase III slope), the phase III slope also normalised by tidal volume,
// the II/III angle (axes: litres and PCO2 / PĀECO2) and VAE/VT (Romero PV, Lucangelo U, Lopez Aguilar J, Fernandez R,
// Blanch L 1997, Eur Respir J 10:1309-1315). None of these sources gives a worked example that could be read here, so
// every expected value is worked by hand (derived here): on round numbers, on angles with exact tangents, and on the
// analytic synthetic curve B (P = 0 below 100 mL, 0 -> 36 mmHg linearly from 100 to 200 mL, then 34 + 0.01 V to
// V_E = 500 mL; PĀECO2 = 13050 / (500 - 149.648) = 37.248 mmHg, docs/methods.md "Derivations").
import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import {
  alveolarEjectionFraction,
  normalisedPhase3Slope,
  normalisedSlope,
  phase23AngleDeg,
  tidalVolumeNormalisedPhase3Slope,
} from '../../src/physiology/index';

const PAECO2_B = 37.248; // synthetic curve B
const SIII_B = 10; // mmHg/L: the line 34 + 0.01 V
const SII_B = 360; // mmHg/L: 36 mmHg over 100 mL

describe('slopes normalised by PĀECO2 [derived here]', () => {
  it('curve B: SnIII = 10 / 37.248 = 0.26847 /L; SnII = 360 / 37.248 = 9.6649 /L', () => {
    expectClose(normalisedSlope(SIII_B, PAECO2_B), 0.26847, { abs: 5e-6 });
    expectClose(normalisedSlope(SII_B, PAECO2_B), 9.6649, { abs: 5e-5 });
  });
  it('round numbers: 8 mmHg/L over 40 mmHg = 0.2 /L; the PETCO2 form is the same division (10 / 39 = 0.25641 /L)', () => {
    expectClose(normalisedSlope(8, 40), 0.2, { rel: 1e-15 });
    expectClose(normalisedPhase3Slope(10, 39), 0.25641, { abs: 5e-6 });
  });
  it('NaN propagates (no PĀECO2 without a Fowler volume)', () => {
    expect(normalisedSlope(10, NaN)).toBeNaN();
    expect(normalisedSlope(NaN, 40)).toBeNaN();
  });
});

describe('phase III slope normalised by PĀECO2 and tidal volume [derived here]', () => {
  it('10 mmHg/L x 0.5 L / 40 mmHg = 0.125 (the line rises 5 mmHg over the breath, 1/8 of PĀECO2)', () => {
    expectClose(tidalVolumeNormalisedPhase3Slope(10, 500, 40), 0.125, { rel: 1e-15 });
  });
  it('curve B: 10 x 0.5 / 37.248 = 0.13424', () => {
    expectClose(tidalVolumeNormalisedPhase3Slope(SIII_B, 500, PAECO2_B), 0.13424, { abs: 5e-6 });
  });
});

describe('II/III angle, axes litres and PCO2 / PĀECO2 [derived here]', () => {
  it('SnII = 1 /L (45°), flat phase III (0°): 180 - 45 + 0 = 135°', () => {
    expectClose(phase23AngleDeg(1, 0), 135, { abs: 1e-12 });
  });
  it('SnII = √3 /L (60°), SnIII = 1/√3 /L (30°): 180 - 60 + 30 = 150°', () => {
    expectClose(phase23AngleDeg(Math.sqrt(3), 1 / Math.sqrt(3)), 150, { abs: 1e-12 });
  });
  it('one straight line (SnII = SnIII) gives 180°; a vertical phase II and a flat phase III give 90°', () => {
    expectClose(phase23AngleDeg(0.3, 0.3), 180, { abs: 1e-12 });
    expectClose(phase23AngleDeg(Infinity, 0), 90, { abs: 1e-12 });
  });
  // atan(9.6649) = 90° - atan(1/9.6649) = 90° - atan(0.103467); atan x = x - x^3/3 + x^5/5 = 0.103100 rad = 5.9072°,
  // so 84.0928°; atan(0.26847) = 0.26847 - 0.0064503 + 0.0002789 - 0.0000144 + 0.0000008 = 0.262285 rad = 15.0279°;
  // 180 - 84.0928 + 15.0279 = 110.935°
  it('curve B: 180 - atan(9.6649) + atan(0.26847) = 110.935°', () => {
    expectClose(phase23AngleDeg(SII_B / PAECO2_B, SIII_B / PAECO2_B), 110.935, { abs: 2e-3 });
  });
  it('a steeper phase III widens the angle', () => {
    expect(phase23AngleDeg(10, 0.5)).toBeGreaterThan(phase23AngleDeg(10, 0.2));
  });
});

describe('VAE/VT with the start of VAE given [derived here]', () => {
  // curve B: the 95 % level of the phase III line is reached on the phase II ramp at 0.36 (V - 100) = 0.95 (34 + 0.01 V),
  // V = 68.3 / 0.3505 = 194.86 mL; VAE/VT = (500 - 194.86) / 500 = 0.61027
  it('curve B, start at 194.86 mL: (500 - 194.86) / 500 = 0.61027; start 195 mL gives 0.61', () => {
    expectClose(alveolarEjectionFraction(500, 68.3 / 0.3505), 0.61027, { abs: 5e-6 });
    expectClose(alveolarEjectionFraction(500, 195), 0.61, { rel: 1e-15 });
  });
  it('NaN for no tidal volume or a start outside the breath', () => {
    expect(alveolarEjectionFraction(0, 0)).toBeNaN();
    expect(alveolarEjectionFraction(500, 501)).toBeNaN();
    expect(alveolarEjectionFraction(500, -1)).toBeNaN();
    expect(alveolarEjectionFraction(500, NaN)).toBeNaN();
    expect(alveolarEjectionFraction(500, 500)).toBe(0);
  });
});
