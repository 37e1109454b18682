import { perKilogram } from '../physiology/per-kilogram';
import { alveolarDeadSpaceMl } from '../physiology/alveolar-dead-space';
import { avdsf } from '../physiology/avdsf';
import { enghoffDeadSpaceFraction } from '../physiology/enghoff-dead-space-fraction';
import { patientDeadSpace } from '../physiology/patient-dead-space';
import { shuntCorrectedEnghoff } from '../physiology/shunt-corrected-enghoff';
import { DEFAULT_INGEST } from '../settings';
import type { BreathRow } from '../types';
import { isBeforeRecording } from './before-recording';
import { estimatePaco2 } from './estimate-paco2';
import { GAS_DEFAULTS } from './gas-defaults';
import type { GasAnalysisSettings, GasOptions, GasResult, GasRow, GasSample, Paco2Temperature } from './gas-types';
import { paco2Basis, type Paco2Basis } from './paco2-basis';
import { median as finiteMedian } from '../numeric/stats';
import { selectWindowBreaths } from './select-window-breaths';
import { shuntPart, type ShuntPart, type ShuntSettings } from './shunt-part';
import { chooseWeight, type WeightChoice } from './weight-basis';

const BREATH_FIELDS = ['petco2_mmhg', 'peco2_mmhg', 'vt_exp_ml', 'vd_aw_ml', 'vdvt_bohr'] as const;

/** Window medians of the breath fields a gas row uses. */
type BreathMedians = Record<(typeof BREATH_FIELDS)[number], number>;

function fmt(v: number, digits = 1): string {
  return Number.isFinite(v) ? v.toFixed(digits) : 'n/a';
}


/** Everything the per-sample step reads, resolved once for the whole analysis. */
interface SampleContext {
  breaths: readonly BreathRow[];
  windowS: number;
  gradientChangeMmhg: number;
  analysis: GasAnalysisSettings;
  shuntSettings: ShuntSettings;
  weight: WeightChoice;
  paco2Temperature: Paco2Temperature;
  splitAlveolar: 'paeco2' | 'alv_co2' | 'petco2';
}

/** What the per-sample step carries from one sample to the next and collects for the whole analysis. */
interface SampleTally {
  warnings: string[];
  /** numbers of the samples whose shunt part assumed the default P(v-a)CO2 */
  defaultPvco2Samples: number[];
  /** numbers of the samples whose gradient used PaCO2 corrected to temp_c */
  correctedSamples: number[];
  /** gradient of the last sample that had one (NaN before the first) and that sample's number */
  previousGradient: number;
  previousSample: number;
}

/** Dead-space values of one sample (all in the units of their names; NaN when an input is missing). */
interface SampleDeadSpace {
  gradient: number;
  enghoff: number;
  vdPhys: number;
  vdAlv: number;
  /** median inspired PCO2 of the window used in the Enghoff equation (0 without the inspired term), mmHg */
  inspired: number;
  /** PaCO2 − the median alveolar PCO2 of the split (split_alveolar), mmHg */
  gradientAlv: number;
}

/** The shunt settings of the options, with the defaults of GAS_DEFAULTS filled in. */
function resolveShuntSettings(opts: GasOptions): ShuntSettings {
  const d = GAS_DEFAULTS;
  return {
    pb_mmhg: opts.pb_mmhg,
    rq: opts.rq ?? d.rq.value,
    hb_o2_capacity_ml_per_g: opts.hb_o2_capacity_ml_per_g ?? d.hb_o2_capacity_ml_per_g.value,
    o2_dissolved_ml_per_dl_per_mmhg: opts.o2_dissolved_ml_per_dl_per_mmhg ?? d.o2_dissolved_ml_per_dl_per_mmhg.value,
    end_capillary_saturation: opts.end_capillary_saturation ?? d.end_capillary_saturation.value,
    alveolar_gas_form: opts.alveolar_gas_form ?? d.alveolar_gas_form.value,
    default_pv_a_co2_mmhg: opts.default_pv_a_co2_mmhg ?? d.default_pv_a_co2_mmhg.value,
    cardiac_output_l_min: opts.cardiac_output_l_min ?? null,
    co2_slope_k: opts.co2_slope_k ?? d.co2_slope_k.value,
  };
}

