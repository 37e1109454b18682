// `phasewise batch slurm INPUTS... --out DIR --shards N [options]`: writes the Slurm job scripts of a study into
// DIR/slurm/ (src/batch/slurm.ts says what each does) and prints the command that submits them. Paths in the scripts
// are absolute, taken now: the inputs, DIR, the settings file, the working folder (recording ids are relative to it,
// as in a `batch` started here), and the node and CLI files of this phasewise, so the jobs run where `phasewise` is
// not on PATH (--phasewise overrides that). The inputs and the settings are checked now, not on the cluster.
import { chmodSync, mkdirSync, realpathSync, statSync, writeFileSync } from 'node:fs';
import { relative, resolve, isAbsolute } from 'node:path';
import { Command, InvalidArgumentError } from 'commander';
import { expandInputs } from '../batch/expand-inputs';
import { settingsPlan } from '../batch/file-settings';
import { DEFAULT_CPUS_PER_TASK, shellQuote, slurmScripts, SlurmPlanError } from '../batch/slurm';
import { EXIT_CODES } from '../ingest/errors';
import { addInputOptions } from './options';

function wholeNumber(name: string) {
  return (v: string) => {
    const n = Number(v);
    if (!Number.isInteger(n) || n < 1) throw new InvalidArgumentError(`${name} needs a whole number of at least 1, got "${v}"`);
    return n;
  };
}

function usage(message: string): void {
  process.stderr.write(`phasewise batch slurm: ${message}\n`);
  process.exitCode = EXIT_CODES.usage;
}

/** The analysis options given (on `batch slurm` or, as Commander may place them, on `batch`), as words for the shards. */
function passedOptions(own: Record<string, unknown>, parent: Record<string, unknown>, cwd: string): { words: string[]; values: Record<string, unknown> } {
  const words: string[] = [];
  const values: Record<string, unknown> = {};
  for (const o of addInputOptions(new Command()).options) {
    const key = o.attributeName();
    let v = own[key] ?? parent[key];
    if (v === undefined || v === false) continue;
    if (key === 'settings') v = resolve(cwd, String(v));
    values[key] = v;
    words.push(o.long!, ...(v === true ? [] : [String(v)]));
  }
  return { words, values };
}

/** A folder input that holds DIR: each shard would then find the others' outputs among its inputs while they are written. */
function outInsideInput(inputs: readonly string[], outDir: string): string | null {
  for (const input of inputs) {
    let folder = false;
    try {
      folder = statSync(input).isDirectory();
    } catch {
      continue;
    }
    const rel = relative(input, outDir);
    if (folder && !rel.startsWith('..') && !isAbsolute(rel)) return input;
  }
  return null;
}

/** Options of `batch` that the scripts set themselves; given to `batch slurm` they would otherwise be ignored. */
const NOT_FOR_SLURM: readonly (readonly [string, string])[] = [
  ['jobs', 'each task runs --jobs $SLURM_CPUS_PER_TASK; use --cpus-per-task'],
  ['shard', 'each task runs its own shard; use --shards N'],
  ['resume', 'the tasks always run with --resume'],
  ['quiet', 'the logs keep one line per recording'],
];

