// `phasewise analyse rec.hea` and `phasewise batch` with WFDB records through the built CLI: the header is the
// recording, its signal files are read from its folder; the outputs equal those of the twin CSVs
// (tests/fixtures/wfdb). Runs the built CLI (npm test builds it first).
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const cli = fileURLToPath(new URL('../../dist/cli.cjs', import.meta.url));
const fixtures = fileURLToPath(new URL('../fixtures/wfdb/', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'phasewise-wfdb-cli-'));
const run = (args: string[], cwd?: string) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', ...(cwd ? { cwd } : {}) });

const RECORDS: Record<string, string[]> = {
  f16: ['f16.hea', 'f16.dat'],
  f212: ['f212.hea', 'f212_flow.dat', 'f212_co2.dat'],
  mf212: ['mf212.hea', 'mf212.dat'],
  f80: ['f80.hea', 'f80.dat'],
};

function copyRecords(to: string, names: string[], twins = true): void {
  mkdirSync(to, { recursive: true });
  for (const n of names) {
    for (const f of RECORDS[n]!) copyFileSync(join(fixtures, f), join(to, f));
    if (twins) copyFileSync(join(fixtures, `${n}.twin.csv`), join(to, `${n}.twin.csv`));
  }
}

describe.skipIf(!existsSync(cli))('phasewise analyse on a WFDB record', () => {
  for (const name of Object.keys(RECORDS)) {
    it(`${name}.hea: exit 0, breaths.csv byte-identical to the twin CSV's`, () => {
      const a = join(dir, `${name}-wfdb`);
      const b = join(dir, `${name}-csv`);
      const r = run(['analyse', join(fixtures, `${name}.hea`), '--out', a]);
      expect(r.status, r.stderr).toBe(0);
      expect(r.stdout).toMatch(/read: WFDB signals, flow (Airway flow|Flow) \[L\/s\], CO2 CO2 \[mmHg\], 50 Hz/);
      expect(r.stdout).toContain('CAUTION:');
      expect(run(['analyse', join(fixtures, `${name}.twin.csv`), '--out', b, '--quiet']).status).toBe(0);
      expect(readFileSync(join(a, 'breaths.csv'), 'utf8')).toBe(readFileSync(join(b, 'breaths.csv'), 'utf8'));
      const input = JSON.parse(readFileSync(join(a, 'summary.json'), 'utf8')).input;
      expect(input.file).toBe(join(fixtures, `${name}.hea`));
      if (name === 'mf212') {
        expect(input.clock_start).toEqual({ kind: 'time_of_day', seconds: 86370, text: '23:59:30.000' });
        expect(r.stdout).toContain('note: warning: 1 flow sample of signal "Flow" hold the format 212 "no data" value -2048');
      }
    });
  }

  it('a missing signal file: one line naming it and the folder, exit 3', () => {
    const d = join(dir, 'missing');
    copyRecords(d, ['f212'], false);
    rmSync(join(d, 'f212_co2.dat'));
    const r = run(['analyse', join(d, 'f212.hea'), '--out', join(dir, 'missing-out')]);
    expect(r.status).toBe(3);
    expect(r.stderr.trim()).toBe(`phasewise: ${join(d, 'f212.hea')}: the signal file "f212_co2.dat" named by the header is not in the folder ${d}/ (the header's folder). Put the signal files beside the .hea file.`);
  });

  it('a signal file given as the recording is refused with the header to give instead', () => {
    const r = run(['analyse', join(fixtures, 'f16.dat'), '--out', join(dir, 'dat-out')]);
    expect(r.status).toBe(3);
    expect(r.stderr.trim()).toBe(`phasewise: ${join(fixtures, 'f16.dat')}: this is a signal file of the WFDB record ${join(fixtures, 'f16.hea')}, not a recording of its own. Give the record's header (${join(fixtures, 'f16.hea')}) instead.`);
  });
});

