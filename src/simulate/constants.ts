import { unit } from 'mathjs';

/**
 * Physical constants of the simulator, each computed once. The simulator keeps its own copies of these values on
 * purpose and does not import src/physiology/constants.ts: it is the independent truth the analysis is checked
 * against, so a wrong constant in the analysis must not silently move the truth with it.
 *
 * MMHG_PER_KPA: from mathjs units (mathjs defines 1 mmHg = 133.322 Pa exactly, so 7.500638 mmHg/kPa; the standard
 * factor 7.50062 differs by 2.9e-6 relative) [NIST SP 811 (2008), Appendix B: 1 mmHg = 133.3224 Pa]. The analyser
 * converts with the same mathjs factor, so CSV round trips are exact up to printed digits.
 */
export const MMHG_PER_KPA: number = unit(1, 'kPa').toNumber('mmHg');

/** Body temperature, K (37 C). */
export const BODY_TEMP_K = 310.15;

/**
 * CO2 volume (mL STPD) per mmHg x mL of gas at BTPS: (273.15 / 310.15) / 760 = 1.15881e-3.
 * VTCO2_STPD = STPD_ML_PER_MMHG_ML * integral P dV_BTPS [derived here: ideal gas law, docs/methods.md].
 */
export const STPD_ML_PER_MMHG_ML = 273.15 / BODY_TEMP_K / 760;

/**
 * Alveolar ventilation constant, mmHg x (L/min BTPS) per (mL/min STPD): PACO2 = K * V'CO2 / V'A.
 * K = 1 / (1000 * STPD_ML_PER_MMHG_ML) = 0.86296, i.e. the usual 0.863 unrounded (derived here, docs/methods.md), so that the
 * simulator's gas exchange and its per-breath VTCO2 obey exactly the same mass balance.
 */
export const ALV_VENT_CONSTANT = 1 / (1000 * STPD_ML_PER_MMHG_ML);

/** Water vapour pressure at 37 C, mmHg, for the 'dry' % convention [common practice, no source]. */
export const PH2O_BODY_MMHG = 47;
