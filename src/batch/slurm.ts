// `phasewise batch slurm`: the job scripts that run one study as a Slurm job array of shards plus a merge job.
// Written into DIR/slurm/:
//   shards.sbatch  a job array with one task per shard (--array=0-(N-1)); task I runs
//                  `phasewise batch INPUTS --shard I/N --out DIR/shards/I --resume --jobs $SLURM_CPUS_PER_TASK ...`
//                  and logs to DIR/slurm/logs/shard-I.out;
//   merge.sbatch   `phasewise batch merge DIR/shards/0 ... DIR/shards/(N-1) --out DIR`, logged to logs/merge.out;
//   submit.sh      submits the array (`sbatch --parsable`), then the merge with `--dependency=afterok:<array id>`, so the
//                  merge starts only once every task of the array has ended with exit code 0, and prints both job ids.
// Option spellings: SchedMD, sbatch manual page (--array, --parsable, --dependency=afterok, --output's %a pattern,
// --open-mode) and "Job Array Support" (https://slurm.schedmd.com/sbatch.html, https://slurm.schedmd.com/job_array.html).
// Pure text: the caller resolves every path to an absolute one and writes the files (slurm-command.ts).

export const SLURM_FOLDER = 'slurm';
export const SHARDS_FOLDER = 'shards';
export const ARRAY_SCRIPT = 'shards.sbatch';
export const MERGE_SCRIPT = 'merge.sbatch';
export const SUBMIT_SCRIPT = 'submit.sh';
export const LOGS_FOLDER = 'logs';
/** cpus per array task when none is given: four threads of `batch --jobs` (common practice, no source) */
export const DEFAULT_CPUS_PER_TASK = 4;

export class SlurmPlanError extends Error {}

export interface SlurmPlan {
  /** the inputs as the shards get them: absolute paths or absolute globs */
  inputs: readonly string[];
  /** absolute output folder of the study: shards in DIR/shards/I, the merged tables in DIR */
  outDir: string;
  /** absolute folder the jobs run in: recording ids in the tables are relative to it, as in a run started there */
  workDir: string;
  shards: number;
  /** how the jobs start phasewise: shell words, quoted here (absolute node and CLI path) ... */
  program: readonly string[] | { raw: string };
  /** options passed on to every shard, as words (e.g. ['--settings', '/abs/study.json', '--report']) */
  batchOptions: readonly string[];
  cpusPerTask: number;
  time?: string;
  partition?: string;
  mem?: string;
  /** the command line that wrote the scripts, for their header */
  generatedBy: string;
}

export interface SlurmFile {
  path: string;
  text: string;
  executable: boolean;
}

export interface SlurmScripts {
  files: SlurmFile[];
  /** DIR/slurm and DIR/slurm/logs */
  dir: string;
  logsDir: string;
  /** the command that submits the study */
  submit: string;
  /** the commands that run shard I again and then the merge */
  again: string;
}

