// The metric registry: one table per output file (breaths.csv, trends.csv, gas.csv, paco2_estimates.csv) holding,
// for every column, its key (unit in the name), label, unit, decimals, whether summary.json summarises it, a one-line
// meaning and its source. Everything else is generated from here: the column order of the CSV files, the metrics of
// summary.json (and of the batch recordings.csv), the terminal summary table, the viewer's breath and summary tables,
// and the column tables of the documentation (src/metrics/markdown.ts, checked by tests/metrics/docs-tables.test.ts).
// The BreathRow and TrendRow types are derived from their tables, so a new per-breath or trend metric is one entry
// here plus the code that computes it; GasRow and Paco2Estimate keep their own interfaces (text columns with fixed
// values) and a type check (ROW_TYPES_COMPLETE) keeps them and their tables in step. Pure and browser-safe: no
// imports but types.
//
// Sources: a published source (short citation; author, year, title and journal in REFERENCES), `common practice, no
// source`, or `derived here` (a value this project defines itself: thresholds, identifiers, combinations of other
// columns, values passed through from an input file).

import type { GasRow, Paco2Estimate } from '../gas/gas-types';

/** What a column holds: a number (NaN = empty cell) or text. */
export type MetricKind = 'number' | 'text';

export interface MetricSpec<K extends string = string> {
  /** column name; carries its unit (`vd_aw_ml`, `slope3_mmhg_per_l`); dimensionless values carry none */
  key: K;
  kind: MetricKind;
  /** display name (terminal table, viewer tables) */
  label: string;
  /** display unit ('' = dimensionless or text) */
  unit: string;
  /** decimals shown in the viewer's tables */
  decimals: number;
  /** summary.json gives median, p25, p75 and n over ok breaths (breaths table only) */
  summary: boolean;
  /** one-line meaning, for the documentation tables */
  meaning: string;
  /** published source (short citation; the full reference in REFERENCES), `common practice, no source` or `derived here` */
  source: MetricSource;
}

/** Published sources, by the short citation the registry entries use. */
export const REFERENCES = {
  'Fowler 1948': 'Fowler WS 1948. Lung function studies. II. The respiratory dead space. Am J Physiol 154:405-416',
  'Fletcher et al. 1981':
    'Fletcher R, Jonson B, Cumming G, Brew J 1981. The concept of deadspace with special reference to the single breath test for carbon dioxide. Br J Anaesth 53:77-88',
  'Bohr 1891': 'Bohr C 1891. Über die Lungenathmung. Skand Arch Physiol 2:236-268',
  'Enghoff 1938': 'Enghoff H 1938. Volumen inefficax. Bemerkungen zur Frage des schädlichen Raumes. Upsala Läkareförenings Förhandlingar 44:191-218',
  'Tusman et al. 2012': 'Tusman G, Sipmann FS, Bohm SH 2012. Rationale of dead space measurement by volumetric capnography. Anesth Analg 114:866-874',
  'Tusman et al. 2013':
    'Tusman G, Gogniat E, Bohm SH, Scandurra A, Suarez-Sipmann F, Torroba A, Casella F, Giannasi S, San Roman E 2013. Reference values for volumetric capnography-derived non-invasive parameters in healthy individuals. J Clin Monit Comput 27:281-288',
  'Romero et al. 1997':
    'Romero PV, Lucangelo U, Lopez Aguilar J, Fernandez R, Blanch L 1997. Physiologically based indices of volumetric capnography in patients receiving mechanical ventilation. Eur Respir J 10:1309-1315',
  'Jalušić Glunčić et al. 2015':
    'Jalušić Glunčić T, Basara L, Konecki L, Tomić S, Samaržija M, Jakopović M 2015. Capnographic measurement as a screening method for respiratory obstructive diseases. Eur Respir J 46 suppl 59:PA1039 (congress abstract)',
  'Tusman et al. 2011':
    'Tusman G, Sipmann FS, Borges JB, Hedenstierna G, Bohm SH 2011. Validation of Bohr dead space measured by volumetric capnography. Intensive Care Med 37:870-874',
  'Hardman & Aitkenhead 2003':
    'Hardman JG, Aitkenhead AR 2003. Estimating alveolar dead space from the arterial to end-tidal CO2 gradient: a modeling analysis. Anesth Analg 97:1846-1851',
  'ARDS Network 2000':
    'The Acute Respiratory Distress Syndrome Network 2000. Ventilation with lower tidal volumes as compared with traditional tidal volumes for acute lung injury and the acute respiratory distress syndrome. N Engl J Med 342:1301-1308 (predicted body weight)',
  'Fenn et al. 1946': 'Fenn WO, Rahn H, Otis AB 1946. A theoretical study of the composition of the alveolar air at altitude. Am J Physiol 146:637-653',
  'Berggren 1942': 'Berggren SM 1942. The oxygen deficit of arterial blood caused by non-ventilating parts of the lung. Acta Physiol Scand 4 Suppl 11:1-92',
  'Nunn et al. 1965': 'Nunn JF, Bergman NA, Bunatyan A, Coleman AJ 1965. Temperature coefficients for PCO2 and PO2 of blood in vitro. J Appl Physiol 20:23-26',
  'Kuwabara & Duncalf 1969':
    'Kuwabara S, Duncalf D 1969. Effect of anatomic shunt on physiologic deadspace-to-tidal volume ratio - a new equation. Anesthesiology 31:575-577',
  'ICSH 1996':
    'ICSH (International Council for Standardization in Haematology), Expert Panel on Haemoglobinometry 1996. Recommendations for reference method for haemoglobinometry in human blood (ICSH standard 1995). J Clin Pathol 49:271-274',
} as const;

