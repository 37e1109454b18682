// The PaCO2-dependent breath columns: Enghoff and Fletcher's areas. Fletcher R, Jonson B, Cumming G, Brew J 1981,
// Br J Anaesth 53:77-88: X = the expirogram's area, Z = PaCO2 × airway dead space, Y = PaCO2 × VT − X − Z, and
// X/(X + Y + Z) = PĒCO2/PaCO2 = 1 − Enghoff VD/VT (no inspired CO2). Values below worked out by hand.
import { describe, expect, it } from 'vitest';
import { setArterialColumns } from '../../src/analyse/arterial-columns';
import { expectClose } from '../helpers/expect-close';
import { makeBreath } from '../gas/make-breath';

describe('setArterialColumns', () => {
  // VT 500 mL, PĒCO2 26.1 mmHg (X = 13 050 mmHg·mL), airway dead space 149.648 mL, PaCO2 40 mmHg:
  // Z = 40 × 149.648 = 5 985.92; X + Y + Z = 40 × 500 = 20 000; Y = 20 000 − 13 050 − 5 985.92 = 964.08;
  // efficiency = 13 050 / 20 000 = 0.6525 = 1 − Enghoff (40 − 26.1)/40 = 1 − 0.3475.
  it('gives X, Y, Z and the efficiency of a breath', () => {
    const row = makeBreath({ t_start_s: 0, vt_exp_ml: 500, peco2_mmhg: 26.1, vd_aw_ml: 149.648, paeco2_mmhg: 37 });
    setArterialColumns(row, 40, 0, 0);
    expectClose(row.fletcher_x_mmhg_ml, 13050, { abs: 1e-9 });
    expectClose(row.fletcher_z_mmhg_ml, 5985.92, { abs: 1e-9 });
    expectClose(row.fletcher_y_mmhg_ml, 964.08, { abs: 1e-9 });
    expectClose(row.co2_efficiency, 0.6525, { abs: 1e-12 });
    expectClose(row.vdvt_enghoff, 0.3475, { abs: 1e-12 });
    expectClose(1 - row.co2_efficiency, row.vdvt_enghoff, { abs: 1e-12 });
  });

  it('measures the areas at the sensor: an apparatus volume goes into Z, not Y', () => {
    const row = makeBreath({ t_start_s: 0, vt_exp_ml: 500, peco2_mmhg: 26.1, vd_aw_ml: 129.648, paeco2_mmhg: 37 });
    setArterialColumns(row, 40, 0, 20);
    expectClose(row.fletcher_z_mmhg_ml, 5985.92, { abs: 1e-9 });
    expectClose(row.fletcher_y_mmhg_ml, 964.08, { abs: 1e-9 });
    // Enghoff for the patient: (0.3475 × 500 − 20) / 500 = 0.3075
    expectClose(row.vdvt_enghoff, 0.3075, { abs: 1e-12 });
  });

  it('no airway dead space: X and the efficiency still, Y and Z empty', () => {
    const row = makeBreath({ t_start_s: 0, vt_exp_ml: 500, peco2_mmhg: 26.1, vd_aw_ml: NaN });
    setArterialColumns(row, 40, 0, 0);
    expectClose(row.co2_efficiency, 0.6525, { abs: 1e-12 });
    expect(row.fletcher_y_mmhg_ml).toBeNaN();
    expect(row.fletcher_z_mmhg_ml).toBeNaN();
  });
});
