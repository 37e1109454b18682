// `phasewise analyse FILE --out DIR`: one recording -> breaths.csv, summary.json (+ gas.csv and paco2_estimates.csv
// with --gas, report.html with --report) and a terminal summary.
import type { Command } from 'commander';
import { analyseFile } from '../node/analyse-file';
import { writeFileAtomic } from '../node/atomic-write';
import { gasMetric, type NumericGasKey } from '../metrics/registry';
import { formatNumber } from '../report/format';
import { composeOutputs, outputFile, outputNames, type GasInput } from '../report/outputs';
import { formatSummaryText, type Summary } from '../report/summary';
import { EXIT_CODES } from '../ingest/errors';
import { CliError } from './errors';
import { formatEventLine } from '../trends/index';
import { isBeforeRecording, type GasResult } from '../gas/index';
import { addGasOptions, gasOptionsFrom, placeGasFile, readGasFile } from './gas-step';
import { join, resolve } from 'node:path';
import { recordingId } from '../batch/expand-inputs';
import { settingsForRecording, settingsPlan } from '../batch/file-settings';
import { addInputOptions } from './options';
import { collectReportCurves, reportHtml } from '../report/html/report-html';
import { REPORT_FILE } from '../batch/process-recording';

export function registerAnalyse(program: Command): void {
  const cmd = program
    .command('analyse')
    .alias('analyze')
    .description('decompose every breath of one flow + CO2 recording and write breaths.csv and summary.json')
    .argument('<file>', 'recording: a text table with time, flow and CO2 columns')
    .requiredOption('--out <dir>', 'output folder')
    .option('--json', 'print summary.json to the terminal instead of the table')
    .option('--quiet', 'print nothing on success')
    .option('--report', 'also write report.html: one self-contained page (numbers, breath charts, trends, events, gases, caution), printable on A4');
  addGasOptions(addInputOptions(cmd)).action(async (file: string, opts: Record<string, unknown>) => {
    // the same settings resolution as batch: defaults < settings file < its matching `files` patterns < options;
    // here the patterns are matched against the file's path from the working folder (the gas constants too: rec.gas)
    const rec = settingsForRecording(settingsPlan(opts), [recordingId(resolve(file), process.cwd())]);
    const settings = rec.settings;
    const given = new Set(rec.given);
    const gas = readGasFile(opts); // read first: a bad gas file fails before the long analysis
    const { curves, onBreath } = collectReportCurves(opts.report === true);
    const result = await analyseFile(file, settings, { read: 'thread', onBreath });
    const out = String(opts.out);
    const gasInput = gas ? placeGasFile(gas, opts, result.report, result.core.duration_s) : null;
    const o = composeOutputs(result.core, result.report, settings, given, new Map(), gasInput, gasOptionsFrom(opts, settings, rec.gas));
    const written: string[] = [];
    for (const name of outputNames(o)) {
      writeFileAtomic(join(out, name), outputFile(o, name)!);
      written.push(join(out, name));
    }
    if (opts.report) {
      writeFileAtomic(join(out, REPORT_FILE), reportHtml({ outputs: o, curves }));
      written.push(join(out, REPORT_FILE));
    }
    if (!opts.quiet && opts.json) process.stdout.write(JSON.stringify(o.summary, null, 2) + '\n');
    else if (!opts.quiet) printSummary(o, written, gasInput);
    const nothing = noUsableBreath(file, o.summary.breaths);
    if (nothing) throw new CliError(nothing, EXIT_CODES.input);
  });
}

/**
 * The one-line reason when no breath is usable for the summary (its medians are empty), else null. The outputs are
 * written first so that breaths.csv and summary.json show why.
 */