const FOWLER = 'Fowler 1948';
const FLETCHER = 'Fletcher et al. 1981';
const BOHR = 'Bohr 1891';
const ENGHOFF = 'Enghoff 1938';
const TUSMAN_2012 = 'Tusman et al. 2012';
const TUSMAN_2011 = 'Tusman et al. 2011';
const TUSMAN_2013 = 'Tusman et al. 2013';
const ROMERO_1997 = 'Romero et al. 1997';
const ALPHA_ANGLE = 'Jalušić Glunčić et al. 2015';
const HARDMAN = 'Hardman & Aitkenhead 2003';
const ARDSNET = 'ARDS Network 2000';
const FENN = 'Fenn et al. 1946';
const BERGGREN = 'Berggren 1942';
const NUNN = 'Nunn et al. 1965';
const ICSH = 'ICSH 1996';
const KUWABARA = 'Kuwabara & Duncalf 1969';
export const NO_SOURCE = 'common practice, no source';
export const DERIVED = 'derived here';

/** A published source (a key of REFERENCES), `common practice, no source` or `derived here`. */
export type MetricSource = keyof typeof REFERENCES | typeof NO_SOURCE | typeof DERIVED;

/** One table's entries, checked against its row type: every key is a field of Row (text columns hold strings). */
type Entry<Row> = { [K in keyof Row & string]: MetricSpec<K> & { kind: Row[K] extends number ? 'number' : 'text' } }[keyof Row & string];

/** A numeric column. */
function n<K extends string, S extends boolean>(
  key: K, label: string, unit: string, decimals: number, summary: S, meaning: string, source: MetricSource,
): MetricSpec<K> & { kind: 'number'; summary: S } {
  return { key, kind: 'number', label, unit, decimals, summary, meaning, source };
}

/** A text column (written as it is; booleans as true/false). */
function txt<K extends string>(key: K, label: string, meaning: string, source: MetricSource): MetricSpec<K> & { kind: 'text'; summary: false } {
  return { key, kind: 'text', label, unit: '', decimals: 0, summary: false, meaning, source };
}

/** `true` when a table lists every field of its row type, else the missing keys (Entry checks the other direction). */
type Complete<Row, Table extends readonly { key: string }[]> = [Exclude<keyof Row & string, Table[number]['key']>] extends [never]
  ? true
  : { missing: Exclude<keyof Row & string, Table[number]['key']> };

// ---------------------------------------------------------------------------------------------------------------
// breaths.csv: one row per breath, columns in this order

/**
 * The per-breath columns, in breaths.csv order. BreathRow is derived from this list (plus `flags`), so the type,
 * the CSV and the tables cannot drift apart.
 */
