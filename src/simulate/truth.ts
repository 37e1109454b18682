import type { TruthEvent } from './events';
import type { SimParams } from './params';

/**
 * True values of one simulated breath, from the noise-free model (before any sensor effect). Times are when gas
 * passes the airway opening (no sensor delay). Volumes BTPS as the flow sensor reports them, mL; CO2 volumes mL STPD.
 * Dead-space ratios use the general mass balance VD/VT = (Pref - PE) / (Pref - PI) (common practice, no source), which
 * is the plain Bohr / Enghoff form when PI = 0.
 */
export interface TruthBreath {
  breath: number;
  /** start of inspiration */
  t_start_s: number;
  t_exp_start_s: number;
  /** end of the breath = start of the next inspiration */
  t_end_s: number;
  rr_bpm: number;
  vt_insp_ml: number;
  /** expired volume passing the sensor (inspired minus leak) */
  vt_exp_ml: number;
  /** true airway dead space (centre of the phase II front), mL */
  vd_aw_ml: number;
  /** Fowler's equal-area V* on the true curve with the true phase III line, V_x = V_E, raw P (Fowler 1948) */
  vd_fowler_exact_ml: number;
  /** same on P - PI (differs from the raw form only with rebreathing) */
  vd_fowler_net_exact_ml: number;
  /** alveolar dead space on the Enghoff basis: (V_E - VDaw)(PaCO2 - Pmix)/(PaCO2 - PI), mL (model formula) */
  vd_alv_enghoff_ml: number;
  /** part of it from unperfused units: f_ads (V_E - VDaw), mL */
  vd_alv_unperfused_ml: number;
  /** physiologic dead space, Enghoff basis: vdvt_enghoff x V_E, mL */
  vd_phys_ml: number;
  /** Bohr dead space with PACO2 = alv_co2_mmhg: vdvt_bohr x V_E, mL */
  vd_bohr_ml: number;
  vdvt_bohr: number;
  vdvt_enghoff: number;
  paco2_mmhg: number;
  pvco2_mmhg: number;
  /** perfused alveolar = end-capillary PCO2 */
  pa_perfused_mmhg: number;
  /** true curve at V_E */
  petco2_mmhg: number;
  /** volume-weighted mean of the true expired curve */
  peco2_mmhg: number;
  /** integral P dV / (V_E - VDaw) */
  paeco2_mmhg: number;
  /** true phase III line at the midpoint of [VDaw + 3 sigma, V_E] */
  alv_co2_mmhg: number;
  slope3_mmhg_per_l: number;
  /** true phase III slope / paeco2_mmhg, 1/L (the definition of breaths.csv `slope3_norm_paeco2_per_l`) */
  slope3_norm_paeco2_per_l: number;
  /** true phase III slope x vt_exp_ml / 1000 / paeco2_mmhg (the definition of breaths.csv `slope3_vt_norm`) */
  slope3_vt_norm: number;
  /** steepest slope of the true curve in phase II, mmHg/L; its start of phase III (95 % of the line above the inspired
   *  level, after the steepest point), mL; then the normalised phase II slope, the II/III angle and VAE/VT by the
   *  definitions of breaths.csv (src/simulate/phase-shape-truth.ts) */
  slope2_mmhg_per_l: number;
  v_phase3_start_ml: number;
  slope2_norm_paeco2_per_l: number;
  angle23_deg: number;
  vae_vt: number;
  /** net CO2 volume: veco2 - vico2, mL STPD */
  vtco2_ml: number;
  veco2_ml: number;
  vico2_ml: number;
  /** volume-weighted mean inspired PCO2 */
  fico2_mmhg: number;
  shunt_fraction: number;
  alv_dead_space_fraction: number;
  q_l_min: number;
  /** CO2 production at this time, mL/min STPD */
  vco2_ml_min: number;
  /** CO2 leaving the lungs in this breath, mL STPD (equals vtco2_ml without leak, up to the front residual) */
  eliminated_ml: number;