/** Median of each breath field over the breaths of the window (NaN when none has a finite value). */
function windowMedians(used: readonly BreathRow[]): BreathMedians {
  return Object.fromEntries(BREATH_FIELDS.map((f) => [f, finiteMedian(used.map((b) => b[f]))])) as BreathMedians;
}

/**
 * Gradient, Enghoff VD/VT and the physiological and alveolar dead spaces of one sample from the window medians
 * (formulas in the analyseGas comment).
 */
function sampleDeadSpace(paco2: number, used: readonly BreathRow[], med: BreathMedians, analysis: GasAnalysisSettings, split: SampleContext['splitAlveolar']): SampleDeadSpace {
  const gradient = paco2 - med.petco2_mmhg;
  const medianInspired = analysis.inspired_term ? finiteMedian(used.map((b) => b.fico2_mmhg)) : 0;
  const inspired = Number.isFinite(medianInspired) ? medianInspired : 0;
  const enghoffAtSensor = enghoffDeadSpaceFraction(paco2, med.peco2_mmhg, inspired);
  const physiological = patientDeadSpace(enghoffAtSensor, med.vt_exp_ml, analysis.apparatus_ml);
  const vdPhys = physiological.volume_ml;
  const alveolar = split === 'petco2' ? med.petco2_mmhg : finiteMedian(used.map((b) => (split === 'paeco2' ? b.paeco2_mmhg : b.alv_co2_mmhg)));
  return { gradient, enghoff: physiological.fraction, vdPhys, vdAlv: alveolarDeadSpaceMl(vdPhys, med.vd_aw_ml), inspired, gradientAlv: paco2 - alveolar };
}

/** Warnings about a sample's shunt estimate: a fraction outside 0-1 and a measured venous PCO2 below PaCO2. */
function shuntWarnings(label: string, sample: GasSample, shunt: ShuntPart, warnings: string[]): void {
  if (Number.isFinite(shunt.shunt_fraction) && !(shunt.shunt_fraction >= 0 && shunt.shunt_fraction < 1)) {
    warnings.push(
      `${label}: shunt fraction ${fmt(shunt.shunt_fraction, 3)} is outside 0-1; check the saturations, PO2 and FiO2 of this sample`,
    );
  }
  if (shunt.pvco2_source === 'measured' && sample.pvco2_mmhg < sample.paco2_mmhg) {
    warnings.push(`${label}: venous PCO2 ${sample.pvco2_mmhg} mmHg is below PaCO2 ${sample.paco2_mmhg} mmHg; check the samples`);
  }
}

/** Gradient change of one sample versus the previous sample with a gradient, and whether it crossed the flag threshold. */
interface GradientChange {
  change: number;
  changed: boolean;
}

/**
 * Change of the gradient since the previous sample that had one, with a warning when it exceeds the threshold;
 * moves the tally's previous gradient on when this sample has one.
 */
function gradientChange(label: string, number: number, gradient: number, thresholdMmhg: number, tally: SampleTally): GradientChange {
  let change = NaN;
  if (Number.isFinite(gradient) && Number.isFinite(tally.previousGradient)) change = gradient - tally.previousGradient;
  const changed = Math.abs(change) > thresholdMmhg;
  if (changed) {
    tally.warnings.push(
      `${label}: PaCO2-PETCO2 gradient changed by ${change > 0 ? '+' : ''}${fmt(change)} mmHg since sample ${tally.previousSample} ` +
        `(${fmt(tally.previousGradient)} -> ${fmt(gradient)} mmHg; flag threshold ${thresholdMmhg} mmHg)`,
    );
  }
  if (Number.isFinite(gradient)) {
    tally.previousGradient = gradient;
    tally.previousSample = number;
  }
  return { change, changed };
}

