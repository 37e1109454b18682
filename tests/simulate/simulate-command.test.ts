// `phasewise simulate` command: files written atomically with their truth, --list, --set, one-line usage errors.
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Command } from 'commander';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { parseOverride, registerSimulate, truthPathFor } from '../../src/cli/simulate-command';

let dir = '';
let out = '';
let err = '';

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-sim-'));
  out = '';
  err = '';
  vi.spyOn(process.stdout, 'write').mockImplementation((s: string | Uint8Array) => ((out += String(s)), true));
  vi.spyOn(process.stderr, 'write').mockImplementation((s: string | Uint8Array) => ((err += String(s)), true));
  process.exitCode = undefined;
});
afterEach(() => {
  vi.restoreAllMocks();
  process.exitCode = undefined;
  rmSync(dir, { recursive: true, force: true });
});

async function run(...args: string[]): Promise<void> {
  const program = new Command('phasewise').exitOverride();
  registerSimulate(program);
  await program.parseAsync(['node', 'phasewise', 'simulate', ...args]);
}

describe('phasewise simulate', () => {
  it('--list prints every scenario with its description', async () => {
    await run('--list');
    expect(out).toMatch(/^adult-healthy\s+Healthy adult/m);
    expect(out).toMatch(/^infant-cardiac-shunt\s+/m);
    expect(process.exitCode ?? 0).toBe(0);
  });
  it('writes FILE.csv and FILE.truth.json, applies --minutes, --seed and --set, leaves no .tmp file', async () => {
    const file = join(dir, 'rec.csv');
    await run('child-sidestream', '--out', file, '--minutes', '0.5', '--seed', '7', '--set', 'delimiter=;', '--set', 'decimal=,', '--set', 'co2_unit=kPa');
    expect(process.exitCode ?? 0).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['rec.csv', 'rec.truth.json']);
    const csv = readFileSync(file, 'utf8');
    expect(csv.split('\n')[0]).toBe('time_s;flow_lps;co2_kpa');
    expect(csv.split('\n').length - 2).toBe(3000);
    const truth = JSON.parse(readFileSync(truthPathFor(file), 'utf8'));
    expect(truth.seed).toBe(7);
    expect(truth.params.minutes).toBe(0.5);
    expect(truth.params.delay_s).toBe(1.5);
    expect(truth.breath_count).toBe(truth.breaths.length);
    expect(truth.breaths[0].vd_aw_ml).toBe(55);
    expect(out).toContain('rec.truth.json');
  });
  it('usage errors: one line on stderr, exit code 2, no files', async () => {
    const file = join(dir, 'x.csv');
    for (const args of [
      ['no-such-scenario', '--out', file],
      ['adult-healthy'],
      ['adult-healthy', '--out', file, '--set', 'nonsense=1'],
      ['adult-healthy', '--out', file, '--set', 'vt_ml=lots'],
      ['adult-healthy', '--out', file, '--seed', '-1'],
      ['adult-healthy', '--out', file, '--set', 'rr_bpm=500'],
    ]) {
      err = '';
      process.exitCode = undefined;
      await run(...args);
      expect(process.exitCode).toBe(2);
      expect(err.trim().split('\n')).toHaveLength(1);
      expect(err).toMatch(/^phasewise simulate: /);
      expect(err).not.toMatch(/\n\s+at /);
    }
    expect(existsSync(file)).toBe(false);
  });
  it('parseOverride types values after the defaults', () => {
    expect(parseOverride('delay_s=1.2')).toEqual(['delay_s', 1.2]);
    expect(parseOverride('delimiter=tab')).toEqual(['delimiter', '\t']);
    expect(parseOverride('co2_rate_hz=null')).toEqual(['co2_rate_hz', null]);
    expect(parseOverride('extra_columns=pressure,volume')).toEqual(['extra_columns', ['pressure', 'volume']]);
    expect(parseOverride('events=[{"t_s":60,"param":"q_l_min","to":2,"ramp_s":0}]')[1]).toEqual([{ t_s: 60, param: 'q_l_min', to: 2, ramp_s: 0 }]);
  });
});
