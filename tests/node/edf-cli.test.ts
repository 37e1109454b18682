// `phasewise analyse rec.edf` through the built CLI: the reader is chosen by the extension; the outputs of an EDF+
// fixture (written by EDFlib, tests/fixtures/edf) equal those of its twin CSV. Runs the built CLI (npm test builds it first).
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const cli = fileURLToPath(new URL('../../dist/cli.cjs', import.meta.url));
const fixtures = fileURLToPath(new URL('../fixtures/edf/', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'phasewise-edf-cli-'));
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });

describe.skipIf(!existsSync(cli))('phasewise analyse on EDF+', () => {
  for (const name of ['c100.edf', 'd100.edf', 'c50.edf', 'b50.bdf']) {
    it(`${name}: exit 0, breaths.csv byte-identical to the twin CSV's`, () => {
      const a = join(dir, `${name}-edf`);
      const b = join(dir, `${name}-csv`);
      const r = run('analyse', join(fixtures, name), '--out', a);
      expect(r.status, r.stderr).toBe(0);
      expect(r.stdout).toContain('read: EDF/BDF signals, flow Airflow [L/s], CO2 CO2 [mmHg], 100 Hz');
      expect(r.stdout).toContain('CAUTION:');
      expect(r.stdout).toContain('EDF+ annotations: 2 — 2.5 s "suction", 42.5 s "PEEP 8" (summary.json input.annotations)');
      expect(run('analyse', join(fixtures, `${name}.twin.csv`), '--out', b, '--quiet').status).toBe(0);
      expect(readFileSync(join(a, 'breaths.csv'), 'utf8')).toBe(readFileSync(join(b, 'breaths.csv'), 'utf8'));
      const input = JSON.parse(readFileSync(join(a, 'summary.json'), 'utf8')).input;
      expect(input.annotations).toEqual([
        { onset_s: 2.5, duration_s: 1, text: 'suction' },
        { onset_s: 42.5, duration_s: null, text: 'PEEP 8' },
      ]);
      expect(input.gaps).toBe(name === 'd100.edf' ? 1 : 0);
    });
  }

  it('a missing label: one line on stderr naming the signals, exit 3', () => {
    const r = run('analyse', join(fixtures, 'b50.bdf'), '--out', join(dir, 'bad'), '--co2-col', 'EtCO2');
    expect(r.status).toBe(3);
    expect(r.stderr.trim()).toBe(`phasewise: ${join(fixtures, 'b50.bdf')}: no signal is labelled "EtCO2" (signals: "Airflow" (L/s), "CO2" (mmHg)). Give --co2-col with one of these labels.`);
  });
});

describe.skipIf(!existsSync(cli))('phasewise batch on a folder with EDF+ and BDF files', () => {
  it('finds .edf and .bdf beside .csv and analyses each to the same breaths as its twin CSV', () => {
    const data = join(dir, 'mixed');
    mkdirSync(data);
    for (const name of ['c100.edf', 'b50.bdf']) {
      copyFileSync(join(fixtures, name), join(data, name));
      copyFileSync(join(fixtures, `${name}.twin.csv`), join(data, `${name}.twin.csv`));
    }
    const out = join(dir, 'mixed-out');
    const r = run('batch', data, '--out', out, '--quiet');
    expect(r.status, r.stderr).toBe(0);
    const table = readFileSync(join(out, 'recordings.csv'), 'utf8');
    for (const name of ['c100.edf', 'b50.bdf']) {
      expect(table).toContain(name);
      const rec = readdirSync(join(out, 'recordings')).find((d) => d.endsWith(`${name}`))!;
      const twin = readdirSync(join(out, 'recordings')).find((d) => d.endsWith(`${name}.twin.csv`))!;
      expect(rec, name).toBeDefined();
      expect(readFileSync(join(out, 'recordings', rec, 'breaths.csv'), 'utf8')).toBe(readFileSync(join(out, 'recordings', twin, 'breaths.csv'), 'utf8'));
    }
  });
});
