import { DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG } from '../physiology/shunt-co2-effect.js';
import {
  DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
  DEFAULT_HB_O2_CAPACITY_ML_PER_G,
} from '../physiology/oxygen-content.js';

/**
 * Defaults of the blood-gas analysis, each with where it comes from (a published source, or common practice / our choice). The result's settings record
 * every value used and, for these, their source.
 */
export const GAS_DEFAULTS = {
  window_s: { value: 60, source: 'our choice, no source' },
  rq: { value: 0.8, source: 'common practice, no source (R typically 0.8)' },
  hb_o2_capacity_ml_per_g: {
    value: DEFAULT_HB_O2_CAPACITY_ML_PER_G,
    source: 'published: public clinical calculators state the constant ranges 1.34-1.39 and use 0.0031; the choice is a setting',
  },
  o2_dissolved_ml_per_dl_per_mmhg: {
    value: DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
    source: 'published: public clinical calculators state the constant ranges 1.34-1.39 and use 0.0031; the choice is a setting',
  },
  end_capillary_saturation: { value: 'one' as 'one' | 'odc', source: "common practice, no source (Sc'O2 taken as 1.0 when PAO2 is high)" },
  alveolar_gas_form: { value: 'full' as 'full' | 'simplified', source: 'Riley RL, Cournand A 1949, J Appl Physiol 1:825-847 (alveolar gas equation)' },
  default_pv_a_co2_mmhg: {
    value: 6,
    source: 'common practice, no source (normal venous-arterial PCO2 difference about 6 mmHg, normally below about 1 kPa)',
  },
  co2_slope_k: {
    value: DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG,
    source: 'West JB, Respiratory Physiology: The Essentials, textbook (48 vs 52 mL/dL at 40 vs 46 mmHg)',
  },
  gradient_change_mmhg: { value: 5, source: 'our choice, no source' },
  single_gas_spread_mmhg: {
    value: 5,
    source: 'our choice, no source: equal to the default gradient-change threshold',
  },
} as const;
