// Expected CO2 elimination in children, formulas as the code states them: V'CO2 = 4.8 kg + 6.4 mL/min, attributed to
// Lindahl SGE 1989, "Oxygen consumption and carbon dioxide elimination in infants and children during anaesthesia
// and surgery", Br J Anaesth 62:70-76; V'CO2 = 115 height_cm^-0.71 mL/kg/min, attributed to Smallwood CD, Walsh BK,
// Bechard LJ, Mehta NM, "Carbon dioxide elimination and oxygen consumption in mechanically ventilated children",
// Respir Care (year not verified). Not outside checks: the expected values are the formulas worked by hand.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { expectedVco2Lindahl, expectedVco2SmallwoodPerKg } from '../../src/physiology/index.js';

describe('paediatric V\'CO2 expectations', () => {
  // derived here: 4.8 x 10 + 6.4 = 54.4
  it('Lindahl: 10 kg -> 54.4 mL/min [derived here]', () => {
    expectClose(expectedVco2Lindahl(10), 54.4);
  });

  // derived here: 115 x 100^-0.71 = 115 x 0.03802 = 4.37; 115 x 170^-0.71 = 115 x 0.02608 = 3.00
  it('Smallwood: 100 cm -> 4.37, 170 cm -> 3.00 mL/kg/min [derived here]', () => {
    expectClose(expectedVco2SmallwoodPerKg(100), 4.37);
    expectClose(expectedVco2SmallwoodPerKg(170), 3.0);
  });
});
