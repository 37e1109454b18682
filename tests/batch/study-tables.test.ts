// The study-wide trends.csv and events.csv of a batch hold every recording's rows, prefixed with its name, in input
// order (common practice, no source: tidy long tables).
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const cli = fileURLToPath(new URL('../../dist/cli.cjs', import.meta.url));
const samples = fileURLToPath(new URL('../../sample-waveforms/', import.meta.url));

describe.skipIf(!existsSync(cli))('batch study tables', () => {
  it('trends.csv and events.csv combine the per-recording files with recording and recording_id columns', () => {
    const dir = mkdtempSync(join(tmpdir(), 'phasewise-study-'));
    mkdirSync(join(dir, 'data'));
    for (const f of ['adult-healthy.csv', 'adult-perfusion-fall.csv']) copyFileSync(join(samples, f), join(dir, 'data', f));
    const r = spawnSync(process.execPath, [cli, 'batch', 'data', '--out', 'out', '--jobs', '1', '--quiet'], { cwd: dir, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    for (const name of ['trends.csv', 'events.csv']) {
      const study = readFileSync(join(dir, 'out', name), 'utf8').trimEnd().split('\n');
      const expected: string[] = [];
      for (const rec of ['data/adult-healthy.csv', 'data/adult-perfusion-fall.csv']) {
        const own = readFileSync(join(dir, 'out', 'recordings', rec.replace('/', '__'), name), 'utf8').trimEnd().split('\n');
        if (expected.length === 0) expected.push(`recording,recording_id,${own[0]}`);
        const id = rec.replace(/^data\//, '').replace(/\.csv$/, '');
        expected.push(...own.slice(1).map((l) => `${rec},${id},${l}`));
      }
      expect(study).toEqual(expected);
    }
    // the perfusion-fall recording's event is in the study table
    expect(readFileSync(join(dir, 'out', 'events.csv'), 'utf8')).toContain('data/adult-perfusion-fall.csv,adult-perfusion-fall,720,');
  });
});
