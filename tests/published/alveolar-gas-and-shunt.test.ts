// Alveolar gas equation and venous admixture (Berggren shunt equation) (primer 10.3; checks W11, W12, W13).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import {
  alveolarGasPao2,
  oxygenContent,
  shuntFractionFromContents,
  shuntFractionFromSaturations,
} from '../../src/physiology/index.js';

describe('alveolar gas equation', () => {
  // common practice, no source (primer W11). Equation: from memory: alveolar gas equation, standard texts.
  it('W11: FiO2 0.4, PB 760, PaCO2 40, R 0.8 -> 239.2 (full), 235.2 (simplified) [common practice, no source]', () => {
    expectClose(alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8 }), 239.2);
    expectClose(alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8, form: 'full' }), 239.2);
    expectClose(alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8, form: 'simplified' }), 235.2);
  });

  it('W11: FiO2 1.0, same others -> 673.0 (full), 663.0 (simplified) [common practice, no source]', () => {
    expectClose(alveolarGasPao2({ fio2: 1, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8 }), 673.0);
    expectClose(alveolarGasPao2({ fio2: 1, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8, form: 'simplified' }), 663.0);
  });
});

describe('shunt fraction', () => {
  // common practice, no source (primer W12). Equation: from memory: Berggren SM 1942 "The oxygen deficit of
  // arterial blood caused by non-ventilating parts of the lung", Acta Physiol Scand Suppl 11.
  it("W12: Hb 15, FiO2 1.0, PAO2 673, Sc'O2 1.0; PaO2 200, SaO2 1.0; PvO2 40, SvO2 0.75 -> 22.119 / 20.700 / 15.195 -> 0.2049 [common practice, no source]", () => {
    const cc = oxygenContent(15, 1.0, 673);
    const ca = oxygenContent(15, 1.0, 200);
    const cv = oxygenContent(15, 0.75, 40);
    expectClose(cc, 22.119);
    expectClose(ca, 20.7);
    expectClose(cv, 15.195);
    expectClose(shuntFractionFromContents(cc, ca, cv), 0.2049);
  });

  // common practice, no source (primer W13)
  it("W13: Sc'O2 1.00, SaO2 0.90, SvO2 0.70 -> 0.3333 [common practice, no source]", () => {
    expectClose(shuntFractionFromSaturations(1.0, 0.9, 0.7), 0.3333);
  });
});