  // --- only with lung_model 'compartments' (then pa_perfused_mmhg is the end-capillary mix Pc'CO2, slope3_mmhg_per_l
  // is the least-squares slope of the true curve over the middle half of [VDaw + 3 sigma, V_E], alv_co2_mmhg that
  // line at the window's midpoint, and alv_dead_space_fraction the unperfused share of alveolar ventilation) ---
  /** the phase III line (slope3_mmhg_per_l, alv_co2_mmhg) at V_E: what the analysis reports as PETCO2 by default
   *  (petco2_method 'line_end'); petco2_mmhg is the gas itself at V_E, which a curved phase III lifts above the line */
  petco2_line_end_mmhg?: number;
  /** end-capillary PCO2 Pc'CO2: perfusion-weighted mix of the compartments' alveolar PCO2 */
  pcco2_mmhg?: number;
  /** ventilation-weighted mean PCO2 of the perfused units */
  pa_perfused_vent_mmhg?: number;
  /** zone-1 share of each perfused compartment (West zone 1 rule) */
  zone1_fraction?: number;
  /** PaCO2 - PETCO2 = grad_shunt + grad_vq + grad_dead_space + grad_emptying, mmHg */
  grad_total_mmhg?: number;
  /** PaCO2 - Pc'CO2: true shunt (venous admixture through no capillary) */
  grad_shunt_mmhg?: number;
  /** Pc'CO2 - pa_perfused_vent_mmhg: V/Q mismatch among the perfused compartments (low V/Q units weigh more in blood) */
  grad_vq_mmhg?: number;
  /** pa_perfused_vent_mmhg - mean alveolar expired PCO2: dilution by unperfused units (alveolar dead space incl. zone 1) */
  grad_dead_space_mmhg?: number;
  /** mean alveolar expired PCO2 - PETCO2: sequential emptying (negative when phase III rises) */
  grad_emptying_mmhg?: number;

  // --- only with sample_flow_ml_min > 0 ---
  /** expired volume the flow sensor misses because the sidestream sample flow is drawn before it: Qs x Te, mL */
  sample_loss_exp_ml?: number;
  /** inspired volume the flow sensor reads in excess of the patient's: Qs x Ti, mL */
  sample_gain_insp_ml?: number;
}

export interface ExportStats {
  /** all lines written, incl. preamble, header and damaged lines */
  lines: number;
  /** 1-based line number of the header */
  header_line: number;
  /** well-formed data rows (incl. rows with blank cells) */
  data_rows: number;
  /** rows whose flow and CO2 cells were blanked for a 'blank' gap */
  blank_gap_rows: number;
  /** rows left out for a 'rows' gap */
  omitted_gap_rows: number;
  garbage_lines: number;
  cut_lines: number;
  /** first line numbers of garbage and cut lines (at most 50) */
  damaged_line_numbers: number[];
}

export interface Truth {
  scenario: string;
  seed: number;
  model: string;
  internal_rate_hz: number;
  params: SimParams;
  breaths: TruthBreath[];
  /** median of every numeric per-breath field */
  summary: Record<string, number>;
  events: TruthEvent[];
  breath_count: number;
  export?: ExportStats;
}

export const TRUTH_MODEL_ID = 'phasewise-sim-1';

const NOT_SUMMARISED = new Set(['breath', 't_start_s', 't_exp_start_s', 't_end_s']);

/** Medians of the numeric per-breath fields (NaN-free fields only; empty list gives an empty summary). */
export function summariseBreaths(breaths: readonly TruthBreath[]): Record<string, number> {
  const out: Record<string, number> = {};
  if (breaths.length === 0) return out;
  for (const key of Object.keys(breaths[0]!) as (keyof TruthBreath)[]) {
    if (NOT_SUMMARISED.has(key)) continue;
    const values = breaths.map((b) => b[key]).filter((v): v is number => Number.isFinite(v)).sort((a, b) => a - b);
    if (values.length === 0) continue;
    const m = values.length >> 1;
    out[key] = values.length % 2 === 1 ? values[m]! : (values[m - 1]! + values[m]!) / 2;
  }
  return out;
}
