// What `batch` prints and the recording_id column of the study tables: the closing lines name every file written,
// with paths joined properly when --out ends in "/"; recording_id is the recording's path below its input folder,
// without extension, beside the recording column of every study table.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildBundles, parseCsv, writeRecording } from './helpers';
import { CAUTION } from '../../src/report/caution';

let dir = '';
let cli = '';

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-terminal-'));
  cli = (await buildBundles(join(dir, 'bin'))).cli;
  writeRecording(join(dir, 'data', 'a.csv'), 'adult-healthy', 3, 1);
  writeRecording(join(dir, 'data', 'site 2', 'b.tsv.csv'), 'adult-healthy', 3, 2);
}, 120_000);

describe('batch terminal lines and recording ids', () => {
  it('--out study/ names study/manifest.json (one slash) and every study table written', () => {
    const r = spawnSync(process.execPath, [cli, 'batch', 'data', '--out', 'study/', '--jobs', '1'], { cwd: dir, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).not.toContain('//');
    expect(r.stdout).toContain('written: study/breaths.csv, study/recordings.csv, study/trends.csv, study/events.csv, study/manifest.json\n');
    // the terminal summary ends with the same caution as analyse's
    expect(r.stdout.trimEnd().split('\n').pop()).toBe(`CAUTION: ${CAUTION}`);
  });

  it('every study table has recording_id beside recording', () => {
    const r = spawnSync(process.execPath, [cli, 'batch', 'data', '--out', 'ids', '--jobs', '1', '--quiet'], { cwd: dir, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const expected = new Map([['data/a.csv', 'a'], ['data/site 2/b.tsv.csv', 'site 2/b.tsv']]);
    for (const table of ['recordings.csv', 'breaths.csv', 'trends.csv']) {
      const text = readFileSync(join(dir, 'ids', table), 'utf8');
      expect(text.split('\n')[0]!.startsWith('recording,recording_id,'), table).toBe(true);
      const rows = parseCsv(text);
      expect(new Set(rows.map((row) => row.recording))).toEqual(new Set(expected.keys()));
      for (const row of rows) expect(row.recording_id, table).toBe(expected.get(row.recording!));
    }
    expect(readFileSync(join(dir, 'ids', 'events.csv'), 'utf8').split('\n')[0]!.startsWith('recording,recording_id,')).toBe(true);
  });
});