/** The parts of one gas row, gathered by analyseSample. */
interface RowParts {
  number: number;
  sample: GasSample;
  paco2: Paco2Basis;
  used: readonly BreathRow[];
  med: BreathMedians;
  dead: SampleDeadSpace;
  weightKg: number;
  apparatusMl: number;
  shunt: ShuntPart;
  change: GradientChange;
  missing: string[];
  notes: string[];
}

/** Assembles the output row of one sample (column order as in GasRow). */
function gasRow(r: RowParts): GasRow {
  const { sample, med, dead, shunt } = r;
  const paco2 = r.paco2.used_mmhg;
  const perKg = (v: number) => perKilogram(v, r.weightKg);
  return {
    sample: r.number,
    line: sample.line,
    time_s: sample.time_s,
    paco2_mmhg: sample.paco2_mmhg,
    breaths_used: r.used.length,
    petco2_mmhg: med.petco2_mmhg,
    peco2_mmhg: med.peco2_mmhg,
    vt_exp_ml: med.vt_exp_ml,
    gradient_mmhg: dead.gradient,
    avdsf: avdsf(paco2, med.petco2_mmhg),
    vdvt_bohr: med.vdvt_bohr,
    vdvt_enghoff: dead.enghoff,
    vdvt_enghoff_shunt_corrected: patientDeadSpace(
      shuntCorrectedEnghoff(paco2, med.peco2_mmhg, shunt.pvco2_mmhg, shunt.shunt_fraction, dead.inspired),
      med.vt_exp_ml,
      r.apparatusMl,
    ).fraction,
    vdvt_difference: dead.enghoff - med.vdvt_bohr,
    vd_aw_ml: med.vd_aw_ml,
    vd_alv_enghoff_ml: dead.vdAlv,
    vd_phys_ml: dead.vdPhys,
    vd_aw_ml_per_kg: perKg(med.vd_aw_ml),
    vd_alv_enghoff_ml_per_kg: perKg(dead.vdAlv),
    vd_phys_ml_per_kg: perKg(dead.vdPhys),
    pao2_alv_mmhg: shunt.pao2_alv_mmhg,
    shunt_fraction: shunt.shunt_fraction,
    shunt_method: shunt.shunt_method,
    pvco2_mmhg: shunt.pvco2_mmhg,
    pvco2_source: shunt.pvco2_source,
    gradient_alv_mmhg: dead.gradientAlv,
    gradient_shunt_mmhg: shunt.gradient_shunt_mmhg,
    gradient_rest_mmhg: dead.gradientAlv - shunt.gradient_shunt_mmhg,
    gradient_change_mmhg: r.change.change,
    gradient_changed: r.change.changed,
    missing_inputs: r.missing.join(';'),
    notes: r.notes.join('; '),
    temp_c: sample.temp_c,
    paco2_corrected_mmhg: r.paco2.corrected_mmhg,
    hb_g_dl: sample.hb_g_dl,
  };
}

/** No shunt estimate (a sample that is not analysed). */
const NO_SHUNT: ShuntPart = {
  pao2_alv_mmhg: NaN, shunt_fraction: NaN, shunt_method: '', pvco2_mmhg: NaN, pvco2_source: '', gradient_shunt_mmhg: NaN, missing: [], notes: [],
};

/**
 * The row of a sample drawn before the recording (time_s < 0): listed with its own values and a note, not matched
 * with breaths (there are none before it), so every derived value is empty and it starts no gradient comparison.
 */
function beforeRecordingRow(sample: GasSample, number: number, label: string, ctx: SampleContext, tally: SampleTally): GasRow {
  const ago = `drawn ${fmt(-sample.time_s)} s before its start`;
  tally.warnings.push(`${label}: before the recording (${ago}); not matched with breaths and not used for per-breath Enghoff values, PaCO2 estimates or events`);
  const med = Object.fromEntries(BREATH_FIELDS.map((f) => [f, NaN])) as BreathMedians;
  const dead: SampleDeadSpace = { gradient: NaN, enghoff: NaN, vdPhys: NaN, vdAlv: NaN, inspired: NaN, gradientAlv: NaN };
  const notes = [`before the recording: ${ago}; not matched with breaths`];
  const paco2 = paco2Basis(sample, ctx.paco2Temperature);
  return gasRow({ number, sample, paco2, used: [], med, dead, weightKg: NaN, apparatusMl: ctx.analysis.apparatus_ml, shunt: NO_SHUNT, change: { change: NaN, changed: false }, missing: [], notes });
}

