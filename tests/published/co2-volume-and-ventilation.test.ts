// CO2 volume per breath, mixed expired PCO2 and the alveolar ventilation equation (primer 5.1, 5.2, 7.3;
// checks W8 and the physiology parts of W19). The synthetic curve's area (14000 mmHg mL) is the primer's analytic
// value; the area integration itself belongs to the capnogram tests.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import {
  alveolarVentilationPaco2,
  bohrDeadSpaceFraction,
  btpsToStpdFactor,
  mixedExpiredPco2,
  vtco2FromArea,
} from '../../src/physiology/index.js';

describe('W19 synthetic curve A (flat plateau), physiology parts', () => {
  const area = 14000; // mmHg mL, primer W19 (analytic)
  const vt = 500;

  // common practice, no source: analytic synthetic curve; verified by script (primer W19)
  it('PECO2 = 28.00; Bohr with PACO2 40 -> 0.300 (VD 150 mL) [common practice, no source: analytic synthetic curve; verified by script]', () => {
    const peco2 = mixedExpiredPco2(area, vt);
    expectClose(peco2, 28.0);
    expectClose(bohrDeadSpaceFraction(40, peco2), 0.3);
    expectClose(bohrDeadSpaceFraction(40, peco2) * vt, 150.0);
  });

  // common practice, no source: ideal-gas derivation; checked numerically in §11 (primer 5.1, W19)
  it('VTCO2 = 16.22 mL STPD; 19.64 mL as dry fraction x BTPS volume; V\'CO2 at 12/min = 194.7 mL/min [common practice, no source: analytic synthetic curve; verified by script]', () => {
    const vtco2 = vtco2FromArea(area);
    expectClose(vtco2, 16.22);
    const dryFractionTimesBtpsVolume = area / (760 - 47); // F_dry = P/(PB - PH2O), times BTPS volume
    expectClose(dryFractionTimesBtpsVolume, 19.64);
    // equivalent route of primer 5.1: the BTPS CO2 volume times the BTPS -> STPD factor gives the same STPD value
    expectClose(dryFractionTimesBtpsVolume * btpsToStpdFactor(760), vtco2, { rel: 1e-6 });
    expectClose(vtco2 * 12, 194.7);
  });

  it('1.1588e-3 mL STPD per mmHg mL at 37 C [common practice, no source: ideal-gas derivation]', () => {
    expectClose(vtco2FromArea(1), 1.1588e-3);
  });
});

describe('alveolar ventilation equation', () => {
  // common practice, no source; constant per §7.3 (primer W8). The 0.863 constant: published: it appears in public
  // physiology teaching notes.
  it('W8: V\'CO2 200 mL/min, V\'A 4.3 L/min -> PACO2 40.14 mmHg [common practice, no source; constant per §7.3]', () => {
    expectClose(alveolarVentilationPaco2(200, 4.3), 40.14);
  });

  // common practice, no source: derivation of 0.863 = 713 * (760/713) * (310.15/273.15) / 1000 (primer 7.3)
  it('the constant equals its derivation 760 * 310.15/273.15 / 1000 [common practice, no source]', () => {
    expectClose(alveolarVentilationPaco2(1, 1), (760 * (310.15 / 273.15)) / 1000, { abs: 5e-4 });
  });
});
