// `phasewise analyse FILE --out DIR`: one recording -> breaths.csv, summary.json and a terminal summary.
import { join } from 'node:path';
import type { Command } from 'commander';
import { analyseFile } from '../node/analyse-file.js';
import { writeFileAtomic } from '../node/atomic-write.js';
import { breathsCsv } from '../report/breaths-csv.js';
import { formatSummaryText } from '../report/summary.js';
import { addInputOptions, resolveSettings } from './options.js';

export function registerAnalyse(program: Command): void {
  const cmd = program
    .command('analyse')
    .alias('analyze')
    .description('decompose every breath of one flow + CO2 recording and write breaths.csv and summary.json')
    .argument('<file>', 'recording: a text table with time, flow and CO2 columns')
    .requiredOption('--out <dir>', 'output folder')
    .option('--json', 'print summary.json to the terminal instead of the table')
    .option('--quiet', 'print nothing on success');
  addInputOptions(cmd).action(async (file: string, opts: Record<string, unknown>) => {
    const { settings, given } = resolveSettings(opts);
    const result = await analyseFile(file, settings, given);
    const out = String(opts.out);
    writeFileAtomic(join(out, 'breaths.csv'), breathsCsv(result.core.breaths));
    writeFileAtomic(join(out, 'summary.json'), JSON.stringify(result.summary, null, 2) + '\n');
    if (opts.quiet) return;
    if (opts.json) process.stdout.write(JSON.stringify(result.summary, null, 2) + '\n');
    else process.stdout.write(formatSummaryText(result.summary) + `\n\nwritten: ${join(out, 'breaths.csv')}, ${join(out, 'summary.json')}\n`);
  });
}
