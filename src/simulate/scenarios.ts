import { BASE_PARAMS, type SimParams } from './params';
import { validateParams } from './validate-params';

/**
 * Built-in scenarios: invented patients of our own, named after what they show. Values are chosen inside typical
 * ranges (e.g. adult VCO2 ~200 mL/min, infant ~7 mL/kg/min [published: Smallwood et al.], airway
 * dead space ~2.2 mL/kg adults and ~3 mL/kg small children incl. tube [published: Numa & Newth 1996; Goenaga-Diaz
 * et al. 2021], normal venous admixture 4-5 %, P(a-ET)CO2 2-5 mmHg in healthy anaesthetised adults: common practice,
 * no source).
 * Body CO2 store capacity ~ V'CO2 / (3 mmHg/min), from the apnoeic PaCO2 rise of about 3 mmHg/min
 * [Eger EI, Severinghaus JW 1961, "The rate of rise of PaCO2 in the apneic anesthetized patient", Anesthesiology 22].
 * Cardiac output ~ 150-200 mL/kg/min in infants [common practice, no source].
 */
interface Scenario {
  description: string;
  params: Partial<SimParams>;
}

const ADULT: Partial<SimParams> = {}; // BASE_PARAMS is the healthy anaesthetised adult

/**
 * Base of the scenarios with the 'compartments' lung model (lung-compartments.ts): the slope and the alveolar dead
 * space are results of the compartments, so their inputs are 0. Zone-1 rule for a supine adult: lung height 16 cm
 * with the pulmonary artery at mid-height, Pla 8 mmHg, PVR 1.5 mmHg min/L, mean alveolar pressure 8 cmH2O
 * [common practice, no source: typical values], which gives no zone 1 at Q 5 L/min and a growing one below ~2.7 L/min.
 */
const MECH: Partial<SimParams> = {
  lung_model: 'compartments', slope3_mmhg_per_l: 0, alv_dead_space_fraction: 0, zone1_lung_height_cm: 16,
  zone1_pa_level_cm: 8, zone1_pla_mmhg: 8, zone1_pvr_mmhg_min_per_l: 1.5, zone1_palv_cmh2o: 8,
};

/** Scenarios whose conditions arise from their mechanisms ('compartments' lung model; the last one: sample flow). */
const MECHANISM_SCENARIOS: Readonly<Record<string, Scenario>> = {
  'adult-mech-healthy': {
    description:
      'Compartment lung model, healthy adult: three compartments with mildly uneven ventilation, perfusion and time constants, 4 % shunt (reference for the other mechanism scenarios)',
    params: {
      ...MECH, minutes: 3,
      compartments: [
        { vent_share: 0.35, perf_share: 0.3, tau_s: 0.35 },
        { vent_share: 0.45, perf_share: 0.5, tau_s: 0.6 },
        { vent_share: 0.2, perf_share: 0.2, tau_s: 1.2 },
      ],
    },
  },
  'adult-mech-congested': {
    description:
      'Compartment lung model, congested lung: a slow low-V/Q region takes 45 % of the blood with 20 % of the ventilation, a high-V/Q region, 15 % shunt; the phase III slope and the gradient come from these',
    params: {
      ...MECH, weight_kg: 80, mode: 'pressure_control', vt_ml: 480, rr_bpm: 18, ie_ratio: 1.5, pause_fraction: 0, rc_s: 0.6,
      vd_aw_ml: 160, sigma_ml: 16, vco2_ml_min: 230, q_l_min: 4.5, shunt_fraction: 0.15, co2_store_ml_per_mmhg: 77,
      compliance_ml_per_cmh2o: 35, peep_cmh2o: 10, rise_ms: 50, co2_noise_mmhg: 0.15, flow_noise_lps: 0.004,
      compartments: [
        { vent_share: 0.45, perf_share: 0.5, tau_s: 0.4 },
        { vent_share: 0.2, perf_share: 0.45, tau_s: 0.8 },
        { vent_share: 0.35, perf_share: 0.05, tau_s: 0.4 },
      ],
    },
  },
  'infant-mech-cyanotic-shunt': {
    description:
      'Compartment lung model, cyanotic infant (3.5 kg) with a right-to-left shunt of 40 % and low pulmonary blood flow: the gradient is mostly shunt',
    params: {
      ...MECH, weight_kg: 3.5, mode: 'pressure_control', vt_ml: 28, rr_bpm: 40, ie_ratio: 1.5, pause_fraction: 0, rc_s: 0.15,
      flow_edge_ms: 15, vd_aw_ml: 10, sigma_ml: 1.5, alv_mixing_tau_s: 10, vco2_ml_min: 25, q_l_min: 0.6,
      shunt_fraction: 0.4, co2_store_ml_per_mmhg: 8, compliance_ml_per_cmh2o: 3, peep_cmh2o: 5, rise_ms: 40,
      co2_noise_mmhg: 0.1, flow_noise_lps: 0.0004, hr_bpm: 140, zone1_lung_height_cm: 0,
      compartments: [
        { vent_share: 0.6, perf_share: 0.5, tau_s: 0.08 },
        { vent_share: 0.4, perf_share: 0.5, tau_s: 0.2 },
      ],
    },
  },
  'adult-mech-low-output': {
    description:
      'Compartment lung model, adult, 15 min: cardiac output falls from 5.0 to 1.8 L/min at 6 min (30 s ramp); zone 1 (ventilated, unperfused lung) grows from 0 to about 11 %, PETCO2 falls, the gradient widens',
    params: {
      ...MECH, minutes: 15,
      compartments: [
        { vent_share: 0.5, perf_share: 0.55, tau_s: 0.5 },
        { vent_share: 0.5, perf_share: 0.45, tau_s: 0.9 },
      ],
      events: [{ t_s: 360, param: 'q_l_min', to: 1.8, ramp_s: 30, description: 'fall in cardiac output 5.0 -> 1.8 L/min' }],
    },
  },
  'adult-mech-embolism': {
    description:
      'Compartment lung model, adult, 15 min: at 6 min an embolus blocks the blood flow of a region that keeps 30 % of the ventilation (10 s ramp); it empties in parallel with the rest, so Bohr VD/VT does not see it, PETCO2 and the gradient do',
    params: {
      ...MECH, minutes: 15,
      compartments: [
        { vent_share: 0.4, perf_share: 0.42, tau_s: 0.5 },
        { vent_share: 0.3, perf_share: 0.28, tau_s: 0.8 },
        { vent_share: 0.3, perf_share: 0.3, tau_s: 0.6 },
      ],
      embolism_compartment: 3,
      events: [{ t_s: 360, param: 'embolism_fraction', to: 1, ramp_s: 10, description: 'embolus blocks the blood flow of region 3' }],
    },
  },
  'infant-sidestream-sample-flow': {
    description:
      'Infant (3.5 kg) with a sidestream CO2 sensor drawing 150 mL/min between the patient and the flow sensor: the flow sensor misses about 2 mL of each 28 mL expiration',
    params: {
      weight_kg: 3.5, mode: 'pressure_control', vt_ml: 28, rr_bpm: 40, ie_ratio: 1.5, pause_fraction: 0, rc_s: 0.15,
      flow_edge_ms: 15, vd_aw_ml: 10, sigma_ml: 1.5, slope3_mmhg_per_l: 250, alv_dead_space_fraction: 0.05,
      alv_mixing_tau_s: 10, vco2_ml_min: 25, q_l_min: 0.6, shunt_fraction: 0.05, co2_store_ml_per_mmhg: 8,
      compliance_ml_per_cmh2o: 3, peep_cmh2o: 5, sensor: 'sidestream', delay_s: 1.0, rise_ms: 100,
      sample_flow_ml_min: 150, co2_noise_mmhg: 0.1, flow_noise_lps: 0.0004, hr_bpm: 140,
    },
  },
};

