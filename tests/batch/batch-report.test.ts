// batch --report (runBatch report: true, in the main thread): each recording's folder gets report.html, composed from
// the same outputs as its summary.json (its numbers equal them) and naming the recording id; the other outputs are
// byte-identical to a run without --report; --resume re-analyses a recording whose report.html is missing.
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { settingsPlan } from '../../src/batch/file-settings';
import { runBatch, type BatchOptions } from '../../src/batch/run-batch';
import { breathMetric } from '../../src/metrics/registry';
import { read, writeRecording } from './helpers';

let dir = '';
const run = (over: Partial<BatchOptions> = {}) =>
  runBatch({ inputs: ['data'], outDir: 'out', plan: settingsPlan({}), jobs: 1, resume: false, shard: null, progress: 'none', cwd: dir, ...over });
const FOLDERS = ['recordings/data__p1.csv', 'recordings/data__site-b__p2.csv'];

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-batch-report-'));
  writeRecording(join(dir, 'data/p1.csv'), 'adult-healthy', 3, 1);
  writeRecording(join(dir, 'data/site-b/p2.csv'), 'child-sidestream', 3, 2);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('batch --report', () => {
  it('writes report.html per recording, its numbers equal to the folder summary.json; other outputs unchanged', async () => {
    await run({ outDir: 'plain' });
    const outcome = await run({ report: true });
    expect(outcome.manifest.counts.ok).toBe(2);
    expect(outcome.manifest.inputs.map((e) => e.outputs.summary)).toEqual(FOLDERS.map((f) => `${f}/summary.json`));
    for (const f of FOLDERS) {
      const html = read(join(dir, 'out', f), 'report.html');
      const summary = JSON.parse(read(join(dir, 'out', f), 'summary.json'));
      expect(html).toContain(`<td>File</td><td>${summary.input.file}</td>`);
      const m = summary.metrics.vd_aw_ml;
      expect(html).toContain(`data-metric="vd_aw_ml" data-stat="median">${Number(m.median.toFixed(breathMetric('vd_aw_ml').decimals))}<`);
      expect(html).toContain(`data-count="ok">${summary.breaths.ok}<`);
      for (const name of ['breaths.csv', 'summary.json', 'trends.csv', 'events.csv']) {
        expect(read(join(dir, 'out', f), name), `${f}/${name}`).toBe(read(join(dir, 'plain', f), name));
      }
      expect(existsSync(join(dir, 'plain', f, 'report.html'))).toBe(false);
    }
  });

  it('--resume --report re-analyses a recording whose report.html is missing and keeps the other', async () => {
    await run({ outDir: 'res' });
    const again = await run({ outDir: 'res', resume: true, report: true });
    expect(again.manifest.inputs.map((e) => e.resumed)).toEqual([false, false]);
    for (const f of FOLDERS) expect(existsSync(join(dir, 'res', f, 'report.html'))).toBe(true);
    rmSync(join(dir, 'res', FOLDERS[1]!, 'report.html'));
    const third = await run({ outDir: 'res', resume: true, report: true });
    expect(third.manifest.inputs.map((e) => e.resumed)).toEqual([true, false]);
    expect(existsSync(join(dir, 'res', FOLDERS[1]!, 'report.html'))).toBe(true);
  });
});
