import { DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG } from '../physiology/shunt-co2-effect';
import {
  DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
  DEFAULT_HB_O2_CAPACITY_ML_PER_G,
} from '../physiology/oxygen-content';

/**
 * Defaults of the blood-gas analysis, each with where it comes from. The result's settings record
 * every value used and, for these, their source.
 */
export const GAS_DEFAULTS = {
  window_s: { value: 60, source: 'our choice, no source' },
  rq: { value: 0.8, source: 'common practice, no source: respiratory quotient 0.8 in the alveolar gas equation' },
  hb_o2_capacity_ml_per_g: {
    value: DEFAULT_HB_O2_CAPACITY_ML_PER_G,
    source: 'common practice, no source: values from 1.34 to 1.39 mL O2 per g Hb are in use; the choice is a setting',
  },
  o2_dissolved_ml_per_dl_per_mmhg: {
    value: DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
    source: 'common practice, no source: 0.003 and 0.0031 mL/dL/mmHg are in use; the choice is a setting',
  },
  end_capillary_saturation: {
    value: 'odc' as 'one' | 'odc',
    source:
      "Severinghaus JW 1979, J Appl Physiol 46:599-602: Sc'O2 from the O2 dissociation curve at PAO2 (end-capillary blood in " +
      "equilibrium with alveolar gas); 'one' takes 1.0, which overstates venous admixture on room air",
  },
  alveolar_gas_form: { value: 'full' as 'full' | 'simplified', source: 'Riley RL, Cournand A 1949, J Appl Physiol 1:825-847 (alveolar gas equation)' },
  default_pv_a_co2_mmhg: {
    value: 6,
    source: 'common practice, no source: normal venous-arterial PCO2 difference about 6 mmHg, normally below about 1 kPa',
  },
  co2_slope_k: {
    value: DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG,
    source: 'derived here: (52 - 48) mL/dL / (46 - 40) mmHg, typical arterial and mixed venous CO2 contents (common practice, no source)',
  },
  gradient_change_mmhg: { value: 5, source: 'our choice, no source' },
  band_level: { value: 0.8, source: 'our choice, no source: the share of breaths whose true PaCO2 the band is meant to hold' },
  analyser_sd_mmhg: {
    value: 1.02,
    source:
      'Kampelmacher MJ, van Kesteren RG, Winckers EK 1997, Eur Respir J 10:1341-1344: SD of a random PCO2 measurement on a random blood-gas analyser',
  },
  split_alveolar: {
    value: 'paeco2' as 'paeco2' | 'alv_co2' | 'petco2',
    source:
      'Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88: mean alveolar expired PCO2 as the alveolar gas; ' +
      "PaCO2 - PĀECO2 = shunt part (PaCO2 - Pc'CO2) + rest (Pc'CO2 - PĀECO2), derived here; 'alv_co2' uses the phase III midpoint, 'petco2' the end-tidal value",
  },
  paco2_temperature: {
    value: 'corrected' as 'corrected' | 'measured',
    source:
      'Nunn JF, Bergman NA, Bunatyan A, Coleman AJ 1965, J Appl Physiol 20:23-26: PCO2(T) = PCO2(37) x 10^(0.019 (T - 37)); ' +
      "corrected by default because end-tidal gas equilibrates with blood at the patient's temperature (derived here); used only when temp_c is given",
  },
  drift_prior_mmhg2_per_h: {
    value: 4,
    source: 'our choice, no source: the gradient drifts by about 2 mmHg (SD) per hour until the gases show their own drift',
  },
} as const;
