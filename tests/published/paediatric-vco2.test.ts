// Expected CO2 elimination in children (primer W25).
// Lindahl SGE. "Oxygen consumption and carbon dioxide elimination in infants and children during anaesthesia and
// surgery". Br J Anaesth 1989;62:70-76.
// Smallwood CD, Walsh BK, Bechard LJ, Mehta NM. "Carbon dioxide elimination and oxygen consumption in mechanically
// ventilated children". Respir Care [year from memory].
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { expectedVco2Lindahl, expectedVco2SmallwoodPerKg } from '../../src/physiology/index.js';

describe('paediatric V\'CO2 expectations', () => {
  // published: Lindahl 1989 Br J Anaesth 62:70-76, abstract (primer W25)
  it('W25 Lindahl: 10 kg -> 54.4 mL/min [published: Lindahl 1989 Br J Anaesth 62:70-76, abstract]', () => {
    expectClose(expectedVco2Lindahl(10), 54.4);
  });

  // published: Smallwood et al., Respir Care, abstract; numbers are ours (primer W25)
  it('W25 Smallwood: 100 cm -> 4.37, 170 cm -> 3.00 mL/kg/min [published: Smallwood et al., Respir Care, abstract; numbers are ours]', () => {
    expectClose(expectedVco2SmallwoodPerKg(100), 4.37);
    expectClose(expectedVco2SmallwoodPerKg(170), 3.0);
  });
});
