// Options shared by `analyse` and `batch`: every one maps to a setting in src/settings.ts.
import { readFileSync, existsSync } from 'node:fs';
import { type Command, InvalidArgumentError, Option } from 'commander';
import { defaultSettings, type Settings } from '../settings.js';
import { applySettings, parseSettingsFile, SettingsError, type SettingsFile } from '../settings-file.js';

function number(name: string) {
  return (v: string) => {
    const x = Number(v);
    if (!Number.isFinite(x)) throw new InvalidArgumentError(`${name} needs a number, got "${v}"`);
    return x;
  };
}

export function addInputOptions(cmd: Command): Command {
  return cmd
    .option('--settings <file>', 'settings file (JSON) holding any of the settings; options given here win')
    .option('--delimiter <char>', 'field delimiter: , ; or tab (default: detect)')
    .addOption(new Option('--decimal <mark>', 'decimal mark (default: detect)').choices(['.', ',']))
    .option('--time-col <name>', 'time column name (default: detect)')
    .option('--flow-col <name>', 'flow column name (default: detect)')
    .option('--co2-col <name>', 'CO2 column name (default: detect)')
    .addOption(new Option('--time-unit <unit>', 'time column unit').choices(['s', 'ms', 'clock']))
    .option('--rate <hz>', 'sampling rate when the file has no time column', number('--rate'))
    .addOption(new Option('--flow-unit <unit>', 'flow unit (default: from header or values)').choices(['L/s', 'L/min', 'mL/s']))
    .addOption(new Option('--co2-unit <unit>', 'CO2 unit (default: from header or values)').choices(['mmHg', 'kPa', '%']))
    .option('--pb <mmhg>', 'barometric pressure for % CO2, mmHg (default 760)', number('--pb'))
    .addOption(new Option('--co2-percent <basis>', '% CO2 basis: ambient (F x PB) or dry (F x (PB - 47))').choices(['ambient', 'dry']))
    .addOption(new Option('--flow-condition <c>', 'gas condition of the flow sensor: btps (default, no conversion), atps or atpd').choices(['btps', 'atps', 'atpd']))
    .option('--flow-temp <celsius>', 'gas temperature at the flow sensor for atps/atpd (default 22)', number('--flow-temp'))
    .addOption(new Option('--expiration <sign>', 'sign of expiratory flow in the file (default: infer)').choices(['positive', 'negative']))
    .option('--delay <s>', 'CO2-to-flow transport delay in seconds (default: estimate)', number('--delay'))
    .option('--response-ms <ms>', 'CO2 sensor time constant in ms (default: estimate)', number('--response-ms'))
    .option('--paco2 <mmhg>', 'arterial PCO2 for Enghoff dead space, mmHg', number('--paco2'))
    .option('--apparatus-ml <ml>', 'apparatus volume between sensor and patient to subtract from airway dead space', number('--apparatus-ml'))
    .addOption(new Option('--petco2 <method>', 'end-tidal definition').choices(['line_end', 'last', 'max', 'mean_last']));
}

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
  return { settings, given, file };
}
