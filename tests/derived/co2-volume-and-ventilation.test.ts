// CO2 volume per breath, mixed expired PCO2 and the alveolar ventilation equation, on synthetic curve A (flat
// plateau: 40 mmHg from 150 mL to 500 mL, area 14000 mmHg mL; docs/methods.md "Derivations"). Not outside checks:
// the expected values are worked by hand (derived here); the area integration itself belongs to the capnogram tests.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import {
  alveolarVentilationPaco2,
  bohrDeadSpaceFraction,
  btpsToStpdFactor,
  mixedExpiredPco2,
  vtco2FromArea,
} from '../../src/physiology/index.js';

describe('synthetic curve A (flat plateau), physiology parts', () => {
  const area = 14000; // mmHg mL: 40 mmHg x (500 - 150) mL (derived here)
  const vt = 500;

  // derived here: 14000 / 500 = 28.00; (40 - 28) / 40 = 0.300; x 500 = 150 mL
  it('PECO2 = 28.00; Bohr with PACO2 40 -> 0.300 (VD 150 mL) [derived here: synthetic curve A]', () => {
    const peco2 = mixedExpiredPco2(area, vt);
    expectClose(peco2, 28.0);
    expectClose(bohrDeadSpaceFraction(40, peco2), 0.3);
    expectClose(bohrDeadSpaceFraction(40, peco2) * vt, 150.0);
  });

  // derived here (ideal gas law): 14000 x 273.15 / (310.15 x 760) = 16.22 mL STPD; 14000 / 713 = 19.64; x 12 = 194.7
  it('VTCO2 = 16.22 mL STPD; 19.64 mL as dry fraction x BTPS volume; V\'CO2 at 12/min = 194.7 mL/min [derived here: synthetic curve A]', () => {
    const vtco2 = vtco2FromArea(area);
    expectClose(vtco2, 16.22);
    const dryFractionTimesBtpsVolume = area / (760 - 47); // F_dry = P/(PB - PH2O), times BTPS volume
    expectClose(dryFractionTimesBtpsVolume, 19.64);
    // equivalent route: the BTPS CO2 volume times the BTPS -> STPD factor gives the same STPD value
    expectClose(dryFractionTimesBtpsVolume * btpsToStpdFactor(760), vtco2, { rel: 1e-6 });
    expectClose(vtco2 * 12, 194.7);
  });

  // derived here: 273.15 / (310.15 x 760) = 1.1588e-3
  it('1.1588e-3 mL STPD per mmHg mL at 37 C [derived here: ideal gas law]', () => {
    expectClose(vtco2FromArea(1), 1.1588e-3);
  });
});

describe('alveolar ventilation equation', () => {
  // derived here: 0.863 x 200 / 4.3 = 40.14 (the constant 0.863: common practice, no source; derivation below)
  it('V\'CO2 200 mL/min, V\'A 4.3 L/min -> PACO2 40.14 mmHg [derived here]', () => {
    expectClose(alveolarVentilationPaco2(200, 4.3), 40.14);
  });

  // derived here: 0.863 = 713 * (760/713) * (310.15/273.15) / 1000 (STPD mL/min and BTPS L/min; docs/methods.md)
  it('the constant equals its derivation 760 * 310.15/273.15 / 1000 [derived here]', () => {
    expectClose(alveolarVentilationPaco2(1, 1), (760 * (310.15 / 273.15)) / 1000, { abs: 5e-4 });
  });
});