/** Notes on how the sample's inputs were taken: Hb converted from another unit, PaCO2 at the patient's temperature. */
function inputNotes(sample: GasSample, paco2: Paco2Basis): string[] {
  const notes: string[] = [];
  if (sample.hb_given) notes.push(`Hb ${sample.hb_given.value} ${sample.hb_given.unit} = ${fmt(sample.hb_g_dl, 2)} g/dL`);
  if (!Number.isFinite(sample.temp_c)) return notes;
  const atTemp = `${fmt(sample.temp_c)} °C (${fmt(paco2.corrected_mmhg)} mmHg)`;
  notes.push(
    paco2.corrected
      ? `PaCO2 corrected to ${atTemp} used for the gradient and dead space`
      : `PaCO2 as measured at 37 °C used (paco2_temperature measured); corrected to ${atTemp}`,
  );
  return notes;
}

/** Analyses one blood-gas sample (number is 1-based, in time order): its row, with warnings added to the tally. */
function analyseSample(sample: GasSample, number: number, ctx: SampleContext, tally: SampleTally): GasRow {
  const clock = sample.clock === undefined ? '' : `clock ${sample.clock}, `;
  const label = `gas sample ${number} (line ${sample.line}, ${clock}t = ${fmt(sample.time_s)} s)`;
  if (isBeforeRecording(sample)) return beforeRecordingRow(sample, number, label, ctx, tally);
  const used = selectWindowBreaths(ctx.breaths, sample.time_s, ctx.windowS, ctx.analysis.summary_breaths);
  const med = windowMedians(used);
  const missing: string[] = [];
  const notes: string[] = [];
  if (used.length === 0) {
    missing.push('ok_breaths_in_window');
    tally.warnings.push(`${label}: no ok breaths in the ${ctx.windowS} s before it; breath-based values left empty`);
  } else {
    for (const f of BREATH_FIELDS) if (!Number.isFinite(med[f])) missing.push(`breath.${f}`);
  }
  const paco2 = paco2Basis(sample, ctx.paco2Temperature);
  notes.push(...inputNotes(sample, paco2));
  if (paco2.corrected) tally.correctedSamples.push(number);
  const dead = sampleDeadSpace(paco2.used_mmhg, used, med, ctx.analysis, ctx.splitAlveolar);
  if (ctx.weight.basis === 'none') missing.push('weight_kg');

  const vco2MlPerMin = finiteMedian(used.map((b) => b.vtco2_ml)) * finiteMedian(used.map((b) => b.rr_bpm));
  const shunt = shuntPart(sample, ctx.shuntSettings, vco2MlPerMin, paco2);
  missing.push(...shunt.missing);
  notes.push(...shunt.notes);
  if (shunt.pvco2_source === 'default') tally.defaultPvco2Samples.push(number);
  shuntWarnings(label, sample, shunt, tally.warnings);

  const change = gradientChange(label, number, dead.gradient, ctx.gradientChangeMmhg, tally);
  return gasRow({ number, sample, paco2, used, med, dead, weightKg: ctx.weight.weight_kg, apparatusMl: ctx.analysis.apparatus_ml, shunt, change, missing, notes });
}

/** Inputs of the settings record besides the options themselves. */
interface SettingsParts {
  opts: GasOptions;
  analysis: GasAnalysisSettings;
  shuntSettings: ShuntSettings;
  weight: WeightChoice;
  paco2Temperature: Paco2Temperature;
  splitAlveolar: string;
  windowS: number;
  gradientChangeMmhg: number;
  band: { band_level: number; analyser_sd_mmhg: number; drift_prior_mmhg2_per_h: number };
}

