// Rounding stability: the analysis of a bundled sample and of the same sample with every flow (or CO2) value
// multiplied by (1 + 1e-13), far below any sensor's resolution, must agree breath for breath. A discrete choice that
// rounding noise can flip (an argmax over equal values, a strict comparison of equal steps) shows up here as a breath
// value that jumps. Tolerance 1e-6 relative (derived here: the perturbation itself moves values by about 1e-13).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { analyseFile } from '../../src/node/analyse-file';
import { defaultSettings } from '../../src/settings';
import type { BreathRow } from '../../src/types';

const SAMPLES = join(__dirname, '..', '..', 'sample-waveforms');
const dir = mkdtempSync(join(tmpdir(), 'phasewise-rounding-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The sample with column `col` (1 flow, 2 CO2) multiplied by 1 + 1e-13 in every data row. */
function perturbed(name: string, col: 1 | 2): string {
  const lines = readFileSync(join(SAMPLES, `${name}.csv`), 'utf8').split('\n');
  const out = lines.map((line, k) => {
    if (k === 0 || line === '') return line;
    const cells = line.split(',');
    const v = Number(cells[col]);
    if (cells[col] !== '' && Number.isFinite(v)) cells[col] = String(v * (1 + 1e-13));
    return cells.join(',');
  });
  const path = join(dir, `${name}-${col}.csv`);
  writeFileSync(path, out.join('\n'));
  return path;
}

async function rows(path: string): Promise<BreathRow[]> {
  return (await analyseFile(path, defaultSettings())).core.breaths;
}

/** Breath values that differ by more than 1e-6 relative (1e-9 absolute near zero), as 'breath k field: a vs b'. */
function jumps(a: BreathRow[], b: BreathRow[]): string[] {
  const out: string[] = [];
  if (a.length !== b.length) return [`${a.length} vs ${b.length} breaths`];
  for (let k = 0; k < a.length; k++) {
    for (const [field, x] of Object.entries(a[k]!)) {
      const y = (b[k] as unknown as Record<string, unknown>)[field];
      if (typeof x === 'number' && typeof y === 'number') {
        const same = (Number.isNaN(x) && Number.isNaN(y)) || Math.abs(x - y) <= Math.max(1e-9, 1e-6 * Math.abs(x));
        if (!same) out.push(`breath ${k + 1} ${field}: ${x} vs ${y}`);
      } else if (JSON.stringify(x) !== JSON.stringify(y)) out.push(`breath ${k + 1} ${field}: ${JSON.stringify(x)} vs ${JSON.stringify(y)}`);
    }
  }
  return out;
}

describe('rounding stability of the bundled samples', () => {
  const cases: [string, 1 | 2][] = [
    ['adult-perfusion-fall', 1], // 50 Hz: straight stretches between samples on the phase II rise
    ['child-sidestream', 2], // quantised CO2: equal one-sample falls in the response-time fit
    ['infant-cardiac-shunt', 1],
    ['adult-healthy', 2],
  ];
  for (const [name, col] of cases) {
    it(`${name}: ${col === 1 ? 'flow' : 'CO2'} x (1 + 1e-13) moves no breath value`, async () => {
      const a = await rows(join(SAMPLES, `${name}.csv`));
      const b = await rows(perturbed(name, col));
      expect(a.length).toBeGreaterThan(20);
      expect(jumps(a, b).slice(0, 5)).toEqual([]);
    });
  }
});