/** Adds `batch slurm` to the `batch` command. */
export function registerSlurm(batch: Command): void {
  const cmd = batch
    .command('slurm')
    .description('write Slurm job scripts for this batch: a job array of shards, a merge job that waits for them, and submit.sh (into DIR/slurm/)')
    .argument('<inputs...>', 'recording files, folders or quoted globs, as for `batch` (taken as absolute paths now)')
    .option('--out <dir>', 'study folder (required): shard I writes DIR/shards/I, the merge writes the study tables into DIR')
    .option('--shards <n>', 'number of shards, one job array task each (required)', wholeNumber('--shards'))
    .option('--cpus-per-task <n>', `CPUs of each task, passed to batch as --jobs (default ${DEFAULT_CPUS_PER_TASK})`, wholeNumber('--cpus-per-task'))
    .option('--time <limit>', 'time limit of each task, as sbatch --time takes it (e.g. 02:00:00); default: the partition\'s')
    .option('--partition <name>', 'Slurm partition (default: the cluster\'s default)')
    .option('--mem <size>', 'memory of each task, as sbatch --mem takes it (e.g. 2G; default: the cluster\'s)')
    .option('--report', 'the shards also write reports, and the merge the study index (as `batch --report`)')
    .option('--phasewise <command>', 'how the jobs start phasewise, written into the scripts as is (default: this node and this CLI, by absolute path)');
  addInputOptions(cmd).action((inputs: string[], own: Record<string, unknown>, self: Command) => {
    const parent = (self.parent?.opts() ?? {}) as Record<string, unknown>;
    const out = own.out ?? parent.out;
    if (typeof out !== 'string') return usage(`missing --out DIR (the study folder), e.g. phasewise batch slurm ${inputs[0] ?? 'data/'} --out study/ --shards 10`);
    if (typeof own.shards !== 'number') return usage('missing --shards N (how many array tasks share the recordings)');
    const notHere = NOT_FOR_SLURM.filter(([key]) => parent[key] !== undefined).map(([key, why]) => `--${key} (${why})`);
    if (notHere.length) return usage(`${notHere.join(', ')}: not options of batch slurm`);
    const cwd = process.cwd();
    const outDir = resolve(cwd, out);
    const absInputs = inputs.map((i) => resolve(cwd, i));
    const passed = passedOptions(own, parent, cwd);
    settingsPlan(passed.values); // a settings file that does not read stops here, not in every task
    const found = expandInputs(absInputs, cwd, outDir).inputs;
    const missing = found.filter((i) => i.missing).map((i) => i.recording);
    if (missing.length) return usage(`${missing.join(', ')}: no such file or folder (from ${cwd}); the jobs would record it as a failed recording`);
    if (!found.length) return usage(`no recordings found in ${inputs.join(' ')}: give files, folders or quoted globs such as 'data/**/*.csv'`);
    const holder = outInsideInput(absInputs, outDir);
    if (holder) return usage(`${outDir} is inside the input folder ${holder}; choose an --out folder outside it, or each shard would see the others' outputs appear among its inputs`);
    const report = Boolean(own.report ?? parent.report);
    try {
      const scripts = slurmScripts({
        inputs: absInputs, outDir, workDir: cwd, shards: own.shards,
        program: typeof own.phasewise === 'string' ? { raw: own.phasewise } : [process.execPath, realpathSync(process.argv[1]!)],
        batchOptions: [...passed.words, ...(report ? ['--report'] : [])],
        cpusPerTask: (own.cpusPerTask as number | undefined) ?? DEFAULT_CPUS_PER_TASK,
        time: own.time as string | undefined, partition: own.partition as string | undefined, mem: own.mem as string | undefined,
        generatedBy: ['phasewise', ...process.argv.slice(2)].map(shellQuote).join(' '),
      });
      mkdirSync(scripts.logsDir, { recursive: true }); // sbatch does not create the folder of --output
      for (const f of scripts.files) {
        writeFileSync(f.path, f.text);
        if (f.executable) chmodSync(f.path, 0o755);
      }
      const [array, merge, submit] = scripts.files.map((f) => f.path);
      const per = Math.ceil(found.length / own.shards);
      process.stdout.write(
        `batch slurm: ${found.length} recording(s) in ${own.shards} shard(s), up to ${per} each; written:\n` +
          `  ${array}  job array 0-${own.shards - 1}, ${(own.cpusPerTask as number | undefined) ?? DEFAULT_CPUS_PER_TASK} CPU(s) per task, logs ${scripts.logsDir}/shard-<task>.out\n` +
          `  ${merge}  merges the shards into ${outDir} once every shard ended OK\n` +
          `  ${submit}  submits both and prints their job ids\n` +
          `Submit (inputs and ${outDir} must be on a filesystem every node sees):\n  ${scripts.submit}\n` +
          `A shard I that failed: ${scripts.again}\n`,
      );
    } catch (e) {
      if (e instanceof SlurmPlanError) return usage(e.message);
      throw e;
    }
  });
}