/** The settings record of a gas analysis: every value used, the rules in words and the sources of the defaults. */
function gasSettings(s: SettingsParts): Record<string, unknown> {
  const { opts, analysis, shuntSettings, weight } = s;
  return {
    window_s: s.windowS,
    window_rule: `${analysis.summary_breaths === 'ok_only' ? 'ok breaths' : 'ok and caution breaths'} with t_start_s >= sample time - window_s and t_end_s <= sample time; medians`,
    enghoff_rule: analysis.inspired_term
      ? '(PaCO2 - median PECO2) / (PaCO2 - median PICO2) x median VTe - apparatus, over median VTe'
      : '(PaCO2 - median PECO2) / PaCO2 x median VTe - apparatus, over median VTe',
    vd_phys_rule: 'Enghoff at the sensor x median VTe - apparatus; vd_alv = vd_phys - median VDaw',
    apparatus_ml: analysis.apparatus_ml,
    inspired_term: analysis.inspired_term,
    pb_mmhg: shuntSettings.pb_mmhg,
    rq: shuntSettings.rq,
    hb_o2_capacity_ml_per_g: shuntSettings.hb_o2_capacity_ml_per_g,
    o2_dissolved_ml_per_dl_per_mmhg: shuntSettings.o2_dissolved_ml_per_dl_per_mmhg,
    end_capillary_saturation: shuntSettings.end_capillary_saturation,
    alveolar_gas_form: shuntSettings.alveolar_gas_form,
    default_pv_a_co2_mmhg: shuntSettings.default_pv_a_co2_mmhg,
    cardiac_output_l_min: shuntSettings.cardiac_output_l_min,
    co2_slope_k: shuntSettings.co2_slope_k,
    gradient_change_mmhg: s.gradientChangeMmhg,
    split_alveolar: s.splitAlveolar,
    paco2_temperature: s.paco2Temperature,
    paco2_temperature_rule:
      s.paco2Temperature === 'corrected'
        ? 'with temp_c: PaCO2 x 10^(0.019 (temp_c - 37)) for the gradient, AVDSF, Enghoff and dead spaces (a measured PvCO2 likewise); without temp_c: as measured'
        : 'PaCO2 as measured at 37 °C; paco2_corrected_mmhg reported beside it',
    ...s.band,
    weight_basis: weight.basis,
    weight_used_kg: Number.isFinite(weight.weight_kg) ? weight.weight_kg : null,
    weight_note: weight.note,
    estimate_band: 'prediction interval: estimate +/- z SD, SD^2 = analyser SD^2 + breath-to-breath PETCO2 SD^2 + gradient drift x time since the gas (src/gas/estimate-paco2.ts)',
    sources: Object.fromEntries(Object.entries(GAS_DEFAULTS).map(([k, v]) => [k, v.source])),
    // pb_mmhg is always passed on from the recording settings: given only when it is not their default (the rule the
    // reading report's settings use)
    given: Object.keys(opts)
      .filter((k) => opts[k as keyof GasOptions] !== undefined && (k !== 'pb_mmhg' || opts.pb_mmhg !== DEFAULT_INGEST.pb_mmhg))
      .sort(),
  };
}