/** A word for bash: as is when plainly safe, else in single quotes (a quote inside written '\''). */
export function shellQuote(word: string): string {
  return /^[\w./:@%+=,-]+$/.test(word) ? word : `'${word.replace(/'/g, `'\\''`)}'`;
}

/**
 * A value on an `#SBATCH` line. sbatch reads those lines itself, not through a shell: double quotes group words and a
 * backslash makes the next character literal (Slurm's src/sbatch/opt.c, `_get_argument`). A newline cannot be held.
 */
export function sbatchQuote(value: string): string {
  if (/[\n\r]/.test(value)) throw new SlurmPlanError(`${JSON.stringify(value)}: a line break cannot go on an #SBATCH line`);
  return /^[\w./:@%+=,-]+$/.test(value) ? value : `"${value.replace(/[\\"]/g, '\\$&')}"`;
}

/**
 * A file name for sbatch's --output: `%` starts a replacement (%a the array index, %A the array's job id), `%%` is a
 * literal %, and a backslash anywhere turns the replacements off (sbatch manual page, "filename pattern").
 */
function outputPattern(dir: string, name: string): string {
  if (dir.includes('\\')) throw new SlurmPlanError(`${dir}: a backslash in the log folder turns off sbatch's %a in file names; choose an --out folder without one`);
  return `${dir.replace(/%/g, '%%')}/${name}`;
}

/** Checks the #SBATCH values given as text: one word each, without spaces or quotes. */
function checkWord(name: string, value: string | undefined): void {
  if (value !== undefined && !/^[\w:.+=,@/-]+$/.test(value)) {
    throw new SlurmPlanError(`--${name} needs one word without spaces or quotes (as sbatch takes it), got ${JSON.stringify(value)}`);
  }
}

function programWords(p: SlurmPlan): string {
  return Array.isArray(p.program) ? p.program.map(shellQuote).join(' ') : (p.program as { raw: string }).raw;
}

function header(p: SlurmPlan, what: string): string[] {
  return ['#!/bin/bash', `# ${what}`, `# Written by: ${p.generatedBy}`, '# Regenerate with that command rather than editing: it states every path once.'];
}

function resources(p: SlurmPlan): string[] {
  return [
    ...(p.partition ? [`#SBATCH --partition=${p.partition}`] : []),
    ...(p.time ? [`#SBATCH --time=${p.time}`] : []),
    ...(p.mem ? [`#SBATCH --mem=${p.mem}`] : []),
  ];
}

function arrayScript(p: SlurmPlan, logs: string): string {
  const last = p.shards - 1;
  const shardOut = `${shellQuote(`${p.outDir}/${SHARDS_FOLDER}`)}/"$SLURM_ARRAY_TASK_ID"`;
  const command = [
    programWords(p), 'batch', ...p.inputs.map(shellQuote),
    '--shard', `"$SLURM_ARRAY_TASK_ID/${p.shards}"`, '--out', shardOut, '--resume', '--jobs', '"${SLURM_CPUS_PER_TASK:-1}"',
    ...p.batchOptions.map(shellQuote),
  ];
  return [
    ...header(p, `phasewise study, shard $SLURM_ARRAY_TASK_ID of ${p.shards}: one task of a Slurm job array.`),
    '#SBATCH --job-name=phasewise-shards',
    `#SBATCH --array=0-${last}`,
    `#SBATCH --cpus-per-task=${p.cpusPerTask}`,
    ...resources(p),
    `#SBATCH --output=${sbatchQuote(outputPattern(logs, 'shard-%a.out'))}`,
    // a resubmitted shard adds to its log instead of replacing the one that shows why it failed
    '#SBATCH --open-mode=append',
    `cd ${shellQuote(p.workDir)} || exit 1`,
    'echo "phasewise shard $SLURM_ARRAY_TASK_ID/' + p.shards + ': job $SLURM_JOB_ID on $(hostname) at $(date -u +%Y-%m-%dT%H:%M:%SZ)"',
    'status=0',
    `${command.join(' ')} \\\n  || status=$?`,
    '# 4: the shard is complete but some recordings failed (its manifest names them); the merge still runs and lists them.',
    '# Any other non-zero code (2 usage, 130/143 stopped, e.g. at the time limit) fails the task: submit it again.',
    'if [ "$status" -eq 4 ]; then status=0; fi',
    'exit "$status"',
    '',
  ].join('\n');
}

function mergeScript(p: SlurmPlan, logs: string): string {
  return [
    ...header(p, `phasewise study: merges the ${p.shards} shard folders into the study tables (after every shard ended OK).`),
    '#SBATCH --job-name=phasewise-merge',
    '#SBATCH --cpus-per-task=1',
    ...resources(p),
    `#SBATCH --output=${sbatchQuote(outputPattern(logs, 'merge.out'))}`,
    '#SBATCH --open-mode=append',
    `cd ${shellQuote(p.workDir)} || exit 1`,
    'echo "phasewise merge: job $SLURM_JOB_ID on $(hostname) at $(date -u +%Y-%m-%dT%H:%M:%SZ)"',
    'shards=()',
    `for i in $(seq 0 ${p.shards - 1}); do shards+=(${shellQuote(`${p.outDir}/${SHARDS_FOLDER}`)}/"$i"); done`,
    // not exec: a --phasewise command may be several commands (`module load nodejs && phasewise`)
    `${programWords(p)} batch merge "\${shards[@]}" --out ${shellQuote(p.outDir)}`,
    '',
  ].join('\n');
}

function submitScript(p: SlurmPlan, dir: string, logs: string): string {
  const q = shellQuote;
  return [
    ...header(p, `Submits the phasewise study: the job array of ${p.shards} shards, then the merge, which waits for them.`),
    '# Extra arguments go to both sbatch calls (e.g. --account=NAME). Prints the two job ids.',
    'set -euo pipefail',
    // --parsable prints "jobid" or "jobid;cluster"
    `array_id=$(sbatch --parsable "$@" ${q(`${dir}/${ARRAY_SCRIPT}`)})`,
    'array_id=${array_id%%;*}',
    `merge_id=$(sbatch --parsable --dependency="afterok:$array_id" "$@" ${q(`${dir}/${MERGE_SCRIPT}`)})`,
    'merge_id=${merge_id%%;*}',
    `printf 'shards:  job array %s (tasks 0-${p.shards - 1}), logs %s\\n' "$array_id" ${q(`${logs}/shard-<task>.out`)}`,
    `printf 'merge:   job %s (starts when every shard has ended OK), log %s\\n' "$merge_id" ${q(`${logs}/merge.out`)}`,
    `printf 'results: %s (breaths.csv, recordings.csv, trends.csv, events.csv, manifest.json)\\n' ${q(p.outDir)}`,
    '',
  ].join('\n');
}

/** The three files of a study's Slurm run (paths and text; nothing is written here). */
export function slurmScripts(p: SlurmPlan): SlurmScripts {
  if (!Number.isInteger(p.shards) || p.shards < 1) throw new SlurmPlanError(`--shards needs a whole number of at least 1, got ${p.shards}`);
  if (!Number.isInteger(p.cpusPerTask) || p.cpusPerTask < 1) throw new SlurmPlanError(`--cpus-per-task needs a whole number of at least 1, got ${p.cpusPerTask}`);
  checkWord('time', p.time);
  checkWord('partition', p.partition);
  checkWord('mem', p.mem);
  const dir = `${p.outDir}/${SLURM_FOLDER}`;
  const logs = `${dir}/${LOGS_FOLDER}`;
  return {
    files: [
      { path: `${dir}/${ARRAY_SCRIPT}`, text: arrayScript(p, logs), executable: false },
      { path: `${dir}/${MERGE_SCRIPT}`, text: mergeScript(p, logs), executable: false },
      { path: `${dir}/${SUBMIT_SCRIPT}`, text: submitScript(p, dir, logs), executable: true },
    ],
    dir,
    logsDir: logs,
    submit: `bash ${shellQuote(`${dir}/${SUBMIT_SCRIPT}`)}`,
    again: `sbatch --array=I ${shellQuote(`${dir}/${ARRAY_SCRIPT}`)}, then sbatch --dependency=afterok:<its job id> ${shellQuote(`${dir}/${MERGE_SCRIPT}`)}`,
  };
}