export const BREATH_METRICS = [
  n('breath', 'Breath', '', 0, false, 'breath number (1-based)', DERIVED),
  n('t_start_s', 'Inspiration start', 's', 2, false, 'inspiration start (recording time)', DERIVED),
  n('t_exp_start_s', 'Expiration start', 's', 2, false, 'expiration start', DERIVED),
  n('t_end_s', 'Breath end', 's', 2, false, 'end of expiration (= next inspiration start)', DERIVED),
  txt(
    'status',
    'Status',
    '`ok`; `caution:` and the caution codes joined by `+`; or, for an excluded breath, all its quality codes joined by `+`. breaths.csv follows it with a `quality` column (`ok`, `caution` or `excluded`), the class of the status, derived when the file is written',
    DERIVED,
  ),
  n('rr_bpm', 'Respiratory rate', '/min', 1, true, '60 / breath duration', NO_SOURCE),
  n('ti_s', 'Inspiratory time', 's', 2, false, 'inspiratory time', NO_SOURCE),
  n('te_s', 'Expiratory time', 's', 2, false, 'expiratory time', NO_SOURCE),
  n('vt_insp_ml', 'Inspired tidal volume', 'mL', 1, true, 'inspired tidal volume (flow integrated by the trapezoid rule, offset-corrected)', NO_SOURCE),
  n('vt_exp_ml', 'Expired tidal volume', 'mL', 1, true, 'expired tidal volume V_E (flow integrated by the trapezoid rule, offset-corrected)', NO_SOURCE),
  n('vt_exp_ml_per_kg', 'Expired tidal volume per kg', 'mL/kg', 1, true, '`vt_exp_ml` per kg of predicted body weight (adults with `--height --sex`) or of `--weight`; empty without a weight', ARDSNET),
  n('vd_aw_ml', 'Airway dead space (Fowler)', 'mL', 1, true,
    "airway dead space by Fowler's equal-area construction on CO2 above the inspired level, upper limit V_E (setting), minus `apparatus_ml`", FOWLER),
  n('vd_inflection_ml', 'Airway dead space (inflection)', 'mL', 1, true,
    'airway dead space as the phase II inflection (steepest point), sub-sample refined', TUSMAN_2012),
  n('vd_fit_ml', 'Airway dead space (curve fit)', 'mL', 1, true,
    'airway dead space as the midpoint of a logistic rise onto the phase III line, (a + bV) / (1 + exp(−(V − m)/w)), fitted to the whole expirogram (Levenberg-Marquardt), minus `apparatus_ml`; empty when the fit does not converge (counted in summary.json `breaths.no_curve_fit`)', DERIVED),
  n('vd_fit_rms_mmhg', 'Curve fit residual (RMS)', 'mmHg', 2, false,
    'root mean square residual of that fit over the expirogram (101 points evenly spaced in volume from 0 to V_E)', DERIVED),
  n('v_phase2_start_ml', 'Phase II start', 'mL', 1, false, 'expired volume where CO2 leaves 5 % of the phase III line', DERIVED),
  n('v_phase3_start_ml', 'Phase III start', 'mL', 1, false, 'expired volume where CO2 first reaches 95 % of the phase III line after the inflection', DERIVED),
  n('slope2_mmhg_per_l', 'Phase II slope', 'mmHg/L', 0, false, 'steepest phase II slope', TUSMAN_2012),
  n('slope3_mmhg_per_l', 'Phase III slope', 'mmHg/L', 2, true,
    'phase III slope: least-squares line over the middle half of phase III, low-flow samples left out, sensor lag modelled', TUSMAN_2012),
  n('slope3_norm_per_l', 'Phase III slope / PETCO2', '1/L', 3, true, 'phase III slope / PETCO2', NO_SOURCE),
  n('slope3_r2', 'Phase III fit R²', '', 4, false, 'R² of the phase III fit: 1 − residual sum of squares / variance of the readings in the fit window', NO_SOURCE),
  n('slope3_norm_paeco2_per_l', 'Phase III slope / PĀECO2', '1/L', 3, true,
    'normalised phase III slope, `slope3_mmhg_per_l` / `paeco2_mmhg` (the source reports a normalised phase III slope; its divisor could not be checked in the full text)', TUSMAN_2013),
  n('slope3_vt_norm', 'Phase III slope × VT / PĀECO2', '', 3, false,
    'phase III slope normalised by PĀECO2 and expired tidal volume: `slope3_mmhg_per_l` × `vt_exp_ml`/1000 / `paeco2_mmhg` (no published definition found)', DERIVED),
  n('slope2_norm_paeco2_per_l', 'Phase II slope / PĀECO2', '1/L', 2, false, 'normalised phase II slope, `slope2_mmhg_per_l` / `paeco2_mmhg` (divisor as for `slope3_norm_paeco2_per_l`)', TUSMAN_2013),
  n('angle23_deg', 'Phase II/III angle', '°', 1, true,
    'angle between the phase II and phase III lines with volume in L and PCO2 as a fraction of PĀECO2: 180° − atan(`slope2_norm_paeco2_per_l`) + atan(`slope3_norm_paeco2_per_l`) (axis convention derived here)', ALPHA_ANGLE),
  n('vae_vt', 'VAE/VT', '', 3, true,
    'alveolar ejection volume over expired tidal volume, (`vt_exp_ml` − start of VAE) / `vt_exp_ml`; start of VAE ASSUMED = `v_phase3_start_ml` (the source\'s own criterion not verified here)', ROMERO_1997),
  n('petco2_mmhg', 'PETCO2', 'mmHg', 1, true, 'end-tidal PCO2 (default: the phase III line at end of expiration; see `petco2_method`)', NO_SOURCE),
  n('petco2_last_mmhg', 'PETCO2 (last reading)', 'mmHg', 1, true,
    'the last delay-aligned sensor reading with expiratory flow: the gas itself at the end of expiration (= `petco2_mmhg` with `petco2_method` `last`); it departs from the default when phase III bends near its end', NO_SOURCE),
  n('peco2_mmhg', 'PECO2 (mixed expired)', 'mmHg', 1, true, 'mixed expired PCO2 = ∫P dV / V_E over the whole expiration', FLETCHER),
  n('paeco2_mmhg', 'Mean alveolar expired PCO2', 'mmHg', 1, true, 'average alveolar expired PCO2 = (∫P dV − PICO2 × VDaw) / (V_E − VDaw), VDaw at the sensor; the inspired term follows `bohr_inspired_term`', FLETCHER),
  n('alv_co2_mmhg', 'Alveolar PCO2 (phase III mid)', 'mmHg', 1, true,
    'alveolar PCO2 for Bohr: the phase III line at the midpoint of phase III (setting)', TUSMAN_2011),
  n('vtco2_ml', 'VTCO2 per breath (STPD)', 'mL', 2, true,
    'CO2 eliminated per breath, mL STPD = expired − inspired CO2 volume; 1.1588e-3 × ∫P dV at 37 °C', FLETCHER),
  n('vco2_ml_min', "V'CO2 (this breath)", 'mL/min', 1, true, 'CO2 elimination rate of the breath, mL/min STPD = VTCO2 × 60 / breath duration', FLETCHER),
  n('vco2_ml_kg_min', "V'CO2 per kg", 'mL/kg/min', 2, true, '`vco2_ml_min` per kg, same weight as `vt_exp_ml_per_kg`', FLETCHER),
  n('veco2_ml', 'Expired CO2 volume (STPD)', 'mL', 2, false, 'expired CO2 volume, mL STPD', FLETCHER),
  n('vico2_ml', 'Re-inspired CO2 volume (STPD)', 'mL', 3, false, 'inspired CO2 volume, mL STPD', FLETCHER),
  n('fico2_mmhg', 'Inspired PCO2', 'mmHg', 2, true, 'volume-weighted mean inspired PCO2', NO_SOURCE),
  n('vd_bohr_ml', 'Bohr dead space', 'mL', 1, true, 'Bohr dead space at the sensor minus `apparatus_ml` (VD/VT Bohr × V_E)', BOHR),
  n('vdvt_bohr', 'VD/VT Bohr', '', 3, true, 'Bohr: (PACO2 − PĒCO2)/(PACO2 − PICO2) × V_E minus `apparatus_ml`, over V_E (the published equation when `apparatus_ml` is 0)', BOHR),
  n('vdaw_vt', 'VDaw/VT', '', 3, true, 'airway (Fowler) dead space over expired tidal volume, `vd_aw_ml` / `vt_exp_ml`', FOWLER),
  n('vd_aw_ml_per_kg', 'Airway dead space per kg', 'mL/kg', 2, true, '`vd_aw_ml` per kg, same weight as `vt_exp_ml_per_kg`', ARDSNET),
  n('vt_alv_ml', 'Alveolar tidal volume', 'mL', 1, true, 'V_E − airway dead space − `apparatus_ml`: the part of the breath that reached alveoli', FOWLER),
  n('vd_alv_bohr_ml', 'Alveolar dead space (Bohr-based)', 'mL', 1, true, 'alveolar dead space = Bohr dead space − airway (Fowler) dead space', FLETCHER),
  n('vd_enghoff_ml', 'Enghoff dead space', 'mL', 1, true, 'Enghoff dead space at the sensor minus `apparatus_ml` (VD/VT Enghoff × V_E; needs `--paco2` or `--gas`)', ENGHOFF),
  n('vd_enghoff_ml_per_kg', 'Enghoff dead space per kg', 'mL/kg', 2, true, '`vd_enghoff_ml` per kg, same weight as `vt_exp_ml_per_kg` (needs `--paco2` or `--gas`)', ARDSNET),
  n('vdvt_enghoff', 'VD/VT Enghoff', '', 3, true, 'Enghoff: (PaCO2 − PĒCO2)/(PaCO2 − PICO2) × V_E minus `apparatus_ml`, over V_E (needs `--paco2` or `--gas`)', ENGHOFF),
  n('vdalv_vtalv', 'Alveolar VD/VT (arterial)', '', 3, true, 'alveolar dead-space fraction of the alveolar volume, (PaCO2 − PĀECO2)/(PaCO2 − PICO2), PĀECO2 = `paeco2_mmhg` (needs `--paco2` or `--gas`)', FLETCHER),
  n('fletcher_x_mmhg_ml', 'Fletcher area X (CO2 eliminated)', 'mmHg·mL', 0, true, "Fletcher's area X: ∫P dV over the expiration = PĒCO2 × V_E, at the sensor (needs `--paco2` or `--gas`)", FLETCHER),
  n('fletcher_y_mmhg_ml', 'Fletcher area Y (alveolar dead space)', 'mmHg·mL', 0, true, "Fletcher's area Y: PaCO2 × V_E − X − Z, the CO2 not eliminated because of alveolar dead space", FLETCHER),
  n('fletcher_z_mmhg_ml', 'Fletcher area Z (airway dead space)', 'mmHg·mL', 0, true, "Fletcher's area Z: PaCO2 × airway dead space at the sensor (`vd_aw_ml` + `apparatus_ml`)", FLETCHER),
  n('co2_efficiency', 'CO2 elimination efficiency', '', 3, true, 'X / (X + Y + Z) = PĒCO2 / PaCO2: the share of the CO2 a breath of arterial gas would carry that it eliminates', FLETCHER),
  n('delay_s', 'CO2 delay used', 's', 3, true, 'CO2 transport delay used for this breath', DERIVED),
  n('delay_measured_s', 'CO2 delay measured', 's', 3, false,
    "delay measured on this breath's own inspiratory CO2 downstroke (empty when none was found); trends use it to see a delay jump", DERIVED),
] as const satisfies readonly MetricSpec[];

