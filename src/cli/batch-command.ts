// `phasewise batch INPUTS... --out DIR [--settings FILE.json] [--jobs N] [--resume] [--shard I/N]` and
// `phasewise batch merge SHARD_DIR... --out DIR`; `batch slurm` (the job scripts of a cluster run) is slurm-command.ts.
// Exit codes: 0 all recordings analysed; 4 some failed (the rest are complete and the manifest names each failure);
// 2 usage (bad options, no inputs, shards that do not fit together); 130 stopped by Ctrl-C (SIGINT), 143 by SIGTERM
// (128 + the signal number, common practice, no source): the recordings in flight finish, the manifest names what is
// complete, and a second signal exits at once.
import { CAUTION } from '../report/caution';
import { availableParallelism } from 'node:os';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { type Command, InvalidArgumentError } from 'commander';
import { EXIT_CODES } from '../ingest/errors';
import { settingsPlan } from '../batch/file-settings';
import { mergeShards, MergeError } from '../batch/merge';
import { BatchUsageError, runBatch } from '../batch/run-batch';
import { parseShard, ShardError } from '../batch/shard';
import { shellQuote } from '../batch/slurm';
import { MANIFEST_FILE, type Manifest } from '../batch/manifest';
import { STUDY_INDEX_FILE } from '../batch/study-index';
import { STUDY_TABLES } from '../batch/tables';
import { addInputOptions } from './options';
import { registerSlurm } from './slurm-command';

function positiveInt(v: string): number {
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1) throw new InvalidArgumentError(`--jobs needs a whole number of at least 1, got "${v}"`);
  return n;
}

/** Exit codes of a batch stopped by a signal: 128 + the signal number (common practice, no source). */
export const BATCH_EXIT_SIGNAL = { SIGINT: 130, SIGTERM: 143 } as const;

/**
 * Listens for Ctrl-C and SIGTERM while a batch runs: the first aborts the returned signal (the batch stops after the
 * recordings in flight), a second exits at once (outputs and the manifest are written atomically, so nothing is left
 * half-written; the manifest is then the one written last). `received()` is the first signal, `release()` stops listening.
 */
function listenForStop(): { stop: AbortSignal; received: () => keyof typeof BATCH_EXIT_SIGNAL | null; release: () => void } {
  const controller = new AbortController();
  let first: keyof typeof BATCH_EXIT_SIGNAL | null = null;
  const on = (sig: keyof typeof BATCH_EXIT_SIGNAL) => () => {
    if (first) process.exit(BATCH_EXIT_SIGNAL[sig]);
    first = sig;
    process.stderr.write(`\nphasewise batch: ${sig} received, finishing the recordings in flight (again to exit at once)\n`);
    controller.abort();
  };
  const onInt = on('SIGINT');
  const onTerm = on('SIGTERM');
  process.on('SIGINT', onInt);
  process.on('SIGTERM', onTerm);
  return {
    stop: controller.signal,
    received: () => first,
    release: () => {
      process.off('SIGINT', onInt);
      process.off('SIGTERM', onTerm);
    },
  };
}

function usage(message: string): void {
  process.stderr.write(`phasewise batch: ${message}\n`);
  process.exitCode = EXIT_CODES.usage;
}

function listFailures(m: Manifest, out: string): void {
  const failed = m.inputs.filter((e) => e.status === 'failed');
  if (failed.length) {
    process.stderr.write(`${failed.length} recording(s) failed (details in ${join(out, MANIFEST_FILE)} and recordings.csv):\n`);
    for (const e of failed) process.stderr.write(`  ${e.recording}: [${e.error?.code}] ${e.error?.message}\n`);
  }
}

function report(m: Manifest, out: string, quiet: boolean): void {
  listFailures(m, out);
  if (quiet) return;
  const c = m.counts;
  process.stdout.write(
    `batch: ${m.inputs.length} recording(s): ${c.ok} ok (${c.resumed} kept from an earlier run), ${c.failed} failed` +
      (m.elapsed_s === null ? '' : m.merged_from.length ? ` (merged from ${m.merged_from.length} shard folder(s))` : ` in ${m.elapsed_s} s`) +
      `\nwritten: ${[...STUDY_TABLES, MANIFEST_FILE].map((f) => join(out, f)).join(', ')}\n` +
      // with --report (a run or a merge without it removes a stale one)
      (existsSync(join(out, STUDY_INDEX_FILE)) ? `study index: ${join(out, STUDY_INDEX_FILE)} (open it in a browser)\n` : '') +
      `CAUTION: ${CAUTION}\n`,
  );
}

