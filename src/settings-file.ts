// The settings file (--settings FILE.json): the same keys as src/settings.ts, validated with zod so a study can fix
// its thresholds once. Unknown keys and wrong types are refused with a message naming the key.
//
//   { "ingest": { "co2_unit": "kPa" }, "analysis": { "leak_fraction": 0.1 }, "gas": { "rq": 0.85 },
//     "files": [ { "pattern": "site-b/**", "ingest": { "decimal": ",", "delimiter": ";" } } ] }
//
// `files` patterns are matched in src/batch (file-settings.ts, glob.ts patternMatches): in a batch against each
// recording's path relative to the input folder it was found in.

import { z } from 'zod';
import { SETTING_GROUPS, type Settings } from './settings';
import { trendSettingsSchema } from './trends/settings';

const num = z.number().finite();
const pos = num.positive();
const frac = num.min(0).max(1);
const nullable = <T extends z.ZodTypeAny>(t: T) => t.nullable();

export const ingestSchema = z
  .object({
    delimiter: nullable(z.string().min(1).max(1)),
    decimal: nullable(z.enum(['.', ','])),
    time_col: nullable(z.string().min(1)),
    flow_col: nullable(z.string().min(1)),
    co2_col: nullable(z.string().min(1)),
    time_unit: nullable(z.enum(['s', 'ms', 'clock'])),
    rate_hz: nullable(pos),
    flow_unit: nullable(z.enum(['L/s', 'L/min', 'mL/s'])),
    co2_unit: nullable(z.enum(['mmHg', 'kPa', '%'])),
    pb_mmhg: num.min(300).max(1100),
    co2_percent: z.enum(['ambient', 'dry']),
    expiration: nullable(z.enum(['positive', 'negative'])),
    max_silence_s: pos,
    flow_condition: z.enum(['btps', 'atps', 'atpd']),
    flow_temp_c: num.min(0).max(45),
    encoding: z.enum(['auto', 'utf-8', 'windows-1252']),
  })
  .strict()
  .partial();

export const analysisSchema = z
  .object({
    delay_s: nullable(num.min(0).max(30)),
    response_ms: nullable(num.min(0).max(2000)),
    flow_offset_lps: nullable(num),
    calibration_s: pos,
    flow_threshold_fraction: frac,
    min_volume_fraction: frac,
    min_phase_s: num.min(0),
    petco2_method: z.enum(['line_end', 'last', 'max', 'mean_last']),
    petco2_last_fraction: frac,
    phase3_window: z.enum(['middle_half', 'all', 'middle_half_vd']),
    phase3_level_fraction: frac,
    phase3_low_flow_fraction: frac,
    fowler_limit: z.enum(['end', 'window_start']),
    alveolar_method: z.enum(['phase3_mid', 'mean_alveolar']),
    bohr_inspired_term: z.boolean(),
    apparatus_ml: num.min(0),
    paco2_mmhg: nullable(num.min(5).max(200)),
    body_temp_c: num.min(25).max(45),
    min_phase3_points: z.number().int().min(3),
    min_phase3_ml: num.min(0),
    min_phase3_fraction: frac,
    min_phase3_r2: frac,
    max_phase3_rms_mmhg: pos,
    leak_fraction: frac,
    max_leak_fraction: frac,
    rebreathing_mmhg: num.min(0),
    outlier_mad: pos,
    min_petco2_mmhg: num.min(0),
    max_co2_mmhg: pos,
    delay_spread_s: pos,
    quantised_co2_mmhg: pos,
    summary_breaths: z.enum(['ok_and_caution', 'ok_only']),
    max_delay_s: pos,
    min_rate_hz: pos,
  })
  .strict()
  .partial();

/**
 * The constants of the blood-gas analysis (GasOptions of src/gas/gas-types.ts; defaults and their sources in
 * src/gas/gas-defaults.ts). Used by `analyse --gas` and the viewer; the command line's --gas-window and
 * --cardiac-output win over window_s and cardiac_output_l_min here. The ranges refuse typing slips (a percentage for
 * a fraction, kPa for mmHg) and are our choice, no source: they hold the values in use (O2 capacity 1.34-1.39 mL/g,
 * dissolved O2 0.003-0.0031 mL/dL/mmHg, see GAS_DEFAULTS) with a margin.
 */
export const gasSchema = z
  .object({
    window_s: pos.max(3600),
    rq: num.min(0.6).max(1.3),
    hb_o2_capacity_ml_per_g: num.min(1.3).max(1.4),
    o2_dissolved_ml_per_dl_per_mmhg: num.min(0.002).max(0.004),
    end_capillary_saturation: z.enum(['odc', 'one']),
    alveolar_gas_form: z.enum(['full', 'simplified']),
    default_pv_a_co2_mmhg: num.min(0).max(20),
    cardiac_output_l_min: pos.max(40),
    co2_slope_k: pos.max(2),
    gradient_change_mmhg: pos.max(50),
    band_level: num.gt(0.5).max(0.999),
    analyser_sd_mmhg: num.min(0).max(10),
    drift_prior_mmhg2_per_h: num.min(0).max(100),
    paco2_temperature: z.enum(['corrected', 'measured']),
    split_alveolar: z.enum(['paeco2', 'alv_co2', 'petco2']),
  })
  .strict()
  .partial();

/** The `gas` section of a settings file (every key optional). */
export type GasFileSettings = z.infer<typeof gasSchema>;

export const settingsFileSchema = z
  .object({
    ingest: ingestSchema.optional(),
    analysis: analysisSchema.optional(),
    events: trendSettingsSchema.optional(),
    gas: gasSchema.optional(),
    files: z
      .array(
        z.object({ pattern: z.string().min(1), ingest: ingestSchema.optional(), analysis: analysisSchema.optional(), gas: gasSchema.optional() }).strict(),
      )
      .optional(),
  })
  .strict();

export type SettingsFile = z.infer<typeof settingsFileSchema>;

export class SettingsError extends Error {}

/** Parses and validates a settings file; throws SettingsError with a one-line message naming the key. */
export function parseSettingsFile(text: string, fileName: string): SettingsFile {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new SettingsError(`${fileName}: not valid JSON (${(e as Error).message}). Fix the file or export it again.`);
  }
  const r = settingsFileSchema.safeParse(json);
  if (!r.success) {
    const issue = r.error.issues[0]!;
    const where = issue.path.length ? issue.path.join('.') : '(top level)';
    throw new SettingsError(`${fileName}: setting ${where}: ${issue.message}. See the settings table in docs/manual.md.`);
  }
  return r.data;
}

/** Applies a partial settings group on top of settings, recording the dotted keys as given. */
export function applySettings(
  target: Settings,
  patch: { ingest?: Partial<Settings['ingest']>; analysis?: Partial<Settings['analysis']>; events?: Partial<Settings['events']> },
  given: Set<string>,
): void {
  for (const group of SETTING_GROUPS) {
    const p = patch[group];
    if (!p) continue;
    for (const [k, v] of Object.entries(p)) {
      if (v === undefined) continue;
      (target[group] as unknown as Record<string, unknown>)[k] = v;
      given.add(`${group}.${k}`);
    }
  }
}