type BreathSpec = (typeof BREATH_METRICS)[number];

/** One analysed breath (one row of breaths.csv) plus its quality codes. NaN = not computable (an empty cell). */
export type BreathRow = { [S in BreathSpec as S['key']]: S['kind'] extends 'text' ? string : number } & {
  /** quality codes of the breath (cautions and exclusions; status is derived from them) */
  flags: string[];
};
export type BreathKey = BreathSpec['key'];
/** Keys of the numeric breath columns. */
export type NumericBreathKey = Extract<BreathSpec, { kind: 'number' }>['key'];
/** Keys of the breath metrics that summary.json summarises. */
export type SummaryKey = Extract<BreathSpec, { summary: true }>['key'];

/** breaths.csv column order. */
export const BREATH_COLUMNS: readonly BreathKey[] = BREATH_METRICS.map((m) => m.key);

/** Numeric breath columns that get a summary (median, p25, p75, n over ok breaths), in breaths.csv order. */
export const SUMMARY_METRICS: readonly SummaryKey[] = BREATH_METRICS.filter((m): m is Extract<BreathSpec, { summary: true }> => m.summary).map(
  (m) => m.key,
);

/** A breath row with every number NaN, status 'ok' and no flags (the starting point of every computed row). */
export function blankBreathRow(): BreathRow {
  const row: Record<string, unknown> = {};
  for (const m of BREATH_METRICS) row[m.key] = m.kind === 'number' ? NaN : '';
  row.status = 'ok';
  row.flags = [];
  return row as BreathRow;
}

