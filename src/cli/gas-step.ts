// The blood-gas part of `analyse`: read --gas FILE (or --paco2), apply PaCO2 to the breaths, compute the gas table.
import { existsSync, readFileSync } from 'node:fs';
import type { Command } from 'commander';
import { InvalidArgumentError, Option } from 'commander';
import { placeGasTimes, readGasCsv, type GasOptions, type GasTable } from '../gas/index';
import type { IngestReport } from '../ingest/index';
import type { GasInput } from '../report/outputs';
import { EXIT_CODES } from '../ingest/errors';
import type { Settings } from '../settings';
import type { GasFileSettings } from '../settings-file';
import { CliError } from './errors';

function positive(name: string) {
  return (v: string) => {
    const x = Number(v);
    if (!(x > 0)) throw new InvalidArgumentError(`${name} needs a positive number, got "${v}"`);
    return x;
  };
}

export function addGasOptions(cmd: Command): Command {
  return cmd
    .option('--gas <file>', 'blood gas samples (CSV: time_s or clock, paco2_mmhg, optional pao2_mmhg, sao2_pct, svo2_pct, pvco2_mmhg, hb_g_dl, fio2_pct, temp_c)')
    .option('--start <clock>', "recording start as a clock time, for a gas file with a clock column when the recording's time column holds no clock stamps (e.g. 2026-03-04T10:15:00 or 10:15:00)")
    .option('--weight <kg>', 'body weight, kg (per-kg dead spaces)', positive('--weight'))
    .option('--height <cm>', 'height, cm (adults: predicted body weight with --sex)', positive('--height'))
    .addOption(new Option('--sex <sex>', 'sex for predicted body weight').choices(['male', 'female']))
    .option('--gas-window <s>', 'seconds of ok breaths before each gas sample that are summarised (default 60)', positive('--gas-window'))
    .option('--cardiac-output <l_min>', 'cardiac output, L/min (venous PCO2 by the Fick route when not measured)', positive('--cardiac-output'));
}

/** Reads the gas file before the analysis (one-line errors, exit code 3 for unusable files); clock times are placed
 *  on the recording afterwards (placeGasFile). */
export function readGasFile(opts: Record<string, unknown>): GasTable | null {
  if (typeof opts.gas !== 'string') return null;
  const path = opts.gas;
  if (!existsSync(path)) throw new CliError(`${path}: gas file not found. Check the path given to --gas.`, EXIT_CODES.input);
  try {
    return readGasCsv(readFileSync(path, 'utf8'), path);
  } catch (e) {
    throw new CliError((e as Error).message, EXIT_CODES.input);
  }
}

/** Places the gas file's times on the analysed recording: its own clock, or --start (exit code 3 when neither). */
export function placeGasFile(table: GasTable, opts: Record<string, unknown>, report: IngestReport, durationS: number): GasInput {
  const path = String(opts.gas);
  try {
    const start = typeof opts.start === 'string' ? { start: opts.start } : {};
    const placed = placeGasTimes(table, path, { ...start, recording: { clock_start: report.clock_start ?? null, duration_s: durationS } });
    return { file: path, samples: placed.samples, rejected: placed.rejected, warnings: placed.warnings, clock: placed.clock };
  } catch (e) {
    throw new CliError((e as Error).message, EXIT_CODES.input);
  }
}

/**
 * Options of the gas analysis: the defaults (left to analyseGas), then the settings file's `gas` section (with its
 * matching `files` patterns, settingsForRecording), then the command-line options. Every value set here is listed as
 * given in summary.json (gas.settings.given).
 */
export function gasOptionsFrom(opts: Record<string, unknown>, settings: Settings, fileGas: GasFileSettings = {}): GasOptions {
  // a key of the gas section has its GasOptions type (the compiler checks it; tests/browser/viewer-units.test.ts that
  // the gas section holds exactly the constants of GAS_DEFAULTS and cardiac_output_l_min)
  const o: GasOptions = { pb_mmhg: settings.ingest.pb_mmhg, ...fileGas };
  if (typeof opts.gasWindow === 'number') o.window_s = opts.gasWindow;
  if (typeof opts.weight === 'number') o.weight_kg = opts.weight;
  if (typeof opts.height === 'number') o.height_cm = opts.height;
  if (opts.sex === 'male' || opts.sex === 'female') o.sex = opts.sex;
  if (typeof opts.cardiacOutput === 'number') o.cardiac_output_l_min = opts.cardiacOutput;
  return o;
}
