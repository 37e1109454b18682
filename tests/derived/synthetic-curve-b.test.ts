// Synthetic curve B (sloped plateau), physiology parts: Bohr/Enghoff, the Bohr-PĀECO2 identity, Fletcher's areas
// (Fletcher R, Jonson B, Cumming G, Brew J 1981, "The concept of deadspace with special reference to the single
// breath test for carbon dioxide", Br J Anaesth 53:77-88), gradient and AVDSF. Inputs are the curve's analytic values
// (area 13050 mmHg mL, VT 500 mL, Fowler VDaw 149.648 mL, PETCO2 39.0, PaCO2 40, L(350) = 37.50; derivation in
// docs/methods.md "Derivations"); the curve integration and the Fowler construction belong to the capnogram tests.
// Not outside checks: every expected value is worked by hand (derived here).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import {
  avdsf,
  bohrDeadSpaceFraction,
  enghoffDeadSpaceFraction,
  fletcherAreas,
  meanAlveolarExpiredPco2,
  mixedExpiredPco2,
} from '../../src/physiology/index';

const AREA = 13050;
const VT = 500;
const VDAW = 149.648;
const PACO2 = 40;
const PETCO2 = 39.0;

// derived here: analytic synthetic curve (docs/methods.md "Derivations")
const TAG = '[derived here: synthetic curve B]';

describe('synthetic curve B', () => {
  it(`PECO2 = 26.10; PAECO2 = 37.248 ${TAG}`, () => {
    expectClose(mixedExpiredPco2(AREA, VT), 26.1);
    expectClose(meanAlveolarExpiredPco2(AREA, VT, VDAW), 37.248);
  });

  it(`Bohr with PACO2 = L(350) = 37.50 -> 0.3040 (152.0 mL) ${TAG}`, () => {
    const f = bohrDeadSpaceFraction(37.5, mixedExpiredPco2(AREA, VT));
    expectClose(f, 0.304);
    expectClose(f * VT, 152.0);
  });

  // derived here (algebra, docs/methods.md): Bohr with PĀECO2 from the same VDaw returns VDaw exactly
  it(`Bohr with PAECO2 -> VD = 149.648 mL = VDaw (identity) ${TAG}`, () => {
    const paeco2 = meanAlveolarExpiredPco2(AREA, VT, VDAW);
    expectClose(bohrDeadSpaceFraction(paeco2, mixedExpiredPco2(AREA, VT)) * VT, 149.648);
    expectClose(bohrDeadSpaceFraction(paeco2, mixedExpiredPco2(AREA, VT)) * VT, VDAW, { rel: 1e-12 });
  });

  it(`Enghoff VD/VT = 0.3475 (173.75 mL); VDalv(Enghoff) = 24.10 mL ${TAG}`, () => {
    const f = enghoffDeadSpaceFraction(PACO2, mixedExpiredPco2(AREA, VT));
    expectClose(f, 0.3475);
    expectClose(f * VT, 173.75);
    expectClose(f * VT - VDAW, 24.1);
  });

  it(`Fletcher X / Y / Z = 13050 / 964.09 / 5985.91 (sum 20000); efficiency 0.6525; VDalv/VTalv 0.06879 ${TAG}`, () => {
    const a = fletcherAreas({ paco2Mmhg: PACO2, vtMl: VT, vdAwMl: VDAW, areaMmhgMl: AREA });
    expectClose(a.x_mmhg_ml, 13050);
    expectClose(a.y_mmhg_ml, 964.09);
    expectClose(a.z_mmhg_ml, 5985.91);
    expectClose(a.x_mmhg_ml + a.y_mmhg_ml + a.z_mmhg_ml, 20000);
    expectClose(a.total_mmhg_ml, 20000);
    expectClose(a.efficiency, 0.6525);
    expectClose(a.vdalv_vtalv, 0.06879);
    // Fletcher et al. 1981: VDphys/VT from the areas equals Enghoff (0.3475), efficiency = 1 - Enghoff
    expectClose(a.vdphys_fraction, 0.3475);
    expectClose(a.vdaw_fraction, VDAW / VT);
  });

  it(`P(a-ET)CO2 = 1.0 mmHg; AVDSF = 0.025 ${TAG}`, () => {
    expectClose(PACO2 - PETCO2, 1.0);
    expectClose(avdsf(PACO2, PETCO2), 0.025);
  });
});

describe('AVDSF', () => {
  // derived here: (40 - 35)/40. Formula (PaCO2 - PETCO2)/PaCO2 as used by Yehya N et al. 2016, "Alveolar dead space
  // fraction discriminates mortality in pediatric acute respiratory distress syndrome", Pediatr Crit Care Med 17:101-109.
  it('PaCO2 40, PETCO2 35 -> 0.125 [derived here: 5/40]', () => {
    expectClose(avdsf(40, 35), 0.125);
  });
});
