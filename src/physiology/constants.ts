// Unit factors and gas-condition constants of the analysis, each defined once here. (The simulator keeps its own
// copies in src/simulate/constants.ts on purpose: it is the independent truth the analysis is checked against.)
import { unit } from 'mathjs';

/**
 * mmHg per kPa, computed once with mathjs units. mathjs defines 1 mmHg = 133.322 Pa, so this is 7.500638; the SI
 * value (1 mmHg = 133.322387415 Pa) gives 7.500617, a relative difference of 2.9e-6, far below clinical resolution.
 * Source: common practice, no source (SI definitions).
 */
export const MMHG_PER_KPA: number = unit(1, 'kPa').toNumber('mmHg');

/** hPa per mmHg, as in MMHG_PER_KPA (1 mmHg = 133.322 Pa). Source: common practice, no source (SI definitions). */
export const HPA_PER_MMHG = 1.33322;

/** Conventional water vapour pressure of saturated gas at 37 C, mmHg. Source: common practice, no source. */
export const PH2O_37C_MMHG = 47;

/** 0 deg C in kelvin. Source: common practice, no source (SI definitions). */
export const ZERO_C_K = 273.15;

/** Standard pressure of STPD volumes, mmHg. Source: common practice, no source. */
export const STANDARD_PRESSURE_MMHG = 760;
