// Niklason L, Eckerström J, Jonson B. "The influence of venous admixture on alveolar dead space and carbon dioxide
// exchange in acute respiratory distress syndrome: computer modelling". Crit Care 2008;12:R53 (abstract).
// Plausibility of the linear shunt-effect approximation (Fick route, docs/methods.md "Derivations"): shunt-induced
// VDalv/VTalv taken as (PaCO2 - Pc'CO2)/PaCO2 with V'CO2 200 mL/min, k 0.67, PaCO2 40 (our choices). The hand
// arithmetic of the approximation is in tests/derived/shunt-dead-space-arithmetic.test.ts.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { shuntDeadSpaceFraction } from '../helpers/shunt-dead-space';


describe('shunt-induced alveolar dead-space fraction vs Niklason 2008', () => {
  // published targets: Niklason et al. 2008 Crit Care, abstract; tolerance +/-0.02 (ours)
  it('Qs/Qt 0.4, Q\' 5 L/min -> 0.11 within 0.02 [published targets: Niklason et al. 2008 Crit Care, abstract]', () => {
    expectClose(shuntDeadSpaceFraction(0.4, 5), 0.11, { abs: 0.02 });
  });
  it('Qs/Qt 0.4, Q\' 3 L/min -> 0.16 within 0.02 [published targets: Niklason et al. 2008 Crit Care, abstract]', () => {
    expectClose(shuntDeadSpaceFraction(0.4, 3), 0.16, { abs: 0.02 });
  });
  // "basal conditions" taken as Q' 5 L/min (our reading of the abstract)
  it('Qs/Qt 0.6, basal (Q\' 5 L/min) -> 0.21 within 0.02 [published targets: Niklason et al. 2008 Crit Care, abstract]', () => {
    expectClose(shuntDeadSpaceFraction(0.6, 5), 0.21, { abs: 0.02 });
  });
});