/** The command as it could be typed again (recorded in the manifest). */
function commandLine(inputs: readonly string[], opts: Record<string, unknown>): string {
  const parts = ['phasewise', 'batch', ...inputs.map(shellQuote)];
  for (const [k, v] of Object.entries(opts)) {
    if (v === undefined || v === false) continue;
    const flag = '--' + k.replace(/[A-Z]/g, (c) => '-' + c.toLowerCase());
    parts.push(v === true ? flag : `${flag} ${shellQuote(String(v))}`);
  }
  return parts.join(' ');
}

/** Adds `batch` and `batch merge` to the program. */
export function registerBatch(program: Command): void {
  const cmd = program
    .command('batch')
    .description('analyse many recordings (files, folders, globs) into one breaths table, one recordings table and a manifest')
    .argument('<inputs...>', 'recording files, folders (searched for .csv, .tsv, .txt, .edf, .bdf, .hea) or quoted globs like "data/**/*.csv"')
    // not requiredOption: Commander would then demand it of `batch merge` too (it checks ancestors' options)
    .option('--out <dir>', 'output folder (required)')
    .option('--jobs <n>', 'threads to use: lanes of an analysis thread and a reader thread when most bytes are in recordings of 4 MB or more, else N - 1 lanes (at least one) that read their own files (default: number of cores)', positiveInt)
    .option('--report', 'also write report.html (one self-contained page, as `analyse --report`) in each recording folder and index.html, the study index linking them')
    .option('--resume', 'keep results whose input content and settings are unchanged since the manifest in --out')
    .option('--shard <I/N>', 'analyse only shard I of N (0-based; input k goes to shard k mod N); see `batch merge`')
    .option('--quiet', 'no progress and no closing summary (failures are still listed on stderr)');
  addInputOptions(cmd).action(async (inputs: string[], opts: Record<string, unknown>) => {
    try {
      if (typeof opts.out !== 'string') return usage(`missing --out DIR (the output folder), e.g. phasewise batch ${inputs[0] ?? 'data/'} --out results/`);
      const shard = typeof opts.shard === 'string' ? parseShard(opts.shard) : null;
      const plan = settingsPlan(opts);
      const quiet = Boolean(opts.quiet);
      const out = String(opts.out);
      const signals = listenForStop();
      const outcome = await runBatch({
        inputs, outDir: out, plan, shard,
        jobs: (opts.jobs as number | undefined) ?? availableParallelism(),
        resume: Boolean(opts.resume),
        report: Boolean(opts.report),
        progress: quiet ? 'none' : process.stderr.isTTY ? 'bar' : 'lines',
        command: commandLine(inputs, opts),
        onWarning: (w) => process.stderr.write(`phasewise batch: warning: ${w}\n`),
        stop: signals.stop,
      }).finally(signals.release);
      const sig = signals.received();
      if (outcome.interrupted && sig) {
        listFailures(outcome.manifest, out);
        const { complete, total } = outcome.interrupted;
        process.stderr.write(`interrupted after ${complete} of ${total} recordings — rerun the same command with --resume to finish\n`);
        process.exitCode = BATCH_EXIT_SIGNAL[sig];
        return;
      }
      report(outcome.manifest, out, quiet);
      process.exitCode = outcome.exitCode;
    } catch (e) {
      if (e instanceof ShardError || e instanceof BatchUsageError) return usage(e.message);
      throw e;
    }
  });
  registerSlurm(cmd);
  // `batch merge`: the root program parses options anywhere on the line, so `--out` and `--quiet` written after
  // `merge` may land on `batch` itself; read them from either.
  cmd
    .command('merge')
    .description('combine the output folders of `batch --shard I/N` runs into the tables one run would write')
    .argument('<shard_dirs...>', 'output folders of the shard runs')
    .option('--out <dir>', 'output folder for the merged tables (required)')
    .option('--quiet', 'no closing summary')
    .action((dirs: string[], own: { out?: string; quiet?: boolean }, self: Command) => {
      const parent = (self.parent?.opts() ?? {}) as { out?: string; quiet?: boolean };
      const out = own.out ?? parent.out;
      if (typeof out !== 'string') return usage('merge: missing --out DIR (the folder for the merged tables)');
      try {
        const outcome = mergeShards(dirs, out, ['phasewise', 'batch', 'merge', ...dirs, '--out', out].join(' '));
        report(outcome.manifest, out, Boolean(own.quiet ?? parent.quiet));
        process.exitCode = outcome.exitCode;
      } catch (e) {
        if (e instanceof MergeError) return usage(`merge: ${e.message}`);
        throw e;
      }
    });
}
