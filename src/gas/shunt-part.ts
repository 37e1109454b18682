import { alveolarGasPao2 } from '../physiology/alveolar-gas-pao2';
import { oxygenContent, type OxygenContentConstants } from '../physiology/oxygen-content';
import { severinghausPo2, severinghausSaturation } from '../physiology/severinghaus-saturation';
import { shuntCo2Effect } from '../physiology/shunt-co2-effect';
import { shuntFractionFromContents } from '../physiology/shunt-fraction-from-contents';
import { shuntFractionFromSaturations } from '../physiology/shunt-fraction-from-saturations';
import type { GasRow, GasSample } from './gas-types';
import { paco2Basis, type Paco2Basis } from './paco2-basis';

/** Resolved settings the shunt part needs (defaults already applied). */
export interface ShuntSettings {
  pb_mmhg: number;
  rq: number;
  hb_o2_capacity_ml_per_g: number;
  o2_dissolved_ml_per_dl_per_mmhg: number;
  end_capillary_saturation: 'one' | 'odc';
  alveolar_gas_form: 'full' | 'simplified';
  default_pv_a_co2_mmhg: number;
  cardiac_output_l_min: number | null;
  co2_slope_k: number;
}

/** The shunt columns of a gas row, with the inputs that were missing and notes on assumptions. */
export type ShuntPart = Pick<GasRow, 'pao2_alv_mmhg' | 'shunt_fraction' | 'shunt_method' | 'pvco2_mmhg' | 'pvco2_source' | 'gradient_shunt_mmhg'> & {
  missing: string[];
  notes: string[];
};

const has = (v: number) => Number.isFinite(v);

/** O2 content constants of the settings, in the form oxygenContent takes. */
function contentConstants(settings: ShuntSettings): OxygenContentConstants {
  return {
    hbO2CapacityMlPerG: settings.hb_o2_capacity_ml_per_g,
    dissolvedO2MlPerDlPerMmhg: settings.o2_dissolved_ml_per_dl_per_mmhg,
  };
}

/** Alveolar PO2 of the sample by the alveolar gas equation (needs fio2_pct; NaN without it). */
function alveolarPo2(sample: GasSample, settings: ShuntSettings): number {
  if (!has(sample.fio2_pct)) return NaN;
  return alveolarGasPao2({
    fio2: sample.fio2_pct / 100,
    pbMmhg: settings.pb_mmhg,
    paco2Mmhg: sample.paco2_mmhg,
    rq: settings.rq,
    form: settings.alveolar_gas_form,
  });
}

/** End-capillary O2 saturation: 1.0, or the Severinghaus curve at PAO2 when that option is on and PAO2 is known. */
function endCapillarySaturation(settings: ShuntSettings, pao2AlvMmhg: number, notes: string[]): number {
  if (settings.end_capillary_saturation !== 'odc') {
    notes.push("Sc'O2 assumed 1.0");
    return 1;
  }
  if (!has(pao2AlvMmhg)) {
    notes.push("Sc'O2 assumed 1.0 (fio2_pct missing, so no PAO2 for the dissociation curve)");
    return 1;
  }
  const saturation = severinghausSaturation(pao2AlvMmhg);
  notes.push(`Sc'O2 ${saturation.toFixed(4)} from the Severinghaus curve at PAO2`);
  return saturation;
}

/**
 * Sets the shunt fraction and method: from O2 contents when no content input is missing, else from the saturations
 * alone (the saturations themselves must be present).
 */
function setShuntFraction(
  out: ShuntPart,
  sample: GasSample,
  settings: ShuntSettings,
  endCapillary: number,
  missingContent: readonly string[],
): void {
  const sa = sample.sao2_pct / 100;
  const sv = sample.svo2_pct / 100;
  if (missingContent.length > 0) {
    out.shunt_fraction = shuntFractionFromSaturations(endCapillary, sa, sv);
    out.shunt_method = 'saturations';
    out.notes.push(`shunt from saturations only, dissolved O2 neglected (${missingContent.join(', ')} missing)`);
    return;
  }
  let pvo2 = sample.pvo2_mmhg;
  if (!has(pvo2)) {
    pvo2 = severinghausPo2(sv);
    out.notes.push(`venous PO2 ${pvo2.toFixed(1)} mmHg estimated from SvO2 with the Severinghaus curve`);
  }
  const constants = contentConstants(settings);
  const cc = oxygenContent(sample.hb_g_dl, endCapillary, out.pao2_alv_mmhg, constants);
  const ca = oxygenContent(sample.hb_g_dl, sa, sample.pao2_mmhg, constants);
  const cv = oxygenContent(sample.hb_g_dl, sv, pvo2, constants);
  out.shunt_fraction = shuntFractionFromContents(cc, ca, cv);
  out.shunt_method = 'contents';
}

/**
 * Sets PvCO2, its source and the shunt part of the gradient for a known shunt fraction: from a measured PvCO2, else
 * by the Fick route when a cardiac output and V'CO2 are known, else from the default P(v-a)CO2.
 */
