// batch --report writes DIR/index.html, the study index, from the files on disk: three small recordings, one of them
// with many short gaps (most of its breaths excluded). The page lists all three with the values of recordings.csv,
// links to reports that exist (relative paths), flags only the gapped one as needing a look, and is written the same
// by a resumed run (index.html deleted) and by a merge of shards run with --report. Without --report no index.html
// and no thumb.svg are written.
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { settingsPlan } from '../../src/batch/file-settings';
import { mergeShards, MergeError } from '../../src/batch/merge';
import { runBatch, type BatchOptions } from '../../src/batch/run-batch';
import { CAUTION } from '../../src/report/caution';
import { csvCell } from '../../src/report/format';
import { parseCsv, read, writeRecording } from './helpers';

let dir = '';
const run = (over: Partial<BatchOptions> = {}) =>
  runBatch({ inputs: ['data'], outDir: 'out', plan: settingsPlan({}), jobs: 1, resume: false, shard: null, progress: 'none', cwd: dir, report: true, ...over });

function pageRows(html: string): Record<string, unknown>[] {
  const m = /<script type="application\/json" id="study-data">(.*)<\/script>/.exec(html);
  if (!m) throw new Error('no study-data script');
  return JSON.parse(m[1]!).rows;
}

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-batch-index-'));
  writeRecording(join(dir, 'data/a.csv'), 'adult-healthy', 3, 1);
  writeRecording(join(dir, 'data/b.csv'), 'child-sidestream', 3, 2);
  // c: the same kind of recording with 0.1 s of rows removed every 5 s after the first 20 s (gaps inside most breaths)
  writeRecording(join(dir, 'data/c.csv'), 'adult-healthy', 3, 3);
  const lines = read(join(dir, 'data'), 'c.csv').trimEnd().split('\n');
  const kept = lines.slice(1).filter((l) => {
    const t = Number(l.split(',')[0]);
    return t < 20 || t % 5 > 0.1;
  });
  writeFileSync(join(dir, 'data/c.csv'), [lines[0], ...kept].join('\n') + '\n');
  await run();
}, 120_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('batch --report: index.html', () => {
  it('lists every recording with its recordings.csv values and a link to its report', () => {
    const html = read(join(dir, 'out'), 'index.html');
    const table = parseCsv(read(join(dir, 'out'), 'recordings.csv'));
    const rows = pageRows(html);
    expect(rows.map((r) => r.recording)).toEqual(['data/a.csv', 'data/b.csv', 'data/c.csv']);
    expect(rows.map((r) => r.recording)).toEqual(table.map((t) => t.recording));
    const keys = ['duration_s', 'breaths_ok', 'breaths_caution', 'breaths_excluded', 'delay_s', 'delay_origin',
      'vd_aw_ml_median', 'petco2_mmhg_median', 'peco2_mmhg_median', 'slope3_mmhg_per_l_median', 'vdvt_bohr_median'];
    for (const [k, r] of rows.entries()) {
      for (const key of keys) expect(csvCell(r[key]), `${r.recording} ${key}`).toBe(table[k]![key]);
      const link = String(r.report);
      expect(link.startsWith('recordings/')).toBe(true);
      expect(existsSync(join(dir, 'out', decodeURIComponent(link)))).toBe(true);
      expect(link).toBe(`${dirname(JSON.parse(read(join(dir, 'out'), 'manifest.json')).inputs[k].outputs.summary)}/report.html`);
      expect(String(r.thumb)).toContain('<path');
    }
    expect(html).toContain(CAUTION);
    expect(html).not.toMatch(/https?:/i);
  });

  it('flags only the gapped recording as needing a look', () => {
    const rows = pageRows(read(join(dir, 'out'), 'index.html'));
    const table = parseCsv(read(join(dir, 'out'), 'recordings.csv'));
    expect(Number(table[2]!.breaths_excluded) / Number(table[2]!.breaths_found)).toBeGreaterThan(0.5);
    expect(rows.map((r) => (r.look as string[]).length > 0)).toEqual([false, false, true]);
    expect((rows[2]!.look as string[])[0]).toMatch(/% of breaths excluded$/);
  });

  it('--resume --report rebuilds the same index.html from disk; a run without --report writes none', async () => {
    const before = read(join(dir, 'out'), 'index.html');
    rmSync(join(dir, 'out', 'index.html'));
    const again = await run({ resume: true });
    expect(again.manifest.counts.resumed).toBe(3);
    expect(read(join(dir, 'out'), 'index.html')).toBe(before);
    await run({ outDir: 'plain', report: false });
    expect(existsSync(join(dir, 'plain', 'index.html'))).toBe(false);
    expect(existsSync(join(dir, 'plain', dirname(again.manifest.inputs[0]!.outputs.summary), 'thumb.svg'))).toBe(false);
  });

  it('a merge of shards run with --report writes the same index.html; a mix of shards with and without is refused', async () => {
    for (const index of [0, 1]) await run({ outDir: `shard-${index}`, shard: { index, count: 2 } });
    mergeShards([join(dir, 'shard-1'), join(dir, 'shard-0')], join(dir, 'merged'));
    expect(readFileSync(join(dir, 'merged', 'index.html'), 'utf8')).toBe(read(join(dir, 'out'), 'index.html'));
    await run({ outDir: 'shard-1p', shard: { index: 1, count: 2 }, report: false });
    expect(() => mergeShards([join(dir, 'shard-0'), join(dir, 'shard-1p')], join(dir, 'merged2'))).toThrow(MergeError);
    expect(() => mergeShards([join(dir, 'shard-0'), join(dir, 'shard-1p')], join(dir, 'merged2'))).toThrow(/shard-1p: no index\.html here/);
  });
});