// ---------------------------------------------------------------------------------------------------------------
// Views: which breath metrics each display shows, in its order. Labels, units and decimals come from the entries.

/** The terminal summary table (median, p25, p75, n over ok breaths; shown when n > 0). */
export const TERMINAL_SUMMARY_ROWS: readonly SummaryKey[] = [
  'rr_bpm', 'vt_exp_ml', 'vt_insp_ml', 'vd_aw_ml', 'vd_inflection_ml', 'vd_fit_ml', 'slope3_mmhg_per_l', 'slope3_norm_paeco2_per_l', 'petco2_mmhg', 'peco2_mmhg',
  'alv_co2_mmhg', 'vtco2_ml', 'vco2_ml_min', 'vco2_ml_kg_min', 'vdaw_vt', 'vd_aw_ml_per_kg', 'vdvt_bohr', 'vd_bohr_ml', 'vd_alv_bohr_ml', 'vdvt_enghoff', 'vd_enghoff_ml', 'vdalv_vtalv',
];

/** The viewer's recording summary panel. */
export const VIEWER_SUMMARY_ROWS: readonly SummaryKey[] = [
  'rr_bpm', 'vt_exp_ml', 'vd_aw_ml', 'vd_inflection_ml', 'vd_fit_ml', 'vd_alv_bohr_ml', 'vd_bohr_ml', 'vdvt_bohr', 'vd_enghoff_ml',
  'vdvt_enghoff', 'slope3_mmhg_per_l', 'petco2_mmhg', 'peco2_mmhg', 'vtco2_ml',
];

/** The viewer's table of the selected breath, by group. */
export const VIEWER_BREATH_GROUPS: readonly (readonly [string, readonly NumericBreathKey[]])[] = [
  ['timing', ['t_start_s', 'rr_bpm', 'ti_s', 'te_s']],
  ['volumes', ['vt_insp_ml', 'vt_exp_ml', 'vt_exp_ml_per_kg']],
  ['dead space', [
    'vd_aw_ml', 'vd_aw_ml_per_kg', 'vdaw_vt', 'vt_alv_ml', 'vd_inflection_ml', 'vd_fit_ml', 'vd_fit_rms_mmhg', 'vd_alv_bohr_ml', 'vd_bohr_ml',
    'vdvt_bohr', 'vd_enghoff_ml', 'vd_enghoff_ml_per_kg', 'vdvt_enghoff', 'vdalv_vtalv', 'fletcher_x_mmhg_ml', 'fletcher_y_mmhg_ml', 'fletcher_z_mmhg_ml', 'co2_efficiency',
  ]],
  ['phases', [
    'v_phase2_start_ml', 'v_phase3_start_ml', 'slope2_mmhg_per_l', 'slope3_mmhg_per_l', 'slope3_norm_per_l', 'slope3_r2',
    'slope3_norm_paeco2_per_l', 'slope3_vt_norm', 'slope2_norm_paeco2_per_l', 'angle23_deg', 'vae_vt',
  ]],
  ['CO2', ['petco2_mmhg', 'petco2_last_mmhg', 'peco2_mmhg', 'alv_co2_mmhg', 'paeco2_mmhg', 'fico2_mmhg', 'vtco2_ml', 'vco2_ml_min', 'vco2_ml_kg_min', 'veco2_ml', 'vico2_ml', 'delay_s']],
];

// ---------------------------------------------------------------------------------------------------------------
// trends.csv: one row per time bin (src/trends/compute-trends.ts)

/**
 * The per-bin trend columns, in trends.csv order; TrendRow is derived from them. Breaths belong to the bin that holds
 * their start (t_start_s). Unless said otherwise a value uses the bin's ok breaths only; with fewer than
 * `min_ok_breaths` ok breaths it is NaN. Rates are computed over the time the ok breaths cover, not over the bin
 * length (V'CO2 = sum(VTCO2) / (sum(breath duration) / 60)), so an excluded breath adds neither CO2 nor time.
 */
