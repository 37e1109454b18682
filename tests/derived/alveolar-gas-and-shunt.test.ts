// Alveolar gas equation and venous admixture (shunt equation from oxygen contents). Equations: common practice, no
// source. Not outside checks: the expected values are the equations worked by hand (derived here).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import {
  alveolarGasPao2,
  oxygenContent,
  shuntFractionFromContents,
  shuntFractionFromSaturations,
} from '../../src/physiology/index';

describe('alveolar gas equation', () => {
  // derived here: full PAO2 = FiO2 (PB - 47) - PaCO2 (FiO2 + (1 - FiO2)/R) = 0.4 x 713 - 40 x (0.4 + 0.75) = 239.2;
  // simplified PAO2 = FiO2 (PB - 47) - PaCO2/R = 285.2 - 50 = 235.2
  it('FiO2 0.4, PB 760, PaCO2 40, R 0.8 -> 239.2 (full), 235.2 (simplified) [derived here]', () => {
    expectClose(alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8 }), 239.2);
    expectClose(alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8, form: 'full' }), 239.2);
    expectClose(alveolarGasPao2({ fio2: 0.4, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8, form: 'simplified' }), 235.2);
  });

  // derived here: 713 - 40 x 1 = 673.0; 713 - 50 = 663.0
  it('FiO2 1.0, same others -> 673.0 (full), 663.0 (simplified) [derived here]', () => {
    expectClose(alveolarGasPao2({ fio2: 1, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8 }), 673.0);
    expectClose(alveolarGasPao2({ fio2: 1, pbMmhg: 760, paco2Mmhg: 40, rq: 0.8, form: 'simplified' }), 663.0);
  });
});

describe('shunt fraction', () => {
  // derived here: C = 1.34 Hb S + 0.003 PO2: Cc' = 20.1 + 2.019 = 22.119, Ca = 20.1 + 0.6 = 20.700,
  // Cv = 15.075 + 0.12 = 15.195; Qs/Qt = (Cc' - Ca)/(Cc' - Cv) = 1.419/6.924 = 0.2049
  it("Hb 15, FiO2 1.0, PAO2 673, Sc'O2 1.0; PaO2 200, SaO2 1.0; PvO2 40, SvO2 0.75 -> 22.119 / 20.700 / 15.195 -> 0.2049 [derived here]", () => {
    const cc = oxygenContent(15, 1.0, 673);
    const ca = oxygenContent(15, 1.0, 200);
    const cv = oxygenContent(15, 0.75, 40);
    expectClose(cc, 22.119);
    expectClose(ca, 20.7);
    expectClose(cv, 15.195);
    expectClose(shuntFractionFromContents(cc, ca, cv), 0.2049);
  });

  // derived here: (1.00 - 0.90)/(1.00 - 0.70) = 0.1/0.3
  it("Sc'O2 1.00, SaO2 0.90, SvO2 0.70 -> 0.3333 [derived here: 0.1/0.3]", () => {
    expectClose(shuntFractionFromSaturations(1.0, 0.9, 0.7), 0.3333);
  });
});
