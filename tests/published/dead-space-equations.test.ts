// Bohr and Enghoff dead-space equations and the shunt-corrected Enghoff form (primer 6.1, 10.4; checks W1-W3, W16).
// Expected numbers are the primer's worked values (section 11), not outputs of the code under test.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import {
  bohrDeadSpaceFraction,
  enghoffDeadSpaceFraction,
  endCapillaryPco2,
  shuntCorrectedEnghoff,
} from '../../src/physiology/index.js';

describe('Bohr / Enghoff dead-space fractions', () => {
  // common practice, no source: Bohr formula (primer W1). Formula: Bohr C 1891 "Über die Lungenathmung",
  // Skand Arch Physiol [from memory].
  it('W1 Bohr: PACO2 40, PECO2 28 -> 0.300 [common practice, no source: Bohr formula]', () => {
    expectClose(bohrDeadSpaceFraction(40, 28), 0.3);
  });

  // common practice, no source (primer W2). Formula: Enghoff H 1938 "Volumen inefficax" [from memory].
  it('W2 Enghoff: PaCO2 45, PECO2 28 -> 0.3778 [common practice, no source]', () => {
    expectClose(enghoffDeadSpaceFraction(45, 28), 0.3778);
  });

  // common practice, no source (primer W3)
  it('W3 Bohr with inspired CO2: 40, 28, PICO2 2 -> 0.3158 [common practice, no source]', () => {
    expectClose(bohrDeadSpaceFraction(40, 28, 2), 0.3158);
    // the inspired term must matter: without it the value is W1's 0.300
    expectClose(bohrDeadSpaceFraction(40, 28, 0), 0.3);
  });

  it('denominators <= 0 give NaN, not Infinity (our policy)', () => {
    expectClose(bohrDeadSpaceFraction(2, 1, 2), NaN);
    expectClose(enghoffDeadSpaceFraction(0, 28), NaN);
  });
});

describe('shunt-corrected Enghoff', () => {
  // common practice, no source (primer W16). Equation form: from memory: Kuwabara & Duncalf 1969 Anesthesiology
  // "Effect of anatomic shunt on physiologic deadspace-to-tidal volume ratio - a new equation"; derived from linear mixing.
  it("W16: PaCO2 41.2, PvCO2 47, s 0.2, PECO2 28 -> Pc'CO2 39.75, VD/VT 0.2956 (uncorrected 0.3204) [common practice, no source]", () => {
    expectClose(endCapillaryPco2(41.2, 47, 0.2), 39.75);
    expectClose(shuntCorrectedEnghoff(41.2, 28, 47, 0.2), 0.2956);
    expectClose(enghoffDeadSpaceFraction(41.2, 28), 0.3204);
  });

  it('with s = 0 the correction vanishes (equals plain Enghoff, W2 numbers)', () => {
    expectClose(shuntCorrectedEnghoff(45, 28, 50, 0), 0.3778);
  });
});