function noUsableBreath(file: string, b: Summary['breaths']): string | null {
  if (b.ok + b.caution > 0) return null;
  const reasons = Object.entries(b.excluded_by_reason)
    .filter((e): e is [string, number] => typeof e[1] === 'number' && e[1] > 0)
    .map(([k, n]) => `${k} ${n}`)
    .join(', ');
  return (
    `${file}: no breath is usable for the summary (${b.found} found, ${b.excluded} excluded${reasons ? ` (${reasons})` : ''}, ` +
    `${b.partial_not_analysed} partial), so the medians are empty; breaths.csv and summary.json say why: check the flow and CO2 columns and their units`
  );
}

/** The terminal summary: the table, the blood-gas block, the events, the caution and the files written. */
function printSummary(o: ReturnType<typeof composeOutputs>, written: string[], gasInput: Parameters<typeof formatGasText>[1] | null): void {
  let text = formatSummaryText(o.summary);
  if (o.gas && gasInput) text = insertBeforeCaution(text, formatGasText(o.gas, gasInput));
  text = insertBeforeCaution(
    text,
    o.events.length ? ['events (patterns in the data, not diagnoses):', ...o.events.map((e) => `  ${formatEventLine(e)}`)].join('\n') : 'events: none detected',
  );
  process.stdout.write(text + `\n\nwritten: ${written.join(', ')}\n`);
}

function insertBeforeCaution(text: string, block: string): string {
  const i = text.lastIndexOf('\nCAUTION:');
  return i < 0 ? `${text}\n${block}` : `${text.slice(0, i)}\n${block}\n${text.slice(i)}`;
}

/** The terminal's blood-gas table: [gas.csv column, header, width]; decimals from the metric registry. */
const GAS_TERMINAL_COLUMNS: [NumericGasKey, string, number][] = [
  ['time_s', 't (s)', 8], ['paco2_mmhg', 'PaCO2', 8], ['petco2_mmhg', 'PETCO2', 8], ['gradient_mmhg', 'Pa-ET', 8],
  ['avdsf', 'AVDSF', 8], ['vdvt_bohr', 'Bohr', 7], ['vdvt_enghoff', 'Enghoff', 9], ['shunt_fraction', 'shunt', 7],
  ['gradient_alv_mmhg', 'Pa-alv', 8], ['gradient_shunt_mmhg', 'by shunt', 10], ['gradient_rest_mmhg', 'rest', 7],
];

/** The blood-gas block of the terminal: the table, the rows of the gas file that were not used (file and reason),
 *  then the gas notes. */
function formatGasText(g: GasResult, input: Pick<GasInput, 'file' | 'rejected'>): string {
  const f = (x: number, d: number) => (Number.isFinite(x) ? formatNumber(Number(x.toFixed(d))) : '—');
  const lines = ['blood gases (median of ok breaths in the window before each sample):'];
  lines.push(`${GAS_TERMINAL_COLUMNS.map(([, head, width]) => head.padStart(width)).join('')}  n`);
  for (const r of g.rows) {
    const cells = GAS_TERMINAL_COLUMNS.map(([key, , width]) => f(r[key], gasMetric(key).decimals).padStart(width)).join('');
    const mark = isBeforeRecording(r) ? '  before the recording' : r.gradient_changed ? '  gradient changed' : '';
    lines.push(`${cells}  ${r.breaths_used}${mark}`);
  }
  lines.push('  (Pa-ET = PaCO2 - PETCO2; Pa-alv = PaCO2 - mean alveolar expired PCO2 = by shunt + rest; rest = alveolar dead space and V/Q mismatch)');
  for (const r of input.rejected) lines.push(`gas note: ${input.file}: ${r.reason}; row not used`);
  for (const r of g.rows) {
    if (isBeforeRecording(r) || !r.missing_inputs) continue;
    const missing = r.missing_inputs.split(';').filter((m) => m !== 'weight_kg');
    if (missing.length) lines.push(`gas note: sample ${r.sample} (line ${r.line}): missing ${missing.join(', ')}; the values that need them are left empty`);
  }
  for (const w of g.warnings) lines.push(`gas note: ${w}`);
  return lines.join('\n');
}
