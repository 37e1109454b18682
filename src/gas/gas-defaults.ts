import { DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG } from '../physiology/shunt-co2-effect.js';
import {
  DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
  DEFAULT_HB_O2_CAPACITY_ML_PER_G,
} from '../physiology/oxygen-content.js';

/**
 * Defaults of the blood-gas analysis, each with where it comes from (primer tags). The result's settings record
 * every value used and, for these, their source.
 */
export const GAS_DEFAULTS = {
  window_s: { value: 60, source: 'issue 4 default' },
  rq: { value: 0.8, source: 'from memory: alveolar gas equation, standard texts (R typically 0.8)' },
  hb_o2_capacity_ml_per_g: {
    value: DEFAULT_HB_O2_CAPACITY_ML_PER_G,
    source: 'published: public clinical calculators state the constant ranges 1.34-1.39 and use 0.0031; the choice is a setting',
  },
  o2_dissolved_ml_per_dl_per_mmhg: {
    value: DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
    source: 'published: public clinical calculators state the constant ranges 1.34-1.39 and use 0.0031; the choice is a setting',
  },
  end_capillary_saturation: { value: 'one' as 'one' | 'odc', source: "primer 10.3: assume Sc'O2 1.0 when PAO2 is high" },
  alveolar_gas_form: { value: 'full' as 'full' | 'simplified', source: 'from memory: alveolar gas equation, standard texts' },
  default_pv_a_co2_mmhg: {
    value: 6,
    source: 'from memory: textbooks (normal venous-arterial PCO2 difference about 6 mmHg, normally below about 1 kPa)',
  },
  co2_slope_k: {
    value: DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG,
    source: 'from memory: West, Respiratory Physiology (48 vs 52 mL/dL at 40 vs 46 mmHg)',
  },
  gradient_change_mmhg: { value: 5, source: 'issue 4 default' },
  single_gas_spread_mmhg: {
    value: 5,
    source: 'our choice, no source: equal to the default gradient-change threshold',
  },
} as const;