const SCENARIOS: Readonly<Record<string, Scenario>> = {
  'adult-healthy': {
    description: 'Healthy adult under anaesthesia, volume control with inspiratory pause, clean mainstream sensor (reference)',
    params: { ...ADULT, minutes: 3 },
  },
  'adult-congested-region': {
    description:
      'Adult with a congested, poorly perfused lung region: high alveolar dead space (30 %), steep phase III, some shunt; pressure control',
    params: {
      weight_kg: 80, mode: 'pressure_control', vt_ml: 480, rr_bpm: 20, ie_ratio: 1.5, pause_fraction: 0, rc_s: 0.6,
      vd_aw_ml: 160, sigma_ml: 16, slope3_mmhg_per_l: 22, alv_dead_space_fraction: 0.3, vco2_ml_min: 230, q_l_min: 4.5,
      shunt_fraction: 0.12, co2_store_ml_per_mmhg: 77, compliance_ml_per_cmh2o: 35, peep_cmh2o: 10, rise_ms: 50,
      co2_noise_mmhg: 0.15, flow_noise_lps: 0.004,
    },
  },
  'infant-cardiac-shunt': {
    description:
      'Infant (3.5 kg) after heart surgery with a right-to-left shunt (35 %) and low pulmonary blood flow: large arterial-end-tidal gradient; small VT, fast rate, pressure control',
    params: {
      weight_kg: 3.5, mode: 'pressure_control', vt_ml: 28, rr_bpm: 40, ie_ratio: 1.5, pause_fraction: 0, rc_s: 0.15,
      flow_edge_ms: 15, vd_aw_ml: 10, sigma_ml: 1.5, slope3_mmhg_per_l: 250, alv_dead_space_fraction: 0.2,
      alv_mixing_tau_s: 10, vco2_ml_min: 25, q_l_min: 0.6, shunt_fraction: 0.35, co2_store_ml_per_mmhg: 8,
      compliance_ml_per_cmh2o: 3, peep_cmh2o: 5, rise_ms: 40, co2_noise_mmhg: 0.1, flow_noise_lps: 0.0004, hr_bpm: 140,
    },
  },
  'child-sidestream': {
    description: 'Child (20 kg) on volume control monitored with a sidestream CO2 sensor: 1.5 s transport delay, 150 ms rise time',
    params: {
      weight_kg: 20, vt_ml: 160, rr_bpm: 22, rc_s: 0.3, flow_edge_ms: 25, vd_aw_ml: 55, sigma_ml: 5,
      slope3_mmhg_per_l: 35, alv_dead_space_fraction: 0.06, alv_mixing_tau_s: 20, vco2_ml_min: 100, q_l_min: 2.8,
      shunt_fraction: 0.05, co2_store_ml_per_mmhg: 33, compliance_ml_per_cmh2o: 15, sensor: 'sidestream', delay_s: 1.5,
      rise_ms: 150, co2_noise_mmhg: 0.15, flow_noise_lps: 0.001, hr_bpm: 100,
    },
  },
  'adult-perfusion-fall': {
    description:
      'Adult, 30 min: pulmonary blood flow falls from 5.0 to 1.5 L/min at 12 min (20 s ramp); VTCO2 and PETCO2 drop while ventilation is unchanged',
    params: {
      ...ADULT, minutes: 30, vt_cv: 0.015, rr_cv: 0.01,
      events: [{ t_s: 720, param: 'q_l_min', to: 1.5, ramp_s: 20, description: 'sudden fall in pulmonary blood flow 5.0 -> 1.5 L/min' }],
    },
  },
  'adult-stable-long': {
    description: 'Adult, 60 min of stable volume-controlled ventilation with mild breath-to-breath variability (no events)',
    params: { ...ADULT, minutes: 60, vt_cv: 0.02, rr_cv: 0.015, co2_noise_mmhg: 0.15 },
  },
  'adult-dead-space-rise': {
    description:
      'Adult, 30 min: alveolar dead space fraction rises from 0.10 to 0.30 over 60 s at 10 min (e.g. a new perfusion defect); ventilation unchanged',
    params: {
      ...ADULT, minutes: 30, vt_cv: 0.015,
      events: [{ t_s: 600, param: 'alv_dead_space_fraction', to: 0.3, ramp_s: 60, description: 'rise in alveolar dead space 0.10 -> 0.30' }],
    },
  },
  'adult-tidal-volume-change': {
    description: 'Adult, 30 min: tidal volume reduced from 500 to 400 mL at 10 min (ventilator setting change)',
    params: {
      ...ADULT, minutes: 30, vt_cv: 0.015,
      events: [{ t_s: 600, param: 'vt_ml', to: 400, ramp_s: 0, description: 'tidal volume step 500 -> 400 mL' }],
    },
  },
  'adult-spontaneous': {
    description: 'Awake adult breathing spontaneously through a mouthpiece: irregular VT and timing, end-expiratory pauses with cardiogenic oscillations',
    params: {
      mode: 'spontaneous', vt_ml: 450, vt_cv: 0.15, rr_bpm: 15, rr_cv: 0.12, ie_ratio: 1.6, pause_fraction: 0,
      vd_aw_ml: 140, sigma_ml: 12, slope3_mmhg_per_l: 10, alv_dead_space_fraction: 0.05, shunt_fraction: 0.03,
      cardio_flow_lps: 0.03, cardio_co2_mmhg: 0.8, hr_bpm: 68, rise_ms: 50, co2_noise_mmhg: 0.15, flow_noise_lps: 0.004,
      peep_cmh2o: 0,
    },
  },
  'adult-rebreathing': {
    description: 'Adult on volume control with an exhausted CO2 absorber: inspired PCO2 4 mmHg (rebreathing)',
    params: { ...ADULT, pi_co2_mmhg: 4 },
  },
  'adult-leak-noisy': {
    description: 'Adult with a cuff leak (12 % of VT lost before the sensor), noisy sensors, a flow offset and cardiogenic oscillations',
    params: {
      ...ADULT, leak_fraction: 0.12, co2_noise_mmhg: 0.5, flow_noise_lps: 0.02, flow_offset_lps: 0.015,
      cardio_flow_lps: 0.04, cardio_co2_mmhg: 0.6, rise_ms: 60,
    },
  },
  ...MECHANISM_SCENARIOS,
};

/** Names and one-line descriptions of the built-in scenarios. */
export function listScenarios(): { name: string; description: string }[] {
  return Object.entries(SCENARIOS).map(([name, s]) => ({ name, description: s.description }));
}

/**
 * Full parameter set of a built-in scenario, with optional overrides, validated.
 * Throws an Error naming the valid scenarios for an unknown name, and the validator's message for bad values.
 */
export function scenarioParams(name: string, overrides: Partial<SimParams> = {}): SimParams {
  const s = SCENARIOS[name];
  if (!s || !Object.prototype.hasOwnProperty.call(SCENARIOS, name)) {
    throw new Error(`unknown scenario "${name}"; valid scenarios: ${Object.keys(SCENARIOS).join(', ')}`);
  }
  const params: SimParams = structuredClone({ ...BASE_PARAMS, ...s.params, scenario: name, description: s.description, ...overrides });
  validateParams(params);
  return params;
}