describe.skipIf(!existsSync(cli))('blood gas clock times placed on the clock start of a WFDB record or an EDF file', () => {
  // f16.hea: base time 08:30:00, date 3/12/2026; c100.edf: start 02.01.26 03.04.05. A gas drawn 20 s (30 s) after the
  // start is at time_s 20 (30) without --start; before the clock start was read from these headers, this was an error
  // asking for --start.
  for (const [rec, clock, seconds] of [[join(fixtures, 'f16.hea'), '08:30:20', '20'], [fileURLToPath(new URL('../fixtures/edf/c100.edf', import.meta.url)), '03:04:35', '30']] as const) {
    it(rec.slice(-8), () => {
      const gas = join(dir, `gas-${seconds}.csv`);
      writeFileSync(gas, `clock,paco2_mmhg\n${clock},40.1\n`);
      const out = join(dir, `gas-out-${seconds}`);
      const r = run(['analyse', rec, '--gas', gas, '--out', out, '--quiet']);
      expect(r.status, r.stderr).toBe(0);
      const [head, row] = readFileSync(join(out, 'gas.csv'), 'utf8').split('\n');
      expect(row!.split(',')[head!.split(',').indexOf('time_s')]).toBe(seconds);
    });
  }
});

describe.skipIf(!existsSync(cli))('phasewise batch with WFDB records', () => {
  it('a folder: finds .hea beside .csv, each record analysed to the same breaths as its twin CSV', () => {
    const data = join(dir, 'mixed');
    copyRecords(data, Object.keys(RECORDS));
    const out = join(dir, 'mixed-out');
    const r = run(['batch', data, '--out', out, '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    const recs = readdirSync(join(out, 'recordings'));
    expect(recs.length).toBe(2 * Object.keys(RECORDS).length);
    for (const name of Object.keys(RECORDS)) {
      const rec = recs.find((d) => d.endsWith(`__${name}.hea`))!;
      const twin = recs.find((d) => d.endsWith(`__${name}.twin.csv`))!;
      expect(readFileSync(join(out, 'recordings', rec, 'breaths.csv'), 'utf8')).toBe(readFileSync(join(out, 'recordings', twin, 'breaths.csv'), 'utf8'));
    }
  });

  it('a glob that also matches the signal files: they are skipped, and the manifest says why', () => {
    const data = join(dir, 'glob', 'data');
    copyRecords(data, ['f212'], false);
    const r = run(['batch', 'data/*', '--out', 'out', '--quiet'], join(dir, 'glob'));
    expect(r.status, r.stderr).toBe(0);
    const m = JSON.parse(readFileSync(join(dir, 'glob', 'out', 'manifest.json'), 'utf8'));
    expect(m.inputs.map((e: { recording: string }) => e.recording)).toEqual(['data/f212.hea']);
    expect(m.warnings).toEqual([
      'data/f212_co2.dat: skipped, it is a signal file of the WFDB record data/f212.hea (read with that header)',
      'data/f212_flow.dat: skipped, it is a signal file of the WFDB record data/f212.hea (read with that header)',
    ]);
    // the content hash covers the signal files: a changed signal file is analysed again with --resume
    const again = () => JSON.parse(readFileSync(join(dir, 'glob', 'out', 'manifest.json'), 'utf8')).inputs[0];
    const before = again();
    expect(before.size).toBe(['f212.hea', 'f212_flow.dat', 'f212_co2.dat'].reduce((s, f) => s + readFileSync(join(fixtures, f)).length, 0));
    expect(run(['batch', 'data/*.hea', '--out', 'out', '--quiet', '--resume'], join(dir, 'glob')).status).toBe(0);
    expect(again()).toMatchObject({ resumed: true, sha256: before.sha256 });
    const co2 = readFileSync(join(data, 'f212_co2.dat'));
    co2[0] = co2[0]! ^ 1;
    writeFileSync(join(data, 'f212_co2.dat'), co2);
    expect(run(['batch', 'data/*.hea', '--out', 'out', '--quiet', '--resume'], join(dir, 'glob')).status).toBe(0);
    expect(again().resumed).toBe(false);
    expect(again().sha256).not.toBe(before.sha256);
  });
});
