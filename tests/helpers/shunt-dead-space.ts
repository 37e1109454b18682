// Alveolar dead-space fraction that a shunt alone produces (Fick route of shuntCo2Effect): the shunt's PaCO2 excess
// over a PaCO2 of 40 mmHg, with V'CO2 200 mL/min and a CO2 dissociation slope of 0.67 mL/dL/mmHg. Shared by the
// derived arithmetic and the comparison with Niklason et al. 2008.
import { shuntCo2Effect } from '../../src/physiology/index';

export const PACO2_MMHG = 40;

export function shuntDeadSpaceFraction(shuntFraction: number, cardiacOutputLPerMin: number): number {
  const gradient = shuntCo2Effect({
    route: 'fick',
    shuntFraction,
    vco2MlPerMin: 200,
    cardiacOutputLPerMin,
    co2SlopeMlPerDlPerMmhg: 0.67,
  });
  return gradient / PACO2_MMHG;
}
