// The Slurm scripts of `phasewise batch slurm` on a real (single-node) Slurm cluster: this test brings up munged,
// slurmctld and slurmd from Debian's packages with a configuration of its own (cluster.ts), writes a small study (five
// simulated recordings and one empty file, in a folder whose name holds a space, with a settings file), generates the
// scripts with the bundled CLI, runs submit.sh, waits for the merge job, and checks:
// - the merged tables and per-recording files are byte-identical to one `phasewise batch` of the same inputs on this
//   machine (every file that run writes except manifest.json);
// - the merged manifest equals that run's except for the fields that record how and when it ran: `command`,
//   `merged_from` (the shard folders), `started_at`, `finished_at`, `elapsed_s` and each input's `elapsed_s`, and
//   `settings_file`, which the scripts give as an absolute path (its content hash, `settings_sha256`, is equal);
// - each shard wrote its log (DIR/slurm/logs/shard-I.out) and the merge its own; every array task ended COMPLETED
//   although its shard holds a failed recording (exit 4 counts as done), and the merge job exited 4 (a failed recording);
// - one shard submitted again as docs/batch.md says (`sbatch --array=1 shards.sbatch`, then the merge) runs that task
//   only, keeps its results (--resume), adds to its log, and the new merge writes the same study.
// Without the Slurm and munge programs the test is skipped with a message, except under CI=true, where that is a
// failure: .ci/run installs them (apt-get install slurm-wlm munge).
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { withoutTiming, type Manifest } from '../../src/batch/manifest';
import { buildBundles, writeRecording } from '../batch/helpers';
import { missingPrograms, startCluster, type Cluster } from './cluster';

const MISSING = missingPrograms();
const IN_CI = process.env.CI === 'true';
if (MISSING.length) {
  console.warn(`\n*** Slurm cluster test ${IN_CI ? 'FAIL' : 'SKIPPED'}: ${MISSING.join(', ')} not found (apt-get install -y slurm-wlm munge) ***\n`);
}

describe.runIf(MISSING.length > 0 && IN_CI)('Slurm available in CI', () => {
  it('needs slurm-wlm and munge when CI=true', () => {
    throw new Error(`${MISSING.join(', ')} missing; .ci/run must install Debian's slurm-wlm and munge (apt-get install -y slurm-wlm munge) before the tests`);
  });
});

/** Every file below `dir` (relative paths, sorted), leaving out the folders named in `skip`. */
function listFiles(dir: string, skip: readonly string[] = []): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = join(d, e.name);
      if (e.isDirectory()) {
        if (!skip.includes(relative(dir, p))) walk(p);
      } else out.push(relative(dir, p));
    }
  };
  walk(dir);
  return out.sort();
}

