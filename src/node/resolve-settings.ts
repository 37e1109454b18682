// Settings of a run from command-line-style options (`analyse` and `batch` take the same ones, src/cli/options.ts):
// defaults, then the settings file given by `settings`, then each option, marked as given. Node-only (reads the file);
// shared by the CLI and batch mode so that batch needs nothing from src/cli.
import { readFileSync, existsSync } from 'node:fs';
import { defaultSettings, givenTimingProblem, type Settings } from '../settings';
import { applySettings, parseSettingsFile, SettingsError, type SettingsFile } from '../settings-file';

export interface ResolvedSettings {
  settings: Settings;
  given: Set<string>;
  file: SettingsFile | null;
}

/** Defaults, then the settings file, then command-line options (each marked as given). */
export function resolveSettings(opts: Record<string, unknown>): ResolvedSettings {
  const settings = defaultSettings();
  const given = new Set<string>();
  let file: SettingsFile | null = null;
  if (typeof opts.settings === 'string') {
    const path = opts.settings;
    if (!existsSync(path)) throw new SettingsError(`${path}: settings file not found. Check the path given to --settings.`);
    file = parseSettingsFile(readFileSync(path, 'utf8'), path);
    applySettings(settings, file, given);
  }
  const ingest: Partial<Settings['ingest']> = {};
  const analysis: Partial<Settings['analysis']> = {};
  const map: [string, 'ingest' | 'analysis', string][] = [
    ['delimiter', 'ingest', 'delimiter'],
    ['decimal', 'ingest', 'decimal'],
    ['timeCol', 'ingest', 'time_col'],
    ['flowCol', 'ingest', 'flow_col'],
    ['co2Col', 'ingest', 'co2_col'],
    ['timeUnit', 'ingest', 'time_unit'],
    ['rate', 'ingest', 'rate_hz'],
    ['flowUnit', 'ingest', 'flow_unit'],
    ['co2Unit', 'ingest', 'co2_unit'],
    ['pb', 'ingest', 'pb_mmhg'],
    ['co2Percent', 'ingest', 'co2_percent'],
    ['expiration', 'ingest', 'expiration'],
    ['flowCondition', 'ingest', 'flow_condition'],
    ['flowTemp', 'ingest', 'flow_temp_c'],
    ['delay', 'analysis', 'delay_s'],
    ['responseMs', 'analysis', 'response_ms'],
    ['paco2', 'analysis', 'paco2_mmhg'],
    ['apparatusMl', 'analysis', 'apparatus_ml'],
    ['petco2', 'analysis', 'petco2_method'],
  ];
  for (const [opt, group, key] of map) {
    let v = opts[opt];
    if (v === undefined) continue;
    if (opt === 'delimiter' && typeof v === 'string') v = v === 'tab' || v === '\\t' ? '\t' : v;
    ((group === 'ingest' ? ingest : analysis) as Record<string, unknown>)[key] = v;
  }
  applySettings(settings, { ingest, analysis }, given);
  const timing = givenTimingProblem(settings.analysis);
  if (timing) throw new SettingsError(timing);
  return { settings, given, file };
}
