// Worker threads give the same results as the main thread; shards merged give the tables of one run; the bundled
// CLI finds its bundled worker, exits 4 when a file failed and 2 on usage errors with one line.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { settingsPlan } from '../../src/batch/file-settings';
import { withoutTiming, type Manifest } from '../../src/batch/manifest';
import { mergeShards, MergeError } from '../../src/batch/merge';
import { planLanes, runTasks } from '../../src/batch/pool';
import type { RecordingTask } from '../../src/batch/process-recording';
import { defaultSettings } from '../../src/settings';
import { runBatch, type BatchOptions } from '../../src/batch/run-batch';
import { buildBundles, read, writeRecording } from './helpers';

let dir = '';
let bundles: { cli: string; worker: string; reader: string };
const run = (over: Partial<BatchOptions>) =>
  runBatch({ inputs: ['data'], outDir: 'out', plan: settingsPlan({}), jobs: 1, resume: false, shard: null, progress: 'none', cwd: dir, ...over });
const tables = (out: string) => ({ breaths: read(join(dir, out), 'breaths.csv'), recordings: read(join(dir, out), 'recordings.csv') });
/** every file under out/recordings, as text */
const perRecording = (out: string) => {
  const base = join(dir, out, 'recordings');
  return Object.fromEntries(readdirSync(base).sort().flatMap((d) => ['breaths.csv', 'summary.json'].map((f) => [`${d}/${f}`, read(join(base, d), f)])));
};
const stable = (m: Manifest) => {
  const { command: _c, jobs: _j, merged_from: _m, shard: _s, ...rest } = withoutTiming(m);
  return rest;
};

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-par-'));
  bundles = await buildBundles(join(dir, 'bundle'));
  const scenarios = ['adult-healthy', 'child-sidestream', 'adult-spontaneous', 'adult-leak-noisy', 'adult-rebreathing'];
  scenarios.forEach((s, k) => writeRecording(join(dir, `data/r${k + 1}-${s}.csv`), s, 3, k + 1));
  writeFileSync(join(dir, 'data/r0-empty.csv'), '');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('parallel == serial', () => {
  // --jobs 2: main thread + reader thread; 3: that + a worker reading its own files; 4: two lanes with readers;
  // without a reader bundle: three workers that each read their own files
  // (readerMinBytes 0: every file goes through the reader thread; the default keeps these small files in place, and
  // --jobs 4 then runs three lanes that each read their own files)
  it.each([
    [2, true, 0],
    [3, true, 0],
    [4, true, 0],
    [3, false, 0],
    [2, true, undefined],
    [4, true, undefined],
  ])('--jobs %i (reader bundle: %s, reader from %s bytes) writes byte-identical tables, per-recording files and manifest entries', async (jobs, withReader, minBytes) => {
    const serial = await run({ outDir: 'serial', readerFile: null });
    const out = `parallel-${jobs}-${withReader}-${minBytes}`;
    const parallel = await run({ outDir: out, jobs, workerFile: bundles.worker, readerFile: withReader ? bundles.reader : null, readerMinBytes: minBytes });
    expect(serial.manifest.counts).toEqual({ ok: 5, failed: 1, pending: 0, resumed: 0 });
    expect(tables(out)).toEqual(tables('serial'));
    expect(perRecording(out)).toEqual(perRecording('serial'));
    expect(stable(parallel.manifest)).toEqual(stable(serial.manifest));
    expect(parallel.exitCode).toBe(4);
  });
  it('hashes each file from its one read: the manifest hash is the SHA-256 of the file', async () => {
    const r = await run({ outDir: 'hashes', jobs: 2, workerFile: bundles.worker, readerFile: bundles.reader, readerMinBytes: 0 });
    for (const e of r.manifest.inputs) {
      const bytes = readFileSync(join(dir, e.recording));
      expect(e.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
      expect(e.size).toBe(bytes.length);
    }
  });
});

describe('a failing result handler', () => {
  it.each([1, 2, 3])('ends the run with its error (--jobs %i), instead of hanging or crashing', async (jobs) => {
    const data = join(dir, 'data');
    const tasks: RecordingTask[] = readdirSync(data).sort().map((f, index) => ({
      index, recording: f, path: join(data, f), bytes: statSync(join(data, f)).size, outFolder: join(dir, 'handler-out', String(jobs), f), settings: defaultSettings(), given: [], resumeSha256: null,
    }));
    const boom = new Error('manifest not writable');
    let calls = 0;
    const run = runTasks(tasks, jobs, () => {
      calls++;
      throw boom;
    }, bundles.worker, bundles.reader, 0);
    await expect(run).rejects.toBe(boom);
    expect(calls).toBe(1);
  });
});

describe('lanes', () => {
  it('pair threads (analysis + reader) for large recordings; for short ones, one lane per thread but one', () => {
    expect(planLanes(1, 10, true)).toEqual([false]);
    expect(planLanes(2, 10, true)).toEqual([true]);
    expect(planLanes(3, 10, true)).toEqual([true, false]);
    expect(planLanes(4, 10, true)).toEqual([true, true]);
    expect(planLanes(8, 2, true)).toEqual([true, true]);
    expect(planLanes(0, 5, true)).toEqual([false]);
    expect(planLanes(1, 10, false)).toEqual([false]);
    expect(planLanes(2, 10, false)).toEqual([false]);
    expect(planLanes(4, 10, false)).toEqual([false, false, false]);
    expect(planLanes(8, 3, false)).toEqual([false, false, false]);
    // --jobs 2 on short recordings: a second lane once the set is large enough to repay its start (TWO_SHORT_LANES_MIN_BYTES)
    expect(planLanes(2, 200, false, 124_600_000)).toEqual([false, false]);
    expect(planLanes(2, 40, false, 24_900_000)).toEqual([false]);
    expect(planLanes(2, 1, false, 124_600_000)).toEqual([false]);
  });
});

describe('a worker that dies', () => {
  it('fails only the task it held, is replaced, and the batch completes', async () => {
    const crash = join(dir, 'crash-worker.cjs');
    writeFileSync(crash, "require('node:worker_threads').parentPort.on('message', () => { throw new Error('boom'); });\n");
    const r = await run({ outDir: 'crash', jobs: 3, workerFile: crash, readerFile: null }); // two lanes: main + worker
    const byStatus = r.manifest.inputs.map((e) => e.status);
    expect(byStatus).not.toContain('pending');
    const died = r.manifest.inputs.filter((e) => e.error?.code === 'internal');
    expect(died.length).toBeGreaterThan(0);
    expect(died[0]!.error!.message).toMatch(/the worker stopped \(boom\)/);
    expect(r.manifest.counts.ok).toBeGreaterThan(0); // the main thread's share
    expect(r.exitCode).toBe(4);
  });
});

describe('shards + merge == one run', () => {
  it('three shards merged give the tables, per-recording files and manifest entries of a single run', async () => {
    const single = await run({ outDir: 'single' });
    for (const index of [0, 1, 2]) {
      const r = await run({ outDir: `shard-${index}`, shard: { index, count: 3 } });
      expect(r.manifest.inputs.length).toBe(2);
    }
    const merged = mergeShards([2, 0, 1].map((k) => join(dir, `shard-${k}`)), join(dir, 'merged'));
    expect(tables('merged')).toEqual(tables('single'));
    expect(perRecording('merged')).toEqual(perRecording('single'));
    expect(stable(merged.manifest)).toEqual(stable(single.manifest));
    expect(merged.exitCode).toBe(4);
  });
  it('refuses a missing shard, a repeated shard and shards of other settings', async () => {
    expect(() => mergeShards([join(dir, 'shard-0'), join(dir, 'shard-1')], join(dir, 'm2'))).toThrow(/shard\(s\) 2\/3 missing/);
    expect(() => mergeShards([join(dir, 'shard-0'), join(dir, 'shard-0'), join(dir, 'shard-1')], join(dir, 'm3'))).toThrow(MergeError);
    // an interrupted shard (manifest without finished_at) is refused
    const m2 = JSON.parse(read(join(dir, 'shard-2'), 'manifest.json'));
    mkdirSync(join(dir, 'shard-2i'));
    writeFileSync(join(dir, 'shard-2i', 'manifest.json'), JSON.stringify({ ...m2, finished_at: null }));
    expect(() => mergeShards(['shard-0', 'shard-1', 'shard-2i'].map((d) => join(dir, d)), join(dir, 'm5'))).toThrow(/did not finish/);
    await run({ outDir: 'shard-2x', shard: { index: 2, count: 3 }, plan: settingsPlan({ paco2: 40 }) });
    expect(() => mergeShards(['shard-0', 'shard-1', 'shard-2x'].map((d) => join(dir, d)), join(dir, 'm4'))).toThrow(/different settings/);
  });
});

describe('bundled CLI', () => {
  const cli = (...args: string[]) => spawnSync(process.execPath, [bundles.cli, ...args], { cwd: dir, encoding: 'utf8' });
  it('batch with --jobs 3 uses the bundled worker (two lanes for these short recordings), lists the failure in one line and exits 4', () => {
    const r = cli('batch', 'data', '--out', 'cli-out', '--jobs', '3');
    expect(r.status).toBe(4);
    expect(r.stderr).toMatch(/^\s+data\/r0-empty\.csv: \[empty_file\] data\/r0-empty\.csv: the file is empty/m);
    expect(r.stderr).toMatch(/^\[\d\/6\] ok {5}data\/r1-adult-healthy\.csv: \d+ breaths/m); // plain lines: stderr is not a terminal
    expect(r.stdout).toMatch(/6 recording\(s\): 5 ok \(0 kept from an earlier run\), 1 failed/);
    expect(tables('cli-out')).toEqual(tables('single'));
  });
  it('a settings-file pattern that matches no recording is a warning on stderr before the recordings are analysed', () => {
    writeFileSync(join(dir, 'unmatched.json'), JSON.stringify({ files: [{ pattern: 'site-b/**', analysis: { apparatus_ml: 20 } }] }));
    const r = cli('batch', 'data/r1-adult-healthy.csv', '--out', 'cli-unmatched', '--settings', 'unmatched.json');
    expect(r.status).toBe(0);
    const lines = r.stderr.split('\n');
    const warning = lines.findIndex((l) => l.startsWith('phasewise batch: warning: settings file pattern "site-b/**" matches no recording'));
    expect(warning).toBeGreaterThanOrEqual(0);
    expect(lines[warning]).toContain('"r1-adult-healthy.csv"');
    expect(warning).toBeLessThan(lines.findIndex((l) => /^\[1\/1\] ok/.test(l)));
  });
  it('usage errors end in one line and exit code 2', () => {
    const bad = cli('batch', 'data', '--out', 'x', '--shard', '3/3');
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    const none = cli('batch', 'nothing-here/*.csv', '--out', 'x');
    expect(none.status).toBe(2);
    expect(none.stderr).toMatch(/no recordings found/);
    const merge = cli('batch', 'merge', 'shard-0', '--out', 'x');
    expect(merge.status).toBe(2);
    expect(merge.stderr.trim()).toMatch(/^phasewise batch: merge: shard\(s\) 1\/3, 2\/3 missing/);
  });
  it('batch merge through the CLI writes the single-run tables', () => {
    const r = cli('batch', 'merge', 'shard-0', 'shard-1', 'shard-2', '--out', 'cli-merged');
    expect(r.status).toBe(4);
    expect(tables('cli-merged')).toEqual(tables('single'));
  });
});