/**
 * Blood-gas analysis: matches each blood-gas sample with the ok breaths of the window before it and derives
 * the arterial-end-tidal gradient, dead-space fractions and volumes, venous admixture and the split of the gradient
 * into a shunt part and a dead-space / V/Q part; then estimates PaCO2 between samples (estimatePaco2).
 *
 * Per sample:
 * - window medians (ok and caution breaths, see selectWindowBreaths and usableForSummary) of PETCO2, PĒCO2, VTe, VDaw and per-breath Bohr VD/VT;
 * - PaCO2 = the measured value, or with temp_c and paco2_temperature 'corrected' (the default) the value at the
 *   patient's temperature (paco2Basis, pco2AtTemperature); every PaCO2 below is that one;
 * - gradient = PaCO2 - PETCO2; AVDSF = gradient / PaCO2;
 * - Enghoff at the sensor = (PaCO2 - median PĒCO2)/(PaCO2 - median PICO2), the per-breath function
 *   (enghoffDeadSpaceFraction) with the inspired term when analysis.inspired_term is on (bohr_inspired_term of the breaths);
 * - VDphys = Enghoff at the sensor x median VTe - apparatus volume (patientDeadSpace, as per breath); Enghoff VD/VT =
 *   VDphys / median VTe; VDalv = VDphys - median VDaw (both without the apparatus, so VDalv does not depend on it);
 *   per kg on the chosen weight basis;
 * - shunt fraction and gradient split, see shuntPart; gradient_alv = PaCO2 - the median alveolar PCO2 of the split
 *   (split_alveolar: PĀECO2 by default), gradient_rest = gradient_alv - gradient_shunt (= Pc'CO2 - alveolar PCO2);
 * - gradient change versus the previous sample with a gradient, flagged above the setting.
 * Missing inputs leave NaN cells and are named in missing_inputs; assumptions are named in notes and warnings.
 * `analysis.summary_breaths` (analysis.summary_breaths) picks the breaths of the windows and estimates (usableForSummary).
 */
export function analyseGas(
  breaths: readonly BreathRow[],
  samples: readonly GasSample[],
  opts: GasOptions,
  analysis: GasAnalysisSettings = { apparatus_ml: 0, inspired_term: true },
): GasResult {
  const d = GAS_DEFAULTS;
  const windowS = opts.window_s ?? d.window_s.value;
  const gradientChangeMmhg = opts.gradient_change_mmhg ?? d.gradient_change_mmhg.value;
  const shuntSettings = resolveShuntSettings(opts);
  const weight = chooseWeight(opts);
  const paco2Temperature = opts.paco2_temperature ?? d.paco2_temperature.value;
  const splitAlveolar = opts.split_alveolar ?? d.split_alveolar.value;
  const ctx: SampleContext = { breaths, windowS, gradientChangeMmhg, analysis, shuntSettings, weight, paco2Temperature, splitAlveolar };
  const tally: SampleTally = {
    warnings: [...weight.warnings], defaultPvco2Samples: [], correctedSamples: [], previousGradient: NaN, previousSample: 0,
  };

  const ordered = [...samples].sort((a, b) => a.time_s - b.time_s || a.line - b.line);
  const rows = ordered.map((sample, i) => analyseSample(sample, i + 1, ctx, tally));
  const warnings = tally.warnings;
  if (tally.correctedSamples.length > 0) {
    warnings.push(
      `gas sample(s) ${tally.correctedSamples.join(', ')}: PaCO2 corrected to the patient's temperature (temp_c) for the gradient, AVDSF and dead spaces ` +
        '(setting paco2_temperature corrected); the PaCO2 column shows the value measured at 37 °C, paco2_corrected_mmhg the one used',
    );
  }
  if (tally.defaultPvco2Samples.length > 0) {
    warnings.push(
      `PvCO2 was not measured for gas sample(s) ${tally.defaultPvco2Samples.join(', ')}: the shunt part of the gradient assumes ` +
        `PvCO2 - PaCO2 = ${shuntSettings.default_pv_a_co2_mmhg} mmHg (textbook value; common practice, no source); measure venous PCO2 for a patient-specific split`,
    );
  }
  const band = {
    band_level: opts.band_level ?? d.band_level.value,
    analyser_sd_mmhg: opts.analyser_sd_mmhg ?? d.analyser_sd_mmhg.value,
    drift_prior_mmhg2_per_h: opts.drift_prior_mmhg2_per_h ?? d.drift_prior_mmhg2_per_h.value,
  };
  const settings = gasSettings({ opts, analysis, shuntSettings, weight, paco2Temperature, splitAlveolar, windowS, gradientChangeMmhg, band });
  const estimates = estimatePaco2(breaths, rows, {
    ...band, summary_breaths: analysis.summary_breaths, apparatus_ml: analysis.apparatus_ml, inspired_term: analysis.inspired_term,
  });
  return { rows, estimates, settings, warnings };
}
