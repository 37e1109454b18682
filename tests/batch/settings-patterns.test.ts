// Settings-file `files` patterns in batch mode are matched against each recording's path below the input it was
// found under (not the working folder), a pattern that matches no recording is a warning, and the manifest lists the
// patterns each recording took. Run from the folder above the data, as in `phasewise batch data/ --settings s.json`.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { settingsPlan } from '../../src/batch/file-settings';
import { runBatch, type BatchOptions } from '../../src/batch/run-batch';
import { expectClose } from '../helpers/expect-close';
import { parseCsv, read, writeRecording } from './helpers';

let dir = '';
/** writes a settings file holding these `files` entries and returns its path */
const settingsFile = (name: string, files: unknown[]) => {
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify({ files }));
  return path;
};
const run = (over: Partial<BatchOptions> & { settings?: string } = {}) => {
  const { settings, ...rest } = over;
  const plan = settingsPlan(settings ? { settings } : {});
  return runBatch({ inputs: ['data/'], outDir: 'out', plan, jobs: 1, resume: false, shard: null, progress: 'none', cwd: dir, ...rest });
};
/** vd_aw_ml of every breath of one recording in a batch output folder */
const vdAw = (out: string, recording: string) =>
  parseCsv(read(join(dir, out), 'breaths.csv'))
    .filter((r) => r.recording === recording)
    .map((r) => Number(r.vd_aw_ml));

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-patterns-'));
  writeRecording(join(dir, 'data/site-a/p1.csv'), 'adult-healthy', 1, 1);
  writeRecording(join(dir, 'data/site-b/p2.csv'), 'adult-healthy', 1, 2);
  writeRecording(join(dir, 'data/sidestream-lab/p3.csv'), 'child-sidestream', 1, 3);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('settings-file patterns in batch', () => {
  it('run from the folder above data/, `site-b/**` applies to data/site-b only: apparatus_ml lowers each breath\'s airway dead space by exactly that volume', async () => {
    const base = await run({ outDir: 'base' });
    const r = await run({ outDir: 'apparatus', settings: settingsFile('apparatus.json', [{ pattern: 'site-b/**', analysis: { apparatus_ml: 20 } }]) });
    expect(r.manifest.warnings).toEqual([]);
    expect(r.manifest.inputs.map((e) => [e.recording, e.patterns])).toEqual([
      ['data/sidestream-lab/p3.csv', []],
      ['data/site-a/p1.csv', []],
      ['data/site-b/p2.csv', ['site-b/**']],
    ]);
    expect(base.manifest.inputs.every((e) => e.status === 'ok')).toBe(true);
    const before = vdAw('base', 'data/site-b/p2.csv');
    const after = vdAw('apparatus', 'data/site-b/p2.csv');
    expect(before.filter(Number.isFinite).length).toBeGreaterThan(5);
    expect(after).toHaveLength(before.length);
    // the setting's definition: airway dead space at the sensor minus apparatus_ml (20 mL here)
    before.forEach((v, k) => {
      if (Number.isFinite(v)) expectClose(after[k]!, v - 20, { abs: 1e-9 }, `breath ${k + 1}`);
    });
    expect(vdAw('apparatus', 'data/site-a/p1.csv')).toEqual(vdAw('base', 'data/site-a/p1.csv'));
  });

  it('a pattern without "/" matches a folder or file name at any depth (`*sidestream*` takes data/sidestream-lab/p3.csv)', async () => {
    const r = await run({ outDir: 'sidestream', settings: settingsFile('sidestream.json', [{ pattern: '*sidestream*', analysis: { max_delay_s: 8 } }]) });
    expect(r.manifest.warnings).toEqual([]);
    expect(r.manifest.inputs.map((e) => e.patterns)).toEqual([['*sidestream*'], [], []]);
    const summary = JSON.parse(read(join(dir, 'sidestream'), r.manifest.inputs[0]!.outputs.summary));
    expect(summary.settings['analysis.max_delay_s']).toEqual({ value: 8, origin: 'given' });
  });

  it('a pattern that matches no recording is a warning naming the pattern, what it is matched against and an example path', async () => {
    const settings = settingsFile('unmatched.json', [
      { pattern: 'site-c/**', analysis: { apparatus_ml: 5 } },
      { pattern: 'data/site-b/*.csv', analysis: { apparatus_ml: 5 } },
    ]);
    const r = await run({ outDir: 'unmatched', settings });
    expect(r.manifest.inputs.map((e) => e.patterns)).toEqual([[], [], []]);
    expect(r.warnings).toEqual(r.manifest.warnings);
    const [c, b] = [r.manifest.warnings.find((w) => w.includes('"site-c/**"')), r.manifest.warnings.find((w) => w.includes('"data/site-b/*.csv"'))];
    expect(c).toMatch(/matches no recording/);
    expect(c).toMatch(/relative to the input folder/);
    expect(c).toContain('"sidestream-lab/p3.csv"');
    // written as a path from the working folder (the rule before): the warning shows the recording it meant
    expect(b).toMatch(/matches no recording/);
    expect(b).toContain('data/site-b/p2.csv');
    expect(r.manifest.warnings).toHaveLength(2);
  });

  it('a shard does not warn about a pattern that matches a recording of another shard', async () => {
    // recordings sorted: p3 (shard 0), p1 (shard 1), p2 (shard 2)
    const settings = settingsFile('shard.json', [{ pattern: 'site-b/**', analysis: { apparatus_ml: 20 } }]);
    const r = await run({ outDir: 'shard-0', settings, shard: { index: 0, count: 3 } });
    expect(r.manifest.inputs.map((e) => e.recording)).toEqual(['data/sidestream-lab/p3.csv']);
    expect(r.manifest.warnings).toEqual([]);
  });
});
