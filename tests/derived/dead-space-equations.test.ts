// Bohr and Enghoff dead-space equations and the shunt-corrected Enghoff form. Equations: Bohr C 1891, "Über die
// Lungenathmung", Skand Arch Physiol 2:236-268; Enghoff H 1938, "Volumen inefficax", Upsala Läkareförenings
// Förhandlingar 44; shunt correction: Kuwabara S, Duncalf D 1969, "Effect of anatomic shunt on physiologic
// deadspace-to-tidal volume ratio - a new equation", Anesthesiology 31. Not outside checks: the expected
// numbers are the equations worked by hand (derived here), not outputs of the code under test.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import {
  bohrDeadSpaceFraction,
  enghoffDeadSpaceFraction,
  endCapillaryPco2,
  shuntCorrectedEnghoff,
} from '../../src/physiology/index';

describe('Bohr / Enghoff dead-space fractions', () => {
  // derived here: (40 - 28) / 40 = 0.300
  it('Bohr: PACO2 40, PECO2 28 -> 0.300 [derived here: 12/40]', () => {
    expectClose(bohrDeadSpaceFraction(40, 28), 0.3);
  });

  // derived here: (45 - 28) / 45 = 0.3778
  it('Enghoff: PaCO2 45, PECO2 28 -> 0.3778 [derived here: 17/45]', () => {
    expectClose(enghoffDeadSpaceFraction(45, 28), 0.3778);
  });

  // derived here: (40 - 28) / (40 - 2) = 12/38 = 0.3158
  it('Bohr with inspired CO2: 40, 28, PICO2 2 -> 0.3158 [derived here: 12/38]', () => {
    expectClose(bohrDeadSpaceFraction(40, 28, 2), 0.3158);
    // the inspired term must matter: without it the value is the plain Bohr 0.300 above
    expectClose(bohrDeadSpaceFraction(40, 28, 0), 0.3);
  });

  it('denominators <= 0 give NaN, not Infinity (our policy)', () => {
    expectClose(bohrDeadSpaceFraction(2, 1, 2), NaN);
    expectClose(enghoffDeadSpaceFraction(0, 28), NaN);
  });
});

describe('shunt-corrected Enghoff', () => {
  // derived here (linear mixing, docs/methods.md "Derivations"): Pc'CO2 = (PaCO2 - s PvCO2)/(1 - s)
  // = (41.2 - 9.4)/0.8 = 39.75; VD/VT = (39.75 - 28)/39.75 = 0.2956; uncorrected (41.2 - 28)/41.2 = 0.3204
  it("PaCO2 41.2, PvCO2 47, s 0.2, PECO2 28 -> Pc'CO2 39.75, VD/VT 0.2956 (uncorrected 0.3204) [derived here]", () => {
    expectClose(endCapillaryPco2(41.2, 47, 0.2), 39.75);
    expectClose(shuntCorrectedEnghoff(41.2, 28, 47, 0.2), 0.2956);
    expectClose(enghoffDeadSpaceFraction(41.2, 28), 0.3204);
  });

  it('with s = 0 the correction vanishes (equals plain Enghoff, numbers above)', () => {
    expectClose(shuntCorrectedEnghoff(45, 28, 50, 0), 0.3778);
  });
});