export const TREND_METRICS = [
  n('t_s', 'Bin start', 's', 0, false, 'bin start (recording time)', DERIVED),
  n('vco2_ml_min', "V'CO2", 'mL/min', 1, false,
    "sum of net VTCO2 / (sum of breath durations / 60), mL/min STPD, over the bin's ok breaths: an excluded breath adds neither CO2 nor time, so bin edges cause no bias",
    NO_SOURCE),
  n('ve_l_min', "V'E", 'L/min', 2, false, 'sum of VTe / (sum of durations / 60), volumes as the flow sensor reports them', NO_SOURCE),
  n('va_l_min', "V'A (airway)", 'L/min', 2, false,
    'alveolar ventilation as ventilation reaching alveoli: sum of (VTe − VDaw − `apparatus_ml`) / (sum of durations / 60), i.e. RR × (VT − VDaw), not RR × (VT − VDphys)',
    NO_SOURCE),
  n('rr_bpm', 'Respiratory rate', '/min', 1, false, '60 × ok breaths / sum of their durations', NO_SOURCE),
  n('vte_ml', 'Expired tidal volume', 'mL', 0, false, 'median expired tidal volume over ok breaths', NO_SOURCE),
  n('petco2_mmhg', 'PETCO2', 'mmHg', 1, false, 'median PETCO2 over ok breaths', NO_SOURCE),
  n('vd_aw_ml', 'Airway dead space (Fowler)', 'mL', 1, false, 'median airway dead space over ok breaths', FOWLER),
  n('vdvt_bohr', 'VD/VT Bohr', '', 3, false, 'median Bohr VD/VT over ok breaths', BOHR),
  n('slope3_mmhg_per_l', 'Phase III slope', 'mmHg/L', 2, false, 'median phase III slope over ok breaths', TUSMAN_2012),
  n('paco2_est_mmhg', 'PaCO2 estimate', 'mmHg', 1, false,
    "median of the bin's PaCO2 estimates between blood gases (`paco2_estimates.csv`; PETCO2 + the latest gradient); empty without gases or before the first", NO_SOURCE),
  n('vdvt_enghoff_est', 'VD/VT Enghoff (estimated PaCO2)', '', 3, false,
    "median of the bin's `vdvt_enghoff_est` (Enghoff with the estimated PaCO2 of each breath): follows PaCO2 between gases", ENGHOFF),
  n('avdsf_est', 'AVDSF (estimated PaCO2)', '', 3, false, "median of the bin's `avdsf_est`, (estimated PaCO2 − PETCO2) / estimated PaCO2", HARDMAN),
  n('fico2_mmhg', 'Inspired PCO2', 'mmHg', 2, false, 'median inspired PCO2 over all breaths (rebreathing itself excludes breaths)', NO_SOURCE),
  n('delay_s', 'CO2 delay measured', 's', 3, false, 'median of the per-breath measured delay (`delay_measured_s`) over all breaths', DERIVED),
  n('ok_share', 'Ok share', '', 2, false, 'ok breaths / breaths (empty when the bin has no breath)', DERIVED),
  n('breaths', 'Breaths', '', 0, false, 'breaths starting in the bin (all statuses)', DERIVED),
] as const satisfies readonly MetricSpec[];

/** One row of trends.csv (NaN = not computable, an empty cell). */
export type TrendRow = { [S in (typeof TREND_METRICS)[number] as S['key']]: number };

/** A trend row with every value NaN. */
export function blankTrendRow(): TrendRow {
  const row: Record<string, number> = {};
  for (const m of TREND_METRICS) row[m.key] = NaN;
  return row as TrendRow;
}

// ---------------------------------------------------------------------------------------------------------------
// gas.csv: one row per blood-gas sample (src/gas/analyse-gas.ts)