function setShuntGradient(out: ShuntPart, sample: GasSample, settings: ShuntSettings, vco2MlPerMin: number, paco2: Paco2Basis): void {
  const s = out.shunt_fraction;
  if (has(sample.pvco2_mmhg)) {
    out.pvco2_mmhg = paco2.onBasis(sample.pvco2_mmhg);
    out.pvco2_source = 'measured';
    out.gradient_shunt_mmhg = shuntCo2Effect({
      route: 'venous_arterial',
      shuntFraction: s,
      venousMinusArterialMmhg: out.pvco2_mmhg - paco2.used_mmhg,
    });
    return;
  }
  out.missing.push('pvco2_mmhg');
  if (settings.cardiac_output_l_min !== null && has(vco2MlPerMin)) {
    out.pvco2_source = 'fick';
    out.gradient_shunt_mmhg = shuntCo2Effect({
      route: 'fick',
      shuntFraction: s,
      vco2MlPerMin,
      cardiacOutputLPerMin: settings.cardiac_output_l_min,
      co2SlopeMlPerDlPerMmhg: settings.co2_slope_k,
    });
    out.notes.push(
      `shunt part by the Fick route: V'CO2 ${vco2MlPerMin.toFixed(0)} mL/min, cardiac output ${settings.cardiac_output_l_min} L/min, k ${settings.co2_slope_k}`,
    );
    return;
  }
  out.pvco2_mmhg = paco2.used_mmhg + settings.default_pv_a_co2_mmhg;
  out.pvco2_source = 'default';
  out.gradient_shunt_mmhg = shuntCo2Effect({
    route: 'venous_arterial',
    shuntFraction: s,
    venousMinusArterialMmhg: settings.default_pv_a_co2_mmhg,
  });
  out.notes.push(`PvCO2 not measured: assumed PaCO2 + ${settings.default_pv_a_co2_mmhg} mmHg`);
}

/**
 * Venous admixture of one blood-gas sample and the part of the CO2 gradient it explains.
 *
 * Shunt fraction (Berggren 1942, see shuntFractionFromContents):
 * - 'contents' when PaO2, SaO2, SvO2, Hb and FiO2 are present: Qs/Qt = (Cc'O2 - CaO2)/(Cc'O2 - CvO2), contents
 *   k_Hb * Hb * S + c * PO2; PAO2 from the alveolar gas equation (full or simplified, R setting); Sc'O2 = 1.0 or
 *   Severinghaus(PAO2); venous PO2 from pvo2_mmhg, else from SvO2 by inverting the Severinghaus curve.
 * - 'saturations' when SaO2 and SvO2 are present but a content input is missing (PO2 terms neglected):
 *   Qs/Qt ~ (Sc'O2 - SaO2)/(Sc'O2 - SvO2) with Sc'O2 = 1.0 (or Severinghaus(PAO2) when the ODC option is on and
 *   PAO2 can be computed).
 * Shunt part of the gradient (shuntCo2Effect), PaCO2 - Pc'CO2 ~ s/(1 - s) * (PvCO2 - PaCO2), with PvCO2 measured;
 * else, when a cardiac output is given, the Fick route s * V'CO2 / (k * Q' * (1 - s)) with V'CO2 from the breaths;
 * else PvCO2 = PaCO2 + the default P(v-a)CO2 (textbook value; common practice, no source).
 *
 * The CO2 side uses the PaCO2 of the gradient (paco2Basis: at the patient's temperature when corrected, with a measured
 * PvCO2 corrected alike); the O2 side (PAO2, contents, saturations) uses the values as measured at 37 deg C.
 *
 * @param vco2MlPerMin CO2 elimination from the window breaths (for the Fick route), NaN if unknown
 * @param paco2 the PaCO2 basis of the sample (default: as measured)
 */
export function shuntPart(
  sample: GasSample, settings: ShuntSettings, vco2MlPerMin: number, paco2: Paco2Basis = paco2Basis(sample, 'measured'),
): ShuntPart {
  const missing: string[] = [];
  const notes: string[] = [];
  const out: ShuntPart = {
    pao2_alv_mmhg: alveolarPo2(sample, settings),
    shunt_fraction: NaN,
    shunt_method: '',
    pvco2_mmhg: NaN,
    pvco2_source: '',
    gradient_shunt_mmhg: NaN,
    missing,
    notes,
  };
  const endCapillary = endCapillarySaturation(settings, out.pao2_alv_mmhg, notes);

  for (const name of ['sao2_pct', 'svo2_pct'] as const) if (!has(sample[name])) missing.push(name);
  const contentInputs = ['pao2_mmhg', 'hb_g_dl', 'fio2_pct'] as const;
  const missingContent = contentInputs.filter((name) => !has(sample[name]));
  missing.push(...missingContent);
  if (missing.length > missingContent.length) return out; // no saturations: no shunt estimate at all

  setShuntFraction(out, sample, settings, endCapillary, missingContent);
  if (!has(out.shunt_fraction)) return out;
  setShuntGradient(out, sample, settings, vco2MlPerMin, paco2);
  return out;
}
