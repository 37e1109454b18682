// The Slurm scripts of `phasewise batch slurm` (src/batch/slurm.ts), without a cluster: the #SBATCH lines, and what
// bash makes of the generated commands, run here with stand-ins for sbatch and phasewise that write down the
// arguments they get (so quoting is checked by bash itself, not by reading the text). The real run on a Slurm
// cluster is tests/slurm/cluster.test.ts. Then `batch slurm` through the built CLI: options, output, usage errors.
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { sbatchQuote, shellQuote, slurmScripts, SlurmPlanError, type SlurmPlan } from '../../src/batch/slurm';

/** the built CLI (npm test builds it first) */
const CLI = fileURLToPath(new URL('../../dist/cli.cjs', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'phasewise-slurm-scripts-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const study = join(dir, 'my study');
const plan = (over: Partial<SlurmPlan> = {}): SlurmPlan => ({
  inputs: [join(dir, 'data dir'), `${join(dir, 'more')}/**/*.csv`],
  outDir: study,
  workDir: join(dir, 'work place'),
  shards: 3,
  program: ['/opt/node 20/bin/node', "/opt/phase wise/it's/cli.cjs"],
  batchOptions: ['--settings', join(dir, 'settings folder', 'study.json'), '--paco2', '40', '--report'],
  cpusPerTask: 2,
  generatedBy: 'phasewise batch slurm ...',
  ...over,
});
const file = (s: ReturnType<typeof slurmScripts>, name: string) => s.files.find((f) => f.path.endsWith(`/${name}`))!;
const sbatchLines = (text: string) => text.split('\n').filter((l) => l.startsWith('#SBATCH '));

/** A stand-in program: writes its arguments, one per line, to `record` and exits with `code`. */
function standIn(path: string, record: string, code = 0, print = ''): void {
  writeFileSync(path, `#!/bin/bash\nprintf '%s\\n' "$@" >> ${shellQuote(record)}\n${print}exit ${code}\n`);
  chmodSync(path, 0o755);
}

describe('the job array script', () => {
  it('asks for one task per shard, 0 to N-1, with the CPUs, time, partition and memory given, and logs per task', () => {
    for (const shards of [1, 3, 12]) {
      expect(sbatchLines(file(slurmScripts(plan({ shards })), 'shards.sbatch').text)).toContain(`#SBATCH --array=0-${shards - 1}`);
    }
    const lines = sbatchLines(file(slurmScripts(plan({ time: '02:00:00', partition: 'short', mem: '2G' })), 'shards.sbatch').text);
    expect(lines).toEqual([
      '#SBATCH --job-name=phasewise-shards',
      '#SBATCH --array=0-2',
      '#SBATCH --cpus-per-task=2',
      '#SBATCH --partition=short',
      '#SBATCH --time=02:00:00',
      '#SBATCH --mem=2G',
      `#SBATCH --output="${study}/slurm/logs/shard-%a.out"`,
      '#SBATCH --open-mode=append',
    ]);
  });

  it('no command comes before the #SBATCH lines (sbatch stops reading them at the first one)', () => {
    for (const name of ['shards.sbatch', 'merge.sbatch']) {
      const lines = file(slurmScripts(plan()), name).text.split('\n');
      const lastSbatch = lines.map((l) => l.startsWith('#SBATCH ')).lastIndexOf(true);
      expect(lines[0]).toBe('#!/bin/bash');
      expect(lines.slice(1, lastSbatch).every((l) => l.startsWith('#'))).toBe(true);
    }
  });

  it('runs shard $SLURM_ARRAY_TASK_ID/N of the same inputs and options in the working folder, paths with spaces and quotes intact', () => {
    const record = join(dir, 'array-args.txt');
    const program = join(dir, 'stand-in phasewise');
    standIn(program, record, 0, 'pwd >> ' + shellQuote(record) + '\n');
    mkdirSync(join(dir, 'work place'), { recursive: true });
    const s = slurmScripts(plan({ program: [program] }));
    const script = join(dir, 'shards-run.sh');
    writeFileSync(script, file(s, 'shards.sbatch').text);
    const r = spawnSync('bash', [script], { env: { ...process.env, SLURM_ARRAY_TASK_ID: '1', SLURM_CPUS_PER_TASK: '2', SLURM_JOB_ID: '7' }, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/^phasewise shard 1\/3: job 7 on /);
    expect(readFileSync(record, 'utf8').split('\n').slice(0, -1)).toEqual([
      'batch', join(dir, 'data dir'), `${join(dir, 'more')}/**/*.csv`,
      '--shard', '1/3', '--out', join(study, 'shards', '1'), '--resume', '--jobs', '2',
      '--settings', join(dir, 'settings folder', 'study.json'), '--paco2', '40', '--report',
      join(dir, 'work place'),
    ]);
  });

  it('ends OK when the shard exits 4 (complete, some recordings failed) and fails with any other non-zero code', () => {
    for (const [code, expected] of [[0, 0], [4, 0], [2, 2], [143, 143], [70, 70]]) {
      const program = join(dir, `exits-${code}`);
      standIn(program, join(dir, 'ignored.txt'), code);
      const script = join(dir, `shards-${code}.sh`);
      writeFileSync(script, file(slurmScripts(plan({ program: [program] })), 'shards.sbatch').text);
      expect(spawnSync('bash', [script], { env: { ...process.env, SLURM_ARRAY_TASK_ID: '0' } }).status).toBe(expected);
    }
  });

  it('takes the command as given by --phasewise, unquoted, so it may be several words', () => {
    const text = file(slurmScripts(plan({ program: { raw: 'apptainer exec pw.sif phasewise' } })), 'shards.sbatch').text;
    expect(text).toMatch(/^apptainer exec pw\.sif phasewise batch /m);
    expect(file(slurmScripts(plan({ program: { raw: 'apptainer exec pw.sif phasewise' } })), 'merge.sbatch').text).toMatch(/^apptainer exec pw\.sif phasewise batch merge /m);
  });
});

describe('the merge script and submit.sh', () => {
  it('merge: every shard folder, 0 to N-1, into DIR, logged to logs/merge.out', () => {
    const record = join(dir, 'merge-args.txt');
    const program = join(dir, 'merge stand-in');
    standIn(program, record);
    const s = slurmScripts(plan({ program: [program], shards: 4 }));
    expect(sbatchLines(file(s, 'merge.sbatch').text)).toContain(`#SBATCH --output="${study}/slurm/logs/merge.out"`);
    const script = join(dir, 'merge-run.sh');
    writeFileSync(script, file(s, 'merge.sbatch').text);
    const r = spawnSync('bash', [script], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    // the merge job ends with the merge's exit code (4 when some recordings failed)
    const failing = join(dir, 'merge exits 4');
    standIn(failing, join(dir, 'ignored.txt'), 4);
    writeFileSync(script, file(slurmScripts(plan({ program: [failing] })), 'merge.sbatch').text);
    expect(spawnSync('bash', [script]).status).toBe(4);
    expect(readFileSync(record, 'utf8').split('\n').slice(0, -1)).toEqual(['batch', 'merge', ...[0, 1, 2, 3].map((k) => join(study, 'shards', String(k))), '--out', study]);
  });

  it('submit.sh: sbatch --parsable the array, then the merge with --dependency=afterok:<array id>; extra arguments go to both; prints both ids', () => {
    const bin = join(dir, 'bin');
    mkdirSync(bin, { recursive: true });
    const record = join(dir, 'sbatch-args.txt');
    // the second call answers with a cluster name too ("jobid;cluster"), which submit.sh leaves out
    standIn(join(bin, 'sbatch'), record, 0, `if grep -q dependency ${shellQuote(record)}; then echo '102;cl'; else echo 101; fi\n`);
    const s = slurmScripts(plan());
    const submit = file(s, 'submit.sh');
    expect(submit.executable).toBe(true);
    mkdirSync(join(study, 'slurm'), { recursive: true });
    writeFileSync(submit.path, submit.text);
    const r = spawnSync('bash', [submit.path, '--account=lab'], { env: { ...process.env, PATH: `${bin}:${process.env.PATH}` }, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(readFileSync(record, 'utf8').split('\n').slice(0, -1)).toEqual([
      '--parsable', '--account=lab', join(study, 'slurm', 'shards.sbatch'),
      '--parsable', '--dependency=afterok:101', '--account=lab', join(study, 'slurm', 'merge.sbatch'),
    ]);
    expect(r.stdout).toMatch(/^shards: +job array 101 \(tasks 0-2\), logs .*\/my study\/slurm\/logs\/shard-<task>\.out$/m);
    expect(r.stdout).toMatch(/^merge: +job 102 \(starts when every shard has ended OK\), log .*\/merge\.out$/m);
    expect(s.submit).toBe(`bash '${study}/slurm/submit.sh'`);
  });
});

describe('quoting and refusals', () => {
  it('#SBATCH values: double quotes around a value with spaces, a backslash before " and \\, % doubled in log paths', () => {
    expect(sbatchQuote('plain/path-1')).toBe('plain/path-1');
    expect(sbatchQuote('a b')).toBe('"a b"');
    expect(sbatchQuote('say "x"')).toBe('"say \\"x\\""');
    const s = slurmScripts(plan({ outDir: '/data/100% study' }));
    expect(sbatchLines(file(s, 'shards.sbatch').text)).toContain('#SBATCH --output="/data/100%% study/slurm/logs/shard-%a.out"');
  });

  it('refuses what sbatch could not take, with one line each', () => {
    expect(() => slurmScripts(plan({ shards: 0 }))).toThrow(/--shards needs a whole number of at least 1/);
    expect(() => slurmScripts(plan({ cpusPerTask: 1.5 }))).toThrow(/--cpus-per-task needs a whole number/);
    expect(() => slurmScripts(plan({ time: '2 hours' }))).toThrow(/--time needs one word without spaces/);
    expect(() => slurmScripts(plan({ partition: 'a"b' }))).toThrow(SlurmPlanError);
    expect(() => slurmScripts(plan({ outDir: '/data/a\\b' }))).toThrow(/backslash/);
    expect(() => slurmScripts(plan({ outDir: '/data/a\nb' }))).toThrow(/line break/);
  });

  it('writes nothing itself', () => {
    slurmScripts(plan({ outDir: join(dir, 'never-written') }));
    expect(existsSync(join(dir, 'never-written'))).toBe(false);
  });
});

describe.skipIf(!existsSync(CLI))('phasewise batch slurm (the built CLI)', () => {
  const work = join(dir, 'cli work');
  const run = (...args: string[]) => spawnSync(process.execPath, [CLI, ...args], { cwd: work, encoding: 'utf8' });
  it('writes the three scripts with absolute paths, passes analysis options and the settings file on, and prints the submit command', () => {
    mkdirSync(join(work, 'data'), { recursive: true });
    for (const k of [1, 2, 3]) writeFileSync(join(work, 'data', `r${k}.csv`), 'time,flow,co2\n');
    writeFileSync(join(work, 'study.json'), JSON.stringify({ analysis: { leak_fraction: 0.2 } }));
    // options of `batch` itself (--settings, --paco2, --report) may be parsed by Commander on `batch`: both are read
    const r = run('batch', 'slurm', 'data', '--out', 'the study', '--shards', '2', '--settings', 'study.json', '--paco2', '40', '--report', '--mem', '1G');
    expect(r.status, r.stderr).toBe(0);
    const out = join(work, 'the study', 'slurm');
    expect(r.stdout).toContain(`batch slurm: 3 recording(s) in 2 shard(s), up to 2 each; written:\n  ${out}/shards.sbatch  job array 0-1, 4 CPU(s) per task`);
    expect(r.stdout).toContain(`\n  bash '${out}/submit.sh'\n`);
    expect(existsSync(join(out, 'logs'))).toBe(true); // sbatch does not create the folder of --output
    const text = readFileSync(join(out, 'shards.sbatch'), 'utf8');
    expect(text).toContain('#SBATCH --mem=1G');
    expect(text).toContain(`${shellQuote(process.execPath)} ${shellQuote(CLI)} batch ${shellQuote(join(work, 'data'))} --shard "$SLURM_ARRAY_TASK_ID/2"`);
    expect(text).toContain(`--settings ${shellQuote(join(work, 'study.json'))} --paco2 40 --report \\\n`);
    expect(text).toContain(`cd ${shellQuote(work)} || exit 1`);
  });
  it('usage errors are one line with exit code 2: no --shards, a missing input, no recordings, options of batch that the scripts set, --out inside an input folder, a bad settings file', () => {
    const fails = (args: string[], message: RegExp) => {
      const r = run('batch', 'slurm', ...args);
      expect(r.status, r.stderr).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(message);
    };
    fails(['data', '--out', 'x'], /missing --shards N/);
    fails(['data', '--shards', '2'], /missing --out DIR/);
    fails(['data', 'nothing-here', '--out', 'x', '--shards', '2'], /^phasewise batch slurm: nothing-here: no such file or folder/);
    fails(['data/*.tsv', '--out', 'x', '--shards', '2'], /no recordings found in data\/\*\.tsv/);
    fails(['data', '--out', 'data/study', '--shards', '2'], /is inside the input folder .*\/data; choose an --out folder outside it/);
    fails(['data', '--out', 'x', '--shards', '2', '--time', '2 h'], /--time needs one word/);
    fails(['data', '--out', 'x', '--shards', '2', '--jobs', '8', '--resume'], /--jobs \(each task runs --jobs \$SLURM_CPUS_PER_TASK; use --cpus-per-task\), --resume \(.*\): not options of batch slurm/);
    writeFileSync(join(work, 'bad.json'), '{ not json');
    fails(['data', '--out', 'x', '--shards', '2', '--settings', 'bad.json'], /bad\.json/);
    expect(existsSync(join(work, 'x'))).toBe(false);
  });
});