export const GAS_METRICS = [
  n('sample', 'Sample', '', 0, false, 'sample number in time order (1-based)', DERIVED),
  n('line', 'Line', '', 0, false, 'line of the sample in the gas file', DERIVED),
  n('time_s', 'Time', 's', 0, false, 'sample time, seconds from recording start (negative: drawn before the recording)', DERIVED),
  n('paco2_mmhg', 'PaCO2', 'mmHg', 1, false, 'arterial PCO2 as given in the gas file (measured at 37 °C); the gradient uses `paco2_corrected_mmhg` when `temp_c` is given, unless the gas setting `paco2_temperature` is `measured`', DERIVED),
  n('breaths_used', 'Breaths used', '', 0, false, 'ok breaths in the window before the sample (`--gas-window`) used for the medians', DERIVED),
  n('petco2_mmhg', 'PETCO2', 'mmHg', 1, false, 'window median of PETCO2', NO_SOURCE),
  n('peco2_mmhg', 'PECO2 (mixed expired)', 'mmHg', 1, false, 'window median of PĒCO2', FLETCHER),
  n('vt_exp_ml', 'Expired tidal volume', 'mL', 0, false, 'window median of the expired tidal volume', NO_SOURCE),
  n('gradient_mmhg', 'Pa-ETCO2 gradient', 'mmHg', 1, false, 'PaCO2 − PETCO2', NO_SOURCE),
  n('avdsf', 'AVDSF', '', 3, false, 'alveolar dead-space fraction (PaCO2 − PETCO2) / PaCO2', HARDMAN),
  n('vdvt_bohr', 'VD/VT Bohr', '', 3, false, 'window median of the per-breath Bohr VD/VT', BOHR),
  n('vdvt_enghoff', 'VD/VT Enghoff', '', 3, false, '(PaCO2 − median PĒCO2) / (PaCO2 − median PICO2) × median VTe minus `apparatus_ml`, over median VTe (inspired term with `bohr_inspired_term`)', ENGHOFF),
  n('vdvt_enghoff_shunt_corrected', 'VD/VT Enghoff, shunt-corrected', '', 3, false, 'Enghoff with Pc\'CO2 = (PaCO2 − s × PvCO2)/(1 − s) for PaCO2, s = `shunt_fraction`, PvCO2 = `pvco2_mmhg` (venous admixture removed)', KUWABARA),
  n('vdvt_difference', 'VD/VT Enghoff - Bohr', '', 3, false, '`vdvt_enghoff` − `vdvt_bohr`', DERIVED),
  n('vd_aw_ml', 'Airway dead space (Fowler)', 'mL', 1, false, 'window median of the airway dead space', FOWLER),
  n('vd_alv_enghoff_ml', 'Alveolar dead space (Enghoff-based)', 'mL', 1, false, '`vd_phys_ml` − `vd_aw_ml` (Enghoff; not the Bohr-based `vd_alv_bohr_ml` of breaths.csv)', FLETCHER),
  n('vd_phys_ml', 'Physiological dead space', 'mL', 0, false, '`vdvt_enghoff` × median expired tidal volume (apparatus removed)', ENGHOFF),
  n('vd_aw_ml_per_kg', 'Airway dead space per kg', 'mL/kg', 2, false, '`vd_aw_ml` per kg of predicted body weight (adults with `--height --sex`) or of `--weight`', ARDSNET),
  n('vd_alv_enghoff_ml_per_kg', 'Alveolar dead space (Enghoff-based) per kg', 'mL/kg', 2, false, '`vd_alv_enghoff_ml` per kg, same weight as above', ARDSNET),
  n('vd_phys_ml_per_kg', 'Physiological dead space per kg', 'mL/kg', 2, false, '`vd_phys_ml` per kg, same weight as above', ARDSNET),
  n('pao2_alv_mmhg', 'Ideal alveolar PO2', 'mmHg', 1, false, 'ideal alveolar PO2 from the alveolar gas equation (RQ setting, 0.8 by default)', FENN),
  n('shunt_fraction', 'Venous admixture', '', 2, false, 'venous admixture from oxygen contents (end-capillary saturation from the Severinghaus curve at PAO2, or 1.0 when FiO2 is missing or by setting) or from saturations only', BERGGREN),
  txt('shunt_method', 'Venous admixture method', '`contents`, `saturations` or empty', DERIVED),
  n('pvco2_mmhg', 'PvCO2 used', 'mmHg', 1, false, 'venous PCO2 used for the shunt part: measured, or PaCO2 + a default P(v−a)CO2 of 6 mmHg', NO_SOURCE),
  txt('pvco2_source', 'PvCO2 source', '`measured`, `default`, `fick` or empty', DERIVED),
  n('gradient_alv_mmhg', 'Alveolar gradient', 'mmHg', 1, false, 'PaCO2 − the alveolar PCO2 the gradient is split on (gas setting `split_alveolar`: median PĀECO2 by default, else the phase III midpoint or PETCO2)', FLETCHER),
  n('gradient_shunt_mmhg', 'Gradient from shunt', 'mmHg', 1, false, 'part of the gradient that venous admixture explains: s/(1 − s) × (PvCO2 − PaCO2), or the Fick route', DERIVED),
  n('gradient_rest_mmhg', 'Gradient rest', 'mmHg', 1, false, '`gradient_alv_mmhg` − `gradient_shunt_mmhg` = Pc\'CO2 − alveolar PCO2: alveolar dead space and V/Q mismatch', DERIVED),
  n('gradient_change_mmhg', 'Gradient change', 'mmHg', 1, false, "gradient minus the previous sample's gradient", DERIVED),
  txt('gradient_changed', 'Gradient changed', '`true` when the gradient changed by more than `gradient_change_mmhg` (5 mmHg) since the previous sample', DERIVED),
  txt('missing_inputs', 'Missing inputs', 'inputs that were missing, `;`-separated (breath metrics as `breath.<field>`)', DERIVED),
  txt('notes', 'Notes', 'assumptions and fallbacks used for this row, `;`-separated; `before the recording: …` for a sample drawn before it', DERIVED),
  n('temp_c', 'Patient temperature', '°C', 1, false, 'patient temperature from the gas file', DERIVED),
  n('paco2_corrected_mmhg', 'PaCO2 at patient temperature', 'mmHg', 1, false, 'PaCO2 corrected to `temp_c`: `paco2_mmhg` × 10^(0.019 (`temp_c` − 37)); empty without `temp_c`', NUNN),
  n('hb_g_dl', 'Haemoglobin', 'g/dL', 1, false, 'Hb used, g/dL: from `hb_g_dl`, `hb_g_l` (÷ 10) or `hb_mmol_l` (× 1.61145, monomer 16 114.5 g/mol)', ICSH),
] as const satisfies readonly Entry<GasRow>[];

