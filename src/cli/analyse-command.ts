// `phasewise analyse FILE --out DIR`: one recording -> breaths.csv, summary.json (+ gas.csv and paco2_estimates.csv
// with --gas) and a terminal summary.
import type { Command } from 'commander';
import { analyseFile } from '../node/analyse-file.js';
import { writeFileAtomic } from '../node/atomic-write.js';
import { formatNumber } from '../report/format.js';
import { composeOutputs, outputFile, outputNames } from '../report/outputs.js';
import { formatSummaryText } from '../report/summary.js';
import { formatEventLine } from '../trends/index.js';
import type { GasResult } from '../gas/index.js';
import { addGasOptions, gasOptionsFrom, readGasFile } from './gas-step.js';
import { join, resolve } from 'node:path';
import { recordingId } from '../batch/expand-inputs.js';
import { settingsForRecording, settingsPlan } from '../batch/file-settings.js';
import { addInputOptions } from './options.js';

export function registerAnalyse(program: Command): void {
  const cmd = program
    .command('analyse')
    .alias('analyze')
    .description('decompose every breath of one flow + CO2 recording and write breaths.csv and summary.json')
    .argument('<file>', 'recording: a text table with time, flow and CO2 columns')
    .requiredOption('--out <dir>', 'output folder')
    .option('--json', 'print summary.json to the terminal instead of the table')
    .option('--quiet', 'print nothing on success');
  addGasOptions(addInputOptions(cmd)).action(async (file: string, opts: Record<string, unknown>) => {
    // the same settings resolution as batch: defaults < settings file < its matching `files` patterns < options
    const rec = settingsForRecording(settingsPlan(opts), recordingId(resolve(file), process.cwd()));
    const settings = rec.settings;
    const given = new Set(rec.given);
    const gas = readGasFile(opts); // read first: a bad gas file fails before the long analysis
    const result = await analyseFile(file, settings, { read: 'thread' });
    const out = String(opts.out);
    const gasInput = gas ? { file: String(opts.gas), ...gas } : null;
    const o = composeOutputs(result.core, result.report, settings, given, new Map(), gasInput, gasOptionsFrom(opts, settings));
    const written: string[] = [];
    for (const name of outputNames(o)) {
      writeFileAtomic(join(out, name), outputFile(o, name)!);
      written.push(join(out, name));
    }
    if (opts.quiet) return;
    if (opts.json) {
      process.stdout.write(JSON.stringify(o.summary, null, 2) + '\n');
      return;
    }
    let text = formatSummaryText(o.summary);
    if (o.gas) text = insertBeforeCaution(text, formatGasText(o.gas));
    text = insertBeforeCaution(
      text,
      o.events.length ? ['events (patterns in the data, not diagnoses):', ...o.events.map((e) => `  ${formatEventLine(e)}`)].join('\n') : 'events: none detected',
    );
    process.stdout.write(text + `\n\nwritten: ${written.join(', ')}\n`);
  });
}

function insertBeforeCaution(text: string, block: string): string {
  const i = text.lastIndexOf('\nCAUTION:');
  return i < 0 ? `${text}\n${block}` : `${text.slice(0, i)}\n${block}\n${text.slice(i)}`;
}

function formatGasText(g: GasResult): string {
  const f = (x: number, d = 1) => (Number.isFinite(x) ? formatNumber(Number(x.toFixed(d))) : '—');
  const lines = ['blood gases (median of ok breaths in the window before each sample):'];
  lines.push(
    `${'t (s)'.padStart(8)}${'PaCO2'.padStart(8)}${'PETCO2'.padStart(8)}${'Pa-ET'.padStart(8)}${'AVDSF'.padStart(8)}${'Bohr'.padStart(7)}${'Enghoff'.padStart(9)}${'shunt'.padStart(7)}${'by shunt'.padStart(10)}${'rest'.padStart(7)}  n`,
  );
  for (const r of g.rows) {
    lines.push(
      `${f(r.time_s, 0).padStart(8)}${f(r.paco2_mmhg).padStart(8)}${f(r.petco2_mmhg).padStart(8)}${f(r.gradient_mmhg).padStart(8)}${f(r.avdsf, 3).padStart(8)}` +
        `${f(r.vdvt_bohr, 3).padStart(7)}${f(r.vdvt_enghoff, 3).padStart(9)}${f(r.shunt_fraction, 2).padStart(7)}${f(r.gradient_shunt_mmhg).padStart(10)}` +
        `${f(r.gradient_rest_mmhg).padStart(7)}  ${r.breaths_used}${r.gradient_changed ? '  gradient changed' : ''}`,
    );
  }
  for (const w of g.warnings) lines.push(`gas note: ${w}`);
  return lines.join('\n');
}
