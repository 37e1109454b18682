// runBatch in the main thread (--jobs 1): per-recording outputs equal `analyse`, the two tables, a failed file
// recorded without stopping the batch (exit code 4), manifest hashes, --resume, per-file-pattern settings.
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync, appendFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { settingsForRecording, settingsPlan } from '../../src/batch/file-settings';
import type { Manifest } from '../../src/batch/manifest';
import { RECORDING_COLUMNS } from '../../src/batch/recordings-table';
import { BATCH_EXIT_SOME_FAILED, runBatch, type BatchOptions } from '../../src/batch/run-batch';
import { analyseFile } from '../../src/node/analyse-file';
import { breathsCsv } from '../../src/report/breaths-csv';
import { summaryFor } from '../../src/report/summary-for';
import { BREATHS_CSV_COLUMNS } from '../../src/report/breaths-csv';
import { parseCsv, read, writeRecording } from './helpers';

let dir = '';
const run = (over: Partial<BatchOptions> & { opts?: Record<string, unknown> } = {}) => {
  const { opts, ...rest } = over;
  return runBatch({ inputs: ['data'], outDir: 'out', plan: settingsPlan(opts ?? {}), jobs: 1, resume: false, shard: null, progress: 'none', cwd: dir, ...rest });
};
const sha = (p: string) => createHash('sha256').update(readFileSync(p)).digest('hex');

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-batch-'));
  writeRecording(join(dir, 'data/p1.csv'), 'adult-healthy', 3, 1);
  writeRecording(join(dir, 'data/site-b/p2.csv'), 'child-sidestream', 3, 2);
  writeFileSync(join(dir, 'data/broken.csv'), 'time_s,flow_lps,co2_mmhg\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('batch run (serial)', () => {
  let m: Manifest;
  let code = -1;
  beforeAll(async () => {
    const r = await run({ outDir: 'out1' });
    m = r.manifest;
    code = r.exitCode;
  });

  it('records the failed file with its code and message, finishes the others, and exits 4', () => {
    expect(code).toBe(BATCH_EXIT_SOME_FAILED);
    expect(m.inputs.map((e) => [e.recording, e.status])).toEqual([
      ['data/broken.csv', 'failed'], ['data/p1.csv', 'ok'], ['data/site-b/p2.csv', 'ok'],
    ]);
    const bad = m.inputs[0]!;
    expect(bad.error!.code).toBe('header_only');
    expect(bad.error!.message).toMatch(/data\/broken\.csv line 1: only a header line/);
    expect(m.counts).toEqual({ ok: 2, failed: 1, pending: 0, resumed: 0 });
  });

  it('writes per recording exactly what `analyse` writes for that file', async () => {
    const e = m.inputs[1]!;
    const plan = settingsPlan({});
    const rs = settingsForRecording(plan, []);
    const analysed = await analyseFile(join(dir, 'data/p1.csv'), rs.settings);
    const direct = { ...analysed, summary: summaryFor(analysed.core, analysed.report, rs.settings, new Set(rs.given)) };
    expect(read(join(dir, 'out1'), e.outputs.breaths)).toBe(breathsCsv(direct.core.breaths));
    const summary = JSON.parse(read(join(dir, 'out1'), e.outputs.summary));
    expect(summary.metrics).toEqual(JSON.parse(JSON.stringify(direct.summary.metrics)));
    expect(summary.breaths).toEqual(direct.summary.breaths);
  });

  it('DIR/breaths.csv holds every breath of every ok recording, in input order, behind recording and recording_id columns', () => {
    const out = join(dir, 'out1');
    const all = read(out, 'breaths.csv');
    expect(all.split('\n')[0]).toBe(['recording', 'recording_id', ...BREATHS_CSV_COLUMNS].join(','));
    const expected = m.inputs.filter((e) => e.status === 'ok').flatMap((e) =>
      read(out, e.outputs.breaths).trimEnd().split('\n').slice(1).map((l) => `${e.recording},${e.recording_id},${l}`));
    expect(all.trimEnd().split('\n').slice(1)).toEqual(expected);
    expect(expected.length).toBe(m.inputs[1]!.breaths_found! + m.inputs[2]!.breaths_found!);
    expect(m.inputs[1]!.breaths_found).toBeGreaterThan(20);
  });

  it('DIR/recordings.csv has one row per recording with counts, medians/IQR, delay and reason counts from summary.json', () => {
    const out = join(dir, 'out1');
    const rows = parseCsv(read(out, 'recordings.csv'));
    expect(Object.keys(rows[0]!)).toEqual([...RECORDING_COLUMNS]);
    expect(rows.map((r) => [r.recording, r.status])).toEqual(m.inputs.map((e) => [e.recording, e.status]));
    expect(rows[0]!.error_code).toBe('header_only');
    expect(rows[0]!.vd_aw_ml_median).toBe('');
    for (const k of [1, 2]) {
      const s = JSON.parse(read(out, m.inputs[k]!.outputs.summary));
      const r = rows[k]!;
      expect(Number(r.rows)).toBe(s.input.rows);
      expect(Number(r.rows)).toBe(Number(r.rows_used) + Number(r.rows_skipped));
      expect(Number(r.breaths_found)).toBe(s.breaths.found);
      expect(Number(r.breaths_ok) + Number(r.breaths_excluded)).toBe(Number(r.breaths_found));
      // 6 significant digits, as every table of the project writes them
      expect(Number(r.vd_aw_ml_median)).toBe(Number(s.metrics.vd_aw_ml.median.toPrecision(6)));
      expect(Number(r.vd_aw_ml_p25)).toBeLessThanOrEqual(Number(r.vd_aw_ml_median));
      expect(Number(r.vd_aw_ml_p75)).toBeGreaterThanOrEqual(Number(r.vd_aw_ml_median));
      expect(Number(r.delay_s)).toBe(Number(s.delay_s.value.toPrecision(6)));
      expect(Number(r.excluded_gap)).toBe(s.breaths.excluded_by_reason.gap);
    }
  });

  it('the manifest holds version, settings with their hash, and per input size and content hash', () => {
    expect(m.version).toMatch(/^\d+\.\d+\.\d+/);
    expect(m.settings.analysis.calibration_s).toBe(120);
    expect(m.settings_sha256).toMatch(/^[0-9a-f]{64}$/);
    for (const e of m.inputs) {
      const p = join(dir, e.recording);
      expect(e.size).toBe(statSync(p).size);
      expect(e.sha256).toBe(sha(p));
    }
    const onDisk = JSON.parse(read(join(dir, 'out1'), 'manifest.json'));
    expect(onDisk.inputs.map((e: { sha256: string }) => e.sha256)).toEqual(m.inputs.map((e) => e.sha256));
    expect(onDisk.finished_at).not.toBeNull();
  });
});