// ---------------------------------------------------------------------------------------------------------------
// paco2_estimates.csv: one row per ok breath after the first blood gas (src/gas/estimate-paco2.ts)

export const PACO2_ESTIMATE_METRICS = [
  n('breath', 'Breath', '', 0, false, 'breath number', DERIVED),
  n('t_start_s', 'Inspiration start', 's', 2, false, 'inspiration start of the breath', DERIVED),
  n('petco2_mmhg', 'PETCO2', 'mmHg', 1, false, "the breath's PETCO2", NO_SOURCE),
  n('paco2_est_mmhg', 'PaCO2 estimate', 'mmHg', 1, false, 'PETCO2 + the gradient of the most recent gas sample', NO_SOURCE),
  n('band_low_mmhg', 'Estimate band low', 'mmHg', 1, false, 'estimate − z × `estimate_sd_mmhg`, z for the band level (default 80 %)', DERIVED),
  n('band_high_mmhg', 'Estimate band high', 'mmHg', 1, false, 'estimate + z × `estimate_sd_mmhg`', DERIVED),
  n('gradient_mmhg', 'Gradient used', 'mmHg', 1, false, 'gradient added to PETCO2 (from the gas sample used)', NO_SOURCE),
  n('gas_sample', 'Gas sample', '', 0, false, 'sample number of the gas used', DERIVED),
  n('gases_in_band', 'Gases in band', '', 0, false, 'gas samples at or before this breath (their successive gradients give the drift)', DERIVED),
  n('estimate_sd_mmhg', 'Estimate SD', 'mmHg', 2, false, 'SD of the estimate: √(analyser SD² + breath-to-breath PETCO2 SD² + drift × time since the gas + 4/3 × `petco2_moved_mmhg`²)', DERIVED),
  n('petco2_moved_mmhg', 'PETCO2 moved since gas', 'mmHg', 1, false,
    'largest move of PETCO2 (running median of the last 9 breaths) away from the gas window median since the gas used: a change of dead space or perfusion moves the gradient by up to about twice this, so it widens the band; draw a gas when it is large', DERIVED),
  n('vdvt_enghoff_est', 'VD/VT Enghoff (estimated PaCO2)', '', 3, false,
    "Enghoff VD/VT of the breath with `paco2_est_mmhg` for PaCO2: (estimate − PĒCO2)/(estimate − PICO2) × V_E minus `apparatus_ml`, over V_E (inspired term with `bohr_inspired_term`); follows PaCO2 between gases where breaths.csv's `vdvt_enghoff` keeps the last gas's", ENGHOFF),
  n('avdsf_est', 'AVDSF (estimated PaCO2)', '', 3, false, '(`paco2_est_mmhg` − PETCO2) / `paco2_est_mmhg`', HARDMAN),
  txt('band_method', 'Band method', '`prediction` (src/gas/estimate-paco2.ts)', DERIVED),
] as const satisfies readonly Entry<Paco2Estimate>[];

/** A type check only: a field of GasRow or Paco2Estimate without its registry entry makes this a type error. */
export const ROW_TYPES_COMPLETE: [
  Complete<GasRow, typeof GAS_METRICS>,
  Complete<Paco2Estimate, typeof PACO2_ESTIMATE_METRICS>,
] = [true, true];

// ---------------------------------------------------------------------------------------------------------------

/** The registry tables by name (the names the documentation markers use: `<!-- metrics:breaths:start -->`). */
export const METRIC_TABLES = {
  breaths: BREATH_METRICS as readonly MetricSpec[],
  trends: TREND_METRICS as readonly MetricSpec[],
  gas: GAS_METRICS as readonly MetricSpec[],
  'paco2-estimates': PACO2_ESTIMATE_METRICS as readonly MetricSpec[],
} as const;
export type MetricTableName = keyof typeof METRIC_TABLES;

const BREATH_BY_KEY = new Map<string, BreathSpec>(BREATH_METRICS.map((m) => [m.key, m]));
type GasSpec = (typeof GAS_METRICS)[number];
const GAS_BY_KEY = new Map<string, GasSpec>(GAS_METRICS.map((m) => [m.key, m]));
/** Keys of the numeric gas.csv columns. */
export type NumericGasKey = Extract<GasSpec, { kind: 'number' }>['key'];

/** The registry entry of a breath metric. */
export function breathMetric(key: BreathKey): BreathSpec {
  return BREATH_BY_KEY.get(key)!;
}

/** The registry entry of a gas.csv column. */
export function gasMetric(key: GasSpec['key']): GasSpec {
  return GAS_BY_KEY.get(key)!;
}
