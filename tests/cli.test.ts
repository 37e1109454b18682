// The command line as users meet it: every failure is one line on stderr with the documented exit code,
// never a stack trace; a good run exits 0 and writes its files. Runs the built CLI (npm test builds it first).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const cli = fileURLToPath(new URL('../dist/cli.cjs', import.meta.url));
const sample = fileURLToPath(new URL('../sample-waveforms/adult-healthy.csv', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'phasewise-cli-'));
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });

function expectOneLineFailure(r: ReturnType<typeof run>, code: number, contains: string): void {
  expect(r.status, r.stderr).toBe(code);
  const lines = r.stderr.trim().split('\n');
  expect(lines.length, r.stderr).toBe(1);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(r.stderr).toContain(contains);
}

describe.skipIf(!existsSync(cli))('phasewise command line', () => {
  it('analyses the sample: exit 0, summary table with the caution line, all output files', () => {
    const out = join(dir, 'ok');
    const r = run('analyse', sample, '--out', out);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain('Airway dead space (Fowler)');
    expect(r.stdout).toContain('CAUTION:');
    for (const f of ['breaths.csv', 'summary.json', 'trends.csv', 'events.csv']) expect(existsSync(join(out, f))).toBe(true);
  });

  it('missing file: exit 3, one line naming the file', () => {
    expectOneLineFailure(run('analyse', join(dir, 'nope.csv'), '--out', join(dir, 'x')), 3, 'nope.csv');
  });

  it('empty file and binary file: exit 3', () => {
    writeFileSync(join(dir, 'empty.csv'), '');
    expectOneLineFailure(run('analyse', join(dir, 'empty.csv'), '--out', join(dir, 'x')), 3, 'empty');
    writeFileSync(join(dir, 'book.xlsx'), Buffer.from([0x50, 0x4b, 3, 4, 0, 0, 0, 0, 1, 2, 3]));
    expectOneLineFailure(run('analyse', join(dir, 'book.xlsx'), '--out', join(dir, 'x')), 3, 'zip');
  });

  it('columns not found: exit 3, lists the header', () => {
    writeFileSync(join(dir, 'cols.csv'), 'time,paw,volume\n0,1,2\n0.01,1,2\n0.02,1,2\n');
    expectOneLineFailure(run('analyse', join(dir, 'cols.csv'), '--out', join(dir, 'x')), 3, 'paw');
  });

  it('bad settings file and bad option values: exit 2', () => {
    writeFileSync(join(dir, 'bad.json'), '{"analysis":{"leak_fraction":"high"}}');
    expectOneLineFailure(run('analyse', sample, '--out', join(dir, 'x'), '--settings', join(dir, 'bad.json')), 2, 'leak_fraction');
    writeFileSync(join(dir, 'typo.json'), '{"analysis":{"leak_fractoin":0.1}}');
    expectOneLineFailure(run('analyse', sample, '--out', join(dir, 'x'), '--settings', join(dir, 'typo.json')), 2, 'typo.json');
    expect(run('analyse', sample, '--out', join(dir, 'x'), '--delay', 'soon').status).toBe(2);
    expect(run('analyse', sample, '--out', join(dir, 'x'), '--co2-unit', 'ppm').status).toBe(2);
  });

  it('bad gas file: exit 3, one line naming it', () => {
    writeFileSync(join(dir, 'gas.csv'), 'when,paco2\n1,40\n');
    expectOneLineFailure(run('analyse', sample, '--out', join(dir, 'x'), '--gas', join(dir, 'gas.csv')), 3, 'gas.csv');
  });

  it('unknown scenario for simulate: exit 2 with the valid names', () => {
    expectOneLineFailure(run('simulate', 'no-such-patient', '--out', join(dir, 's.csv')), 2, 'adult-healthy');
  });
});