describe('--resume', () => {
  it('skips unchanged inputs, re-analyses a changed file and everything after a settings change', async () => {
    const first = await run({ outDir: 'out2' });
    const before = read(join(dir, 'out2'), 'breaths.csv');
    const again = await run({ outDir: 'out2', resume: true });
    expect(again.manifest.inputs.map((e) => e.resumed)).toEqual([false, true, true]); // failed inputs are retried
    expect(read(join(dir, 'out2'), 'breaths.csv')).toBe(before);
    expect(again.manifest.inputs.map((e) => e.breaths_found)).toEqual(first.manifest.inputs.map((e) => e.breaths_found));

    // a changed file (one more comment line at the end) is analysed again
    appendFileSync(join(dir, 'data/p1.csv'), '# appended note\n');
    const changed = await run({ outDir: 'out2', resume: true });
    expect(changed.manifest.inputs.map((e) => e.resumed)).toEqual([false, false, true]);
    expect(changed.manifest.inputs[1]!.sha256).not.toBe(first.manifest.inputs[1]!.sha256);

    // another setting changes every settings hash: nothing is kept
    const other = await run({ outDir: 'out2', resume: true, opts: { paco2: 45 } });
    expect(other.manifest.inputs.map((e) => e.resumed)).toEqual([false, false, false]);
    expect(other.manifest.settings_sha256).not.toBe(first.manifest.settings_sha256);
    expect(other.manifest.inputs[1]!.settings_sha256).not.toBe(first.manifest.inputs[1]!.settings_sha256);
  });
});

describe('per-file-pattern settings', () => {
  it('applies a settings file `files` entry to matching recordings only; command-line options win over it', async () => {
    const settingsPath = join(dir, 'study.json');
    writeFileSync(settingsPath, JSON.stringify({ analysis: { leak_fraction: 0.2 }, files: [{ pattern: 'site-b/*.csv', analysis: { paco2_mmhg: 45 } }] }));
    const r = await run({ outDir: 'out3', opts: { settings: settingsPath } });
    const [, p1, p2] = r.manifest.inputs;
    expect(p1!.patterns).toEqual([]);
    expect(p2!.patterns).toEqual(['site-b/*.csv']);
    const s1 = JSON.parse(read(join(dir, 'out3'), p1!.outputs.summary));
    const s2 = JSON.parse(read(join(dir, 'out3'), p2!.outputs.summary));
    expect(s1.settings['analysis.paco2_mmhg'].value).toBeNull();
    expect(s2.settings['analysis.paco2_mmhg']).toEqual({ value: 45, origin: 'given' });
    expect(s1.settings['analysis.leak_fraction']).toEqual({ value: 0.2, origin: 'given' });
    const rows = parseCsv(read(join(dir, 'out3'), 'recordings.csv'));
    expect(rows[1]!.vdvt_enghoff_median).toBe('');
    expect(Number(rows[2]!.vdvt_enghoff_median)).toBeGreaterThan(0);

    const cli = await run({ outDir: 'out4', opts: { settings: settingsPath, paco2: 40 } });
    const s2b = JSON.parse(read(join(dir, 'out4'), cli.manifest.inputs[2]!.outputs.summary));
    expect(s2b.settings['analysis.paco2_mmhg'].value).toBe(40);
  });
});
