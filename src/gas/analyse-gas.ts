import { alveolarDeadSpaceMl } from '../physiology/alveolar-dead-space';
import { avdsf } from '../physiology/avdsf';
import { enghoffDeadSpaceFraction } from '../physiology/enghoff-dead-space-fraction';
import { patientDeadSpace } from '../physiology/patient-dead-space';
import type { BreathRow } from '../types';
import { estimatePaco2 } from './estimate-paco2';
import { GAS_DEFAULTS } from './gas-defaults';
import type { GasAnalysisSettings, GasOptions, GasResult, GasRow, GasSample } from './gas-types';
import { median as finiteMedian } from '../numeric/stats';
import { selectWindowBreaths } from './select-window-breaths';
import { shuntPart, type ShuntSettings } from './shunt-part';
import { chooseWeight } from './weight-basis';

const BREATH_FIELDS = ['petco2_mmhg', 'peco2_mmhg', 'vt_exp_ml', 'vd_aw_ml', 'vdvt_bohr'] as const;

function fmt(v: number, digits = 1): string {
  return Number.isFinite(v) ? v.toFixed(digits) : 'n/a';
}

/**
 * Blood-gas analysis: matches each blood-gas sample with the ok breaths of the window before it and derives
 * the arterial-end-tidal gradient, dead-space fractions and volumes, venous admixture and the split of the gradient
 * into a shunt part and a dead-space / V/Q part; then estimates PaCO2 between samples (estimatePaco2).
 *
 * Per sample:
 * - window medians (ok and caution breaths, see selectWindowBreaths and usableForSummary) of PETCO2, PĒCO2, VTe, VDaw and per-breath Bohr VD/VT;
 * - gradient = PaCO2 - PETCO2; AVDSF = gradient / PaCO2;
 * - Enghoff at the sensor = (PaCO2 - median PĒCO2)/(PaCO2 - median PICO2), the per-breath function
 *   (enghoffDeadSpaceFraction) with the inspired term when analysis.inspired_term is on (bohr_inspired_term of the breaths);
 * - VDphys = Enghoff at the sensor x median VTe - apparatus volume (patientDeadSpace, as per breath); Enghoff VD/VT =
 *   VDphys / median VTe; VDalv = VDphys - median VDaw (both without the apparatus, so VDalv does not depend on it);
 *   per kg on the chosen weight basis;
 * - shunt fraction and gradient split, see shuntPart; gradient_rest = gradient - gradient_shunt;
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
  const singleGasSpread = opts.single_gas_spread_mmhg ?? d.single_gas_spread_mmhg.value;
  const apparatusMl = analysis.apparatus_ml;
  const inspiredTerm = analysis.inspired_term;
  const shuntSettings: ShuntSettings = {
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
  const weight = chooseWeight(opts);
  const warnings: string[] = [...weight.warnings];
  const defaultPvco2Samples: number[] = [];

  const ordered = [...samples].sort((a, b) => a.time_s - b.time_s || a.line - b.line);
  const rows: GasRow[] = [];
  let previousGradient = NaN;
  let previousSample = 0;

  ordered.forEach((sample, i) => {
    const number = i + 1;
    const label = `gas sample ${number} (line ${sample.line}, t = ${fmt(sample.time_s)} s)`;
    const used = selectWindowBreaths(breaths, sample.time_s, windowS, analysis.summary_breaths);
    const med = Object.fromEntries(BREATH_FIELDS.map((f) => [f, finiteMedian(used.map((b) => b[f]))])) as Record<
      (typeof BREATH_FIELDS)[number],
      number
    >;
    const missing: string[] = [];
    const notes: string[] = [];
    if (used.length === 0) {
      missing.push('ok_breaths_in_window');
      warnings.push(`${label}: no ok breaths in the ${windowS} s before it; breath-based values left empty`);
    } else {
      for (const f of BREATH_FIELDS) if (!Number.isFinite(med[f])) missing.push(`breath.${f}`);
    }

    const paco2 = sample.paco2_mmhg;
    const gradient = paco2 - med.petco2_mmhg;
    const inspired = inspiredTerm ? finiteMedian(used.map((b) => b.fico2_mmhg)) : 0;
    const enghoffAtSensor = enghoffDeadSpaceFraction(paco2, med.peco2_mmhg, Number.isFinite(inspired) ? inspired : 0);
    const physiological = patientDeadSpace(enghoffAtSensor, med.vt_exp_ml, apparatusMl);
    const enghoff = physiological.fraction;
    const vdPhys = physiological.volume_ml;
    const vdAlv = alveolarDeadSpaceMl(vdPhys, med.vd_aw_ml);
    const perKg = (v: number) => v / weight.weight_kg;
    if (weight.basis === 'none') missing.push('weight_kg');

    const vco2MlPerMin = finiteMedian(used.map((b) => b.vtco2_ml)) * finiteMedian(used.map((b) => b.rr_bpm));
    const shunt = shuntPart(sample, shuntSettings, vco2MlPerMin);
    missing.push(...shunt.missing);
    notes.push(...shunt.notes);
    if (shunt.pvco2_source === 'default') defaultPvco2Samples.push(number);
    if (Number.isFinite(shunt.shunt_fraction) && !(shunt.shunt_fraction >= 0 && shunt.shunt_fraction < 1)) {
      warnings.push(
        `${label}: shunt fraction ${fmt(shunt.shunt_fraction, 3)} is outside 0-1; check the saturations, PO2 and FiO2 of this sample`,
      );
    }
    if (shunt.pvco2_source === 'measured' && sample.pvco2_mmhg < paco2) {
      warnings.push(`${label}: venous PCO2 ${sample.pvco2_mmhg} mmHg is below PaCO2 ${paco2} mmHg; check the samples`);
    }

    let change = NaN;
    if (Number.isFinite(gradient) && Number.isFinite(previousGradient)) change = gradient - previousGradient;
    const changed = Math.abs(change) > gradientChangeMmhg;
    if (changed) {
      warnings.push(
        `${label}: PaCO2-PETCO2 gradient changed by ${change > 0 ? '+' : ''}${fmt(change)} mmHg since sample ${previousSample} ` +
          `(${fmt(previousGradient)} -> ${fmt(gradient)} mmHg; flag threshold ${gradientChangeMmhg} mmHg)`,
      );
    }
    if (Number.isFinite(gradient)) {
      previousGradient = gradient;
      previousSample = number;
    }

    rows.push({
      sample: number,
      line: sample.line,
      time_s: sample.time_s,
      paco2_mmhg: paco2,
      breaths_used: used.length,
      petco2_mmhg: med.petco2_mmhg,
      peco2_mmhg: med.peco2_mmhg,
      vt_exp_ml: med.vt_exp_ml,
      gradient_mmhg: gradient,
      avdsf: avdsf(paco2, med.petco2_mmhg),
      vdvt_bohr: med.vdvt_bohr,
      vdvt_enghoff: enghoff,
      vdvt_difference: enghoff - med.vdvt_bohr,
      vd_aw_ml: med.vd_aw_ml,
      vd_alv_ml: vdAlv,
      vd_phys_ml: vdPhys,
      vd_aw_ml_per_kg: perKg(med.vd_aw_ml),
      vd_alv_ml_per_kg: perKg(vdAlv),
      vd_phys_ml_per_kg: perKg(vdPhys),
      pao2_alv_mmhg: shunt.pao2_alv_mmhg,
      shunt_fraction: shunt.shunt_fraction,
      shunt_method: shunt.shunt_method,
      pvco2_mmhg: shunt.pvco2_mmhg,
      pvco2_source: shunt.pvco2_source,
      gradient_shunt_mmhg: shunt.gradient_shunt_mmhg,
      gradient_rest_mmhg: gradient - shunt.gradient_shunt_mmhg,
      gradient_change_mmhg: change,
      gradient_changed: changed,
      missing_inputs: missing.join(';'),
      notes: notes.join('; '),
      temp_c: sample.temp_c,
    });
  });

  if (defaultPvco2Samples.length > 0) {
    warnings.push(
      `PvCO2 was not measured for gas sample(s) ${defaultPvco2Samples.join(', ')}: the shunt part of the gradient assumes ` +
        `PvCO2 - PaCO2 = ${shuntSettings.default_pv_a_co2_mmhg} mmHg (textbook value; common practice, no source); measure venous PCO2 for a patient-specific split`,
    );
  }

  const settings: Record<string, unknown> = {
    window_s: windowS,
    window_rule: `${analysis.summary_breaths === 'ok_only' ? 'ok breaths' : 'ok and caution breaths'} with t_start_s >= sample time - window_s and t_end_s <= sample time; medians`,
    enghoff_rule: inspiredTerm
      ? '(PaCO2 - median PECO2) / (PaCO2 - median PICO2) x median VTe - apparatus, over median VTe'
      : '(PaCO2 - median PECO2) / PaCO2 x median VTe - apparatus, over median VTe',
    vd_phys_rule: 'Enghoff at the sensor x median VTe - apparatus; vd_alv = vd_phys - median VDaw',
    apparatus_ml: apparatusMl,
    inspired_term: inspiredTerm,
    pb_mmhg: shuntSettings.pb_mmhg,
    rq: shuntSettings.rq,
    hb_o2_capacity_ml_per_g: shuntSettings.hb_o2_capacity_ml_per_g,
    o2_dissolved_ml_per_dl_per_mmhg: shuntSettings.o2_dissolved_ml_per_dl_per_mmhg,
    end_capillary_saturation: shuntSettings.end_capillary_saturation,
    alveolar_gas_form: shuntSettings.alveolar_gas_form,
    default_pv_a_co2_mmhg: shuntSettings.default_pv_a_co2_mmhg,
    cardiac_output_l_min: shuntSettings.cardiac_output_l_min,
    co2_slope_k: shuntSettings.co2_slope_k,
    gradient_change_mmhg: gradientChangeMmhg,
    single_gas_spread_mmhg: singleGasSpread,
    weight_basis: weight.basis,
    weight_used_kg: Number.isFinite(weight.weight_kg) ? weight.weight_kg : null,
    weight_note: weight.note,
    estimate_band: 'min-max of the gradients observed so far; +/- single_gas_spread_mmhg while only one gas is known',
    sources: Object.fromEntries(Object.entries(GAS_DEFAULTS).map(([k, v]) => [k, v.source])),
    given: Object.keys(opts).filter((k) => opts[k as keyof GasOptions] !== undefined).sort(),
  };

  const estimates = estimatePaco2(breaths, rows, { single_gas_spread_mmhg: singleGasSpread, summary_breaths: analysis.summary_breaths });
  return { rows, estimates, settings, warnings };
}
