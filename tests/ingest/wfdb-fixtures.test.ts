// WFDB records of a simulated recording (tests/fixtures/wfdb/make-fixtures.mjs writes their bytes from the published
// description, header(5) and signal(5) of the WFDB Applications Guide, sharing no code with the reader; the fixtures
// are committed, CI does not rebuild them). Each record has a twin CSV with exactly the physical values it stores.
// Checked: every decoded sample is within one digital step of the value given to the writer (sim.csv), and the full
// analysis of the record writes a breaths.csv byte-identical to that of its twin CSV.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readWfdbRecord } from '../../src/ingest/wfdb-reader';
import { analyseFile } from '../../src/node/analyse-file';
import { readWfdbFiles } from '../../src/node/wfdb-files';
import { composeOutputs, outputFile } from '../../src/report/outputs';
import { defaultSettings } from '../../src/settings';

const DIR = join(__dirname, '..', 'fixtures', 'wfdb');
const ingest = defaultSettings().ingest;

/** The simulated CSV given to the writer: time_s, flow_lps, co2_mmhg at 50 Hz, 30 s. */
function simulated(): { flow: number[]; co2: number[] } {
  const rows = readFileSync(join(DIR, 'sim.csv'), 'utf8').trim().split('\n').slice(1).map((l) => l.split(',').map(Number));
  return { flow: rows.map((r) => r[1]!), co2: rows.map((r) => r[2]!) };
}

/** The fixtures as make-fixtures.mjs writes them: gains (ADC units per L/s and per mmHg) and rates. */
const FIXTURES = [
  { name: 'f16', flow_gain: 10000, co2_gain: 500, co2_every: 1, no_data: [] as string[] },
  { name: 'f212', flow_gain: 1000, co2_gain: 40, co2_every: 1, no_data: [] as string[] },
  // "no data" at flow sample 301 and CO2 sample 100 (at flow sample 200)
  { name: 'mf212', flow_gain: 1000, co2_gain: 40, co2_every: 2, no_data: ['flow', 'CO2'] },
  // 8-bit offset binary: coarse steps of 0.01 L/s and 0.2 mmHg
  { name: 'f80', flow_gain: 100, co2_gain: 5, co2_every: 1, no_data: [] as string[] },
] as const;

async function breathsCsv(path: string): Promise<{ csv: string; rows: number; gaps: number }> {
  const settings = defaultSettings();
  const { core, report } = await analyseFile(path, settings);
  const o = composeOutputs(core, report, settings, new Set(), new Map(), null);
  return { csv: outputFile(o, 'breaths.csv')!, rows: report.rows, gaps: report.gaps };
}

describe('WFDB fixtures: decoded values', () => {
  const sim = simulated();
  for (const f of FIXTURES) {
    it(`${f.name}: every flow and CO2 sample within one digital step of the value given to the writer`, async () => {
      const { header, signals } = await readWfdbFiles(join(DIR, `${f.name}.hea`));
      const { blocks, report } = readWfdbRecord(header, signals, ingest, 20, `${f.name}.hea`);
      let worstFlow = 0;
      let worstCo2 = 0;
      let n = 0;
      let nanFlow = 0;
      let nanCo2 = 0;
      for (const b of blocks) {
        for (let i = 0; i < b.n; i++) {
          const k = Math.round(b.t_s[i]! * 50);
          expect(b.t_s[i]).toBe(k / 50);
          n++;
          if (Number.isNaN(b.flow_lps[i]!)) nanFlow++;
          else worstFlow = Math.max(worstFlow, Math.abs(b.flow_lps[i]! - sim.flow[k]!));
          if (k % f.co2_every !== 0 || (f.no_data.length && k === 200)) continue;
          if (Number.isNaN(b.co2_mmhg[i]!)) nanCo2++;
          else worstCo2 = Math.max(worstCo2, Math.abs(b.co2_mmhg[i]! - sim.co2[k]!));
        }
      }
      // nearest-value rounding in the writer: at most half a step (plus the rounding of doubles)
      expect(worstFlow).toBeLessThanOrEqual(0.5 / f.flow_gain + 1e-12);
      expect(worstCo2).toBeLessThanOrEqual(0.5 / f.co2_gain + 1e-12);
      // one "no data" flow sample is left out (its row holds nothing); the CO2 one leaves a NaN only where no
      // later CO2 sample can fill it: none here, it is interpolated from its neighbours
      expect(n).toBe(f.no_data.length ? 1499 : 1500);
      expect([nanFlow, nanCo2]).toEqual([0, 0]);
      expect(report.notes.filter((x) => x.includes('"no data" value -2048')).length).toBe(f.no_data.length);
      expect(report.notes.filter((x) => x.endsWith('matches')).length).toBe(2);
    });
  }

  it('clock start from the base time (and date)', async () => {
    const start = async (name: string) => {
      const { header, signals } = await readWfdbFiles(join(DIR, `${name}.hea`));
      return readWfdbRecord(header, signals, ingest, 20, name).report.clock_start;
    };
    expect(await start('f16')).toEqual({ kind: 'date_time', seconds: Date.UTC(2026, 11, 3, 8, 30) / 1000, text: '2026-12-03T08:30:00.000' });
    expect(await start('mf212')).toEqual({ kind: 'time_of_day', seconds: 86370, text: '23:59:30.000' });
    expect(await start('f212')).toBeUndefined();
  });
});

describe('analysis of a WFDB record equals the analysis of its twin CSV', () => {
  for (const f of FIXTURES) {
    it(`${f.name}: breaths.csv byte-identical`, async () => {
      const a = await breathsCsv(join(DIR, `${f.name}.hea`));
      const b = await breathsCsv(join(DIR, `${f.name}.twin.csv`));
      expect(a.csv.split('\n').length).toBeGreaterThan(4);
      expect(a.csv).toBe(b.csv);
      expect([a.rows, a.gaps]).toEqual([b.rows, b.gaps]);
    });
  }
});