describe.runIf(MISSING.length === 0)('batch slurm on a single-node Slurm cluster', () => {
  let dir = '';
  let cluster: Cluster | null = null;
  let cli = '';
  const study = 'my study';
  const node = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { cwd: dir, encoding: 'utf8' });

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'phasewise-slurm-'));
    cli = (await buildBundles(join(dir, 'bundle'))).cli;
    const scenarios = ['adult-healthy', 'child-sidestream', 'adult-spontaneous', 'adult-leak-noisy', 'adult-rebreathing'];
    scenarios.forEach((s, k) => writeRecording(join(dir, `data/r${k + 1}-${s}.csv`), s, 3, k + 1));
    writeFileSync(join(dir, 'data/r0-empty.csv'), '');
    mkdirSync(join(dir, 'settings folder'));
    writeFileSync(join(dir, 'settings folder/study.json'), JSON.stringify({ analysis: { leak_fraction: 0.2 }, files: [{ pattern: '*sidestream*', analysis: { max_delay_s: 8 } }] }));
    cluster = await startCluster(join(dir, 'cluster'));
  });

  afterAll(async () => {
    await cluster?.stop();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  /** Waits until none of the jobs is pending or running. */
  async function finished(c: Cluster, ids: string[]): Promise<void> {
    const end = Date.now() + 90_000;
    while (c.run('squeue', '--noheader', `--jobs=${ids.join(',')}`).stdout.trim() !== '') {
      if (Date.now() > end) throw new Error(`the jobs did not finish within 90 s:\n${c.run('squeue').stdout}\n${c.log()}`);
      await new Promise((r) => setTimeout(r, 250));
    }
  }

  /** Every file of the one-machine run but its manifest is in the merged study, byte for byte. */
  function expectSameTables(out: string): void {
    const files = listFiles(join(dir, 'reference')).filter((f) => f !== 'manifest.json');
    expect(files).toContain('breaths.csv');
    expect(listFiles(out, ['slurm', 'shards']).filter((f) => f !== 'manifest.json')).toEqual(files);
    for (const f of files) expect(readFileSync(join(out, f)).equals(readFileSync(join(dir, 'reference', f))), f).toBe(true);
  }

  it('runs the array and the merge, and the merged study equals one run on one machine', async () => {
    const c = cluster!;
    const reference = node('batch', 'data', '--out', 'reference', '--jobs', '1', '--settings', 'settings folder/study.json', '--quiet');
    expect(reference.status, reference.stderr).toBe(4); // the empty file failed; the rest are complete

    const gen = node('batch', 'slurm', 'data', '--out', study, '--shards', '3', '--cpus-per-task', '1', '--time', '00:05:00', '--settings', 'settings folder/study.json');
    expect(gen.status, gen.stderr).toBe(0);
    const submitLine = /^ {2}(bash .*submit\.sh'?)$/m.exec(gen.stdout);
    expect(submitLine, gen.stdout).not.toBeNull();

    const submit = spawnSync('bash', ['-c', submitLine![1]!], { cwd: dir, env: c.env, encoding: 'utf8' });
    expect(submit.status, submit.stderr + c.log()).toBe(0);
    const arrayId = /^shards: +job array (\d+) /m.exec(submit.stdout)?.[1];
    const mergeId = /^merge: +job (\d+) /m.exec(submit.stdout)?.[1];
    expect(arrayId && mergeId, submit.stdout).toBeTruthy();

    await finished(c, [arrayId!, mergeId!]);

    const jobs = c.run('scontrol', '--oneliner', 'show', 'job', `${arrayId}`).stdout.trim().split('\n');
    expect(jobs.map((l) => /ArrayTaskId=(\d+)/.exec(l)?.[1]).sort()).toEqual(['0', '1', '2']);
    for (const l of jobs) expect(l, l).toMatch(/JobState=COMPLETED .*ExitCode=0:0/);
    expect(c.run('scontrol', '--oneliner', 'show', 'job', `${mergeId}`).stdout).toMatch(/JobState=FAILED .*ExitCode=4:0/);

    const out = join(dir, study);
    for (const k of [0, 1, 2]) {
      const log = readFileSync(join(out, 'slurm/logs', `shard-${k}.out`), 'utf8');
      expect(log).toMatch(new RegExp(`^phasewise shard ${k}/3: job \\d+ on `, 'm'));
      expect(log).toMatch(/^batch: 2 recording\(s\): /m);
    }
    expect(readFileSync(join(out, 'slurm/logs/merge.out'), 'utf8')).toMatch(/^batch: 6 recording\(s\): 5 ok .*\(merged from 3 shard folder\(s\)\)/m);

    expectSameTables(out);

    const manifest = (d: string) => JSON.parse(readFileSync(join(d, 'manifest.json'), 'utf8')) as Manifest;
    const { command: _c1, merged_from: from, settings_file: settingsFile, ...merged } = withoutTiming(manifest(out));
    const { command: _c2, merged_from: none, settings_file: given, ...single } = withoutTiming(manifest(join(dir, 'reference')));
    expect(merged).toEqual(single); // settings_sha256 included: the shards read the same settings
    expect(given).toBe('settings folder/study.json');
    expect(settingsFile).toBe(join(dir, 'settings folder/study.json')); // the scripts name it by its absolute path
    expect(none).toEqual([]);
    expect(from).toEqual([0, 1, 2].map((k) => join(out, 'shards', String(k))));
    expect(statSync(join(out, 'slurm/submit.sh')).mode & 0o111).not.toBe(0);
  });

  it('one shard submitted again (sbatch --array=I, as the docs say) resumes what it had, appends to its log, and a new merge gives the same study', async () => {
    const c = cluster!;
    const slurm = join(dir, study, 'slurm');
    const again = c.run('sbatch', '--parsable', '--array=1', join(slurm, 'shards.sbatch'));
    expect(again.status, again.stderr).toBe(0);
    const arrayId = again.stdout.trim().split(';')[0]!;
    const merge = c.run('sbatch', '--parsable', `--dependency=afterok:${arrayId}`, join(slurm, 'merge.sbatch'));
    expect(merge.status, merge.stderr).toBe(0);
    const mergeId = merge.stdout.trim().split(';')[0]!;
    await finished(c, [arrayId, mergeId]);
    // --array on the command line wins over the script's #SBATCH --array=0-2: one task, index 1
    const tasks = c.run('scontrol', '--oneliner', 'show', 'job', arrayId).stdout.trim().split('\n');
    expect(tasks.map((l) => /ArrayTaskId=(\d+)/.exec(l)?.[1])).toEqual(['1']);
    const log = readFileSync(join(slurm, 'logs', 'shard-1.out'), 'utf8');
    expect(log.match(/^phasewise shard 1\/3: job /gm)).toHaveLength(2); // --open-mode=append kept the first run's lines
    // shard 1 of 3 holds inputs 1 and 4 of the sorted six (r1, r4), both analysed by the first run
    expect(log.split('\n').filter((l) => l.startsWith('batch: '))).toEqual([
      expect.stringMatching(/^batch: 2 recording\(s\): 2 ok \(0 kept from an earlier run\), 0 failed in /),
      expect.stringMatching(/^batch: 2 recording\(s\): 2 ok \(2 kept from an earlier run\), 0 failed in /),
    ]);
    expectSameTables(join(dir, study));
  });
});
