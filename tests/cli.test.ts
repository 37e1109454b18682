// The command line as users meet it: every failure is one line on stderr with the documented exit code,
// never a stack trace; a good run exits 0 and writes its files. Runs the built CLI (npm test builds it first).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { expectClose } from './helpers/expect-close';

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

  it('--report adds report.html and leaves every other output byte-identical (the curves kept for it change nothing)', () => {
    const plain = join(dir, 'report-plain');
    const withReport = join(dir, 'report-on');
    expect(run('analyse', sample, '--out', plain, '--quiet').status).toBe(0);
    const r = run('analyse', sample, '--out', withReport, '--report');
    expect(r.status, r.stderr).toBe(0);
    expect(existsSync(join(plain, 'report.html'))).toBe(false);
    expect(r.stdout).toContain(join(withReport, 'report.html'));
    const html = readFileSync(join(withReport, 'report.html'), 'utf8');
    expect(html).toContain('Volumetric capnography report');
    for (const f of ['breaths.csv', 'summary.json', 'trends.csv', 'events.csv']) {
      expect(readFileSync(join(withReport, f), 'utf8'), f).toBe(readFileSync(join(plain, f), 'utf8'));
    }
  });

  it('--weight gives per-kg breath values and the summary records the weight, with or without a gas file', () => {
    const out = join(dir, 'weight');
    const r = run('analyse', sample, '--out', out, '--weight', '80');
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain('Airway dead space per kg');
    const [head, ...lines] = readFileSync(join(out, 'breaths.csv'), 'utf8').trim().split('\n');
    const col = (name: string) => head!.split(',').indexOf(name);
    expect(col('vd_aw_ml_per_kg')).toBeGreaterThan(0);
    let checked = 0;
    for (const line of lines) {
      const f = line.split(',');
      const vd = Number(f[col('vd_aw_ml')]);
      if (f[col('vd_aw_ml')] === '' || !Number.isFinite(vd)) continue;
      // the per-kg column is the dead space over 80 kg, to the file's rounding
      expectClose(Number(f[col('vd_aw_ml_per_kg')]), vd / 80, { abs: 0.01 });
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.weight).toMatchObject({ basis: 'actual_weight', weight_kg: 80 });
    expect(summary.metrics.vd_aw_ml_per_kg.n).toBeGreaterThan(10);
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

  it('a gas row with Hb in a wrong unit is named on the terminal with the file, line, column, value and likely unit', () => {
    const gasFile = join(dir, 'gas-hb.csv');
    writeFileSync(gasFile, 'time_s,paco2_mmhg,hb_g_dl\n60,40,120\n100,40,13\n');
    const out = join(dir, 'hb-gas');
    const r = run('analyse', sample, '--out', out, '--gas', gasFile);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain(
      `gas note: ${gasFile}: line 2, column hb_g_dl: 120 is outside 2-25 g/dL; looks like g/L (= 12.0 g/dL); name the column hb_g_l; row not used`,
    );
    expect(readFileSync(join(out, 'gas.csv'), 'utf8').trim().split('\n')).toHaveLength(2);
  });

  it('gas clock times without --start on a recording without a clock: exit 3, the message names --start HH:MM:SS', () => {
    writeFileSync(join(dir, 'gas-clock.csv'), 'clock,paco2_mmhg\n09:31:00,40\n');
    expectOneLineFailure(run('analyse', sample, '--out', join(dir, 'x'), '--gas', join(dir, 'gas-clock.csv')), 3, '--start HH:MM:SS');
  });

  it("gas clock times on a clock-stamped recording need no --start; a gas before its first stamp is reported as such", () => {
    // adult-spontaneous-messy.csv: first stamp 09:30:00.000 (its first data line), 3 min long
    const messy = fileURLToPath(new URL('../sample-waveforms/adult-spontaneous-messy.csv', import.meta.url));
    writeFileSync(join(dir, 'gas-messy.csv'), 'clock,paco2_mmhg\n09:31:00,40\n09:29:30,41\n');
    const out = join(dir, 'messy-gas');
    const r = run('analyse', messy, '--out', out, '--gas', join(dir, 'gas-messy.csv'));
    expect(r.status, r.stderr).toBe(0);
    const lines = readFileSync(join(out, 'gas.csv'), 'utf8').trim().split('\n');
    const head = lines[0]!.split(',');
    const cell = (line: string, name: string) => line.split(',')[head.indexOf(name)];
    // 09:29:30 - 09:30:00 = -30 s; 09:31:00 - 09:30:00 = 60 s (derived here)
    expect(lines.slice(1).map((l) => cell(l, 'time_s'))).toEqual(['-30', '60']);
    expect(lines[1]).toContain('before the recording');
    expect(r.stdout).toMatch(/gas note: gas sample 1 \(line 3, clock 09:29:30, t = -30\.0 s\): before the recording/);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.gas.clock).toEqual({ start: '09:30:00.000', source: 'recording' });
    expect(summary.gas.rows[0].notes).toMatch(/^before the recording/);
  });

  // The settings file's `gas` section (defaults < file < command line). Gas samples: the first with every input for
  // the shunt by contents, both inside the recording so that the breaths after them get PaCO2 estimates.
  describe('settings file gas section', () => {
    const gasFile = join(dir, 'gas-settings.csv');
    writeFileSync(gasFile, 'time_s,paco2_mmhg,pao2_mmhg,sao2_pct,svo2_pct,pvo2_mmhg,hb_g_dl,fio2_pct\n60,40,100,98,75,40,15,50\n100,39,,,,,,\n');
    const analyseWith = (name: string, gas: unknown, ...extra: string[]) => {
      const out = join(dir, name);
      const args = ['analyse', sample, '--out', out, '--gas', gasFile, ...extra];
      if (gas !== null) {
        writeFileSync(join(dir, `${name}.json`), JSON.stringify({ gas }));
        args.push('--settings', join(dir, `${name}.json`));
      }
      const r = run(...args);
      expect(r.status, r.stderr).toBe(0);
      const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
      const estimates = readFileSync(join(out, 'paco2_estimates.csv'), 'utf8').trim().split('\n').map((l) => l.split(','));
      const head = estimates[0]!;
      const width = estimates.slice(1).map((c) => Number(c[head.indexOf('band_high_mmhg')]) - Number(c[head.indexOf('band_low_mmhg')]));
      return { summary, width };
    };

    it("changes the shunt fraction as the hand calculation says (tests/gas/gas-settings-file.test.ts: 0.179277) and records each value as given", () => {
      const gas = { rq: 1, hb_o2_capacity_ml_per_g: 1.39, o2_dissolved_ml_per_dl_per_mmhg: 0.0031, end_capillary_saturation: 'one' };
      const { summary } = analyseWith('gas-file', gas);
      expectClose(summary.gas.rows[0].shunt_fraction, 1.08815 / 6.06965, { rel: 1e-9 });
      for (const [k, v] of Object.entries(gas)) expect(summary.gas.settings[k], k).toBe(v);
      expect(summary.gas.settings.given).toEqual(expect.arrayContaining(Object.keys(gas)));
      expect(summary.gas.settings.given).not.toContain('band_level');
      expect(summary.gas.settings.band_level).toBe(0.8);
    });

    it('band_level 0.95 widens every band by z(0.975) / z(0.9) = 1.959964 / 1.281552 (Abramowitz and Stegun 1964, table 26.1)', () => {
      const base = analyseWith('gas-band-80', null).width;
      const wide = analyseWith('gas-band-95', { band_level: 0.95 }).width;
      expect(base.length).toBeGreaterThan(10);
      expect(wide).toHaveLength(base.length);
      // bands are written with 6 significant digits (about 5e-4 mmHg): the tolerance covers that rounding
      base.forEach((w, k) => expectClose(wide[k]!, (w * 1.959964) / 1.281552, { abs: 0.003 }, `breath ${k + 1}`));
    });

    it('a command-line option beats the file: --gas-window 30 over window_s 90, --cardiac-output 6 over 4', () => {
      const { summary } = analyseWith('gas-cli-wins', { window_s: 90, cardiac_output_l_min: 4 }, '--gas-window', '30', '--cardiac-output', '6');
      expect(summary.gas.settings.window_s).toBe(30);
      expect(summary.gas.settings.cardiac_output_l_min).toBe(6);
      expect(summary.gas.settings.given).toEqual(expect.arrayContaining(['window_s', 'cardiac_output_l_min']));
    });

    it('an unknown gas key: exit 2, one line naming it', () => {
      writeFileSync(join(dir, 'gas-typo.json'), '{"gas":{"band_levle":0.9}}');
      expectOneLineFailure(run('analyse', sample, '--out', join(dir, 'x'), '--gas', gasFile, '--settings', join(dir, 'gas-typo.json')), 2, 'band_levle');
    });
  });

  it('no breath usable for the summary: outputs written, then exit 3 with one line saying why the table is empty', () => {
    // 10 s of a small flow oscillation with flat CO2: breath-like swings are found, none has a capnogram
    const lines = ['time_s,flow_lps,co2_mmhg'];
    for (let i = 0; i < 1000; i++) lines.push(`${(i / 100).toFixed(2)},${(0.01 * Math.sin((7 * i) / 100)).toFixed(4)},0.30`);
    const file = join(dir, 'no-breath.csv');
    writeFileSync(file, lines.join('\n') + '\n');
    const r = run('analyse', file, '--out', join(dir, 'no-breath'), '--quiet');
    expectOneLineFailure(r, 3, 'no breath is usable');
    expect(r.stderr).toMatch(/10 found, 10 excluded \(/);
    expect(existsSync(join(dir, 'no-breath', 'summary.json'))).toBe(true);
  });

  it('a blood gas without oxygen values: the terminal names what is missing (it was only in summary.json)', () => {
    const gasFile = join(dir, 'gas-no-o2.csv');
    writeFileSync(gasFile, 'time_s,paco2_mmhg\n60,39.5\n');
    const r = run('analyse', sample, '--out', join(dir, 'gas-no-o2'), '--gas', gasFile);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/gas note: sample 1 \(line 2\): missing .*sao2_pct.*; the values that need them are left empty/);
  });

  it('unknown scenario for simulate: exit 2 with the valid names', () => {
    expectOneLineFailure(run('simulate', 'no-such-patient', '--out', join(dir, 's.csv')), 2, 'adult-healthy');
  });
});
