// Unit conversions against named values, header unit parsing, and the value rules for unknown units.
import { describe, expect, it } from 'vitest';
import { readRecordingText } from '../../src/ingest';
import {
  co2FactorToMmhg, co2UnitMismatch, flowFactorToLps, flowUnitMismatch, inferCo2Unit, inferFlowUnit, inferTimeUnit,
  MMHG_PER_KPA, parseUnitText, splitNameAndUnit,
} from '../../src/ingest/units';
import { DEFAULT_INGEST } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';
import { concatBlocks } from './reference-reader';

describe('pressure conversion mmHg <-> kPa', () => {
  it('40 mmHg -> 5.3329 kPa (derived here: 40 x 0.133322)', () => {
    expectClose(40 / MMHG_PER_KPA, 5.3329, { rel: 1e-4 });
  });
  it('5.3 kPa -> 39.753 mmHg (derived here: 5.3 x 7.50062)', () => {
    expectClose(5.3 * MMHG_PER_KPA, 39.753, { rel: 1e-4 });
  });
  it('1 kPa = 7.50062 mmHg (NIST SP 811, 2008, Appendix B: 1 mmHg = 133.3224 Pa)', () => {
    expectClose(MMHG_PER_KPA, 7.50062, { rel: 1e-5 });
  });
  it('agrees with the SI value 1 mmHg = 133.322387415 Pa within 5e-6 relative (`published: BIPM SI Brochure / ISO 80000-4`)', () => {
    // mathjs defines 1 mmHg = 133.322 Pa exactly: 1000/133.322 vs 1000/133.322387415 differ by 2.9e-6 relative.
    const si = 1000 / 133.322387415;
    expectClose(MMHG_PER_KPA, si, { rel: 5e-6 });
    expect(Math.abs(MMHG_PER_KPA / si - 1)).toBeGreaterThan(1e-6); // documents the known mathjs difference
  });
});

describe('CO2 percent -> mmHg (conventions: common practice, no source)', () => {
  it('5.0 % dry at PB 760 -> 35.65 mmHg (derived here: 0.05 x 713)', () => {
    expectClose(5 * co2FactorToMmhg('%', 760, 'dry'), 35.65, { rel: 1e-6 });
  });
  it('5.0 % ambient-referenced at PB 760 -> 38.00 mmHg (derived here: 0.05 x 760)', () => {
    expectClose(5 * co2FactorToMmhg('%', 760, 'ambient'), 38.0, { rel: 1e-6 });
  });
  it('mmHg stays mmHg', () => {
    expect(co2FactorToMmhg('mmHg', 700, 'dry')).toBe(1);
  });
});

describe('flow conversion to L/s (SI: 1 min = 60 s, 1 L = 1000 mL)', () => {
  it('30 L/min = 0.5 L/s; 500 mL/s = 0.5 L/s', () => {
    expectClose(30 * flowFactorToLps('L/min'), 0.5, { rel: 1e-12 });
    expectClose(500 * flowFactorToLps('mL/s'), 0.5, { rel: 1e-12 });
    expect(flowFactorToLps('L/s')).toBe(1);
  });
});

describe('units written in header names', () => {
  const table: [string, string, string | null][] = [
    ['Flow (L/min)', 'Flow', 'L/min'],
    ['CO2 [kPa]', 'CO2', 'kPa'],
    ['flow_lps', 'flow', 'L/s'],
    ['co2_mmhg', 'co2', 'mmHg'],
    ['time_ms', 'time', 'ms'],
    ['Time (s)', 'Time', 's'],
    ['CO2 %', 'CO2', '%'],
    ['etCO2 (mm Hg)', 'etCO2', 'mmHg'],
    ['Flow (ml/s)', 'Flow', 'mL/s'],
    ['Time (hh:mm:ss.fff)', 'Time', 'clock'],
    ['Flow', 'Flow', null],
    ['Flows', 'Flows', null],
  ];
  for (const [name, base, unit] of table) {
    it(`${name} -> ${base} / ${unit}`, () => {
      const [b, u] = splitNameAndUnit(name);
      expect(b).toBe(base);
      expect(u === null ? null : parseUnitText(u)?.unit ?? 'not understood').toBe(unit);
    });
  }
  it('an unknown unit text is reported, not guessed', () => {
    expect(parseUnitText('a.u.')).toBeNull();
  });
});

describe('unit rules from values (stated rules, each a warning)', () => {
  it('CO2: max >= 15 -> mmHg; 1-15 -> kPa (warned); < 1 -> mmHg (warned)', () => {
    expect(inferCo2Unit(38).unit).toBe('mmHg');
    expect(inferCo2Unit(5.2)).toMatchObject({ unit: 'kPa' });
    expect(inferCo2Unit(5.2).note).toMatch(/^warning: .*--co2-unit %/);
    expect(inferCo2Unit(0.3).note).toMatch(/^warning/);
  });
  it('flow: peak <= 5 -> L/s; 5-300 -> L/min; > 300 -> mL/s', () => {
    expect(inferFlowUnit(0.6).unit).toBe('L/s');
    expect(inferFlowUnit(45).unit).toBe('L/min');
    expect(inferFlowUnit(800).unit).toBe('mL/s');
  });
  it('time: median step >= 1 -> ms', () => {
    expect(inferTimeUnit(10).unit).toBe('ms');
    expect(inferTimeUnit(0.01).unit).toBe('s');
  });
  it('declared units that do not fit the values are refused', () => {
    expect(co2UnitMismatch('mmHg', 5.3)?.hint).toBe('Give --co2-unit % or --co2-unit kPa.');
    expect(co2UnitMismatch('mmHg', 0.4)).toBeNull(); // no CO2 seen yet: not a unit question
    expect(co2UnitMismatch('mmHg', 38)).toBeNull();
    expect(co2UnitMismatch('kPa', 38)?.hint).toBe('Give --co2-unit mmHg.');
    expect(co2UnitMismatch('%', 31)?.hint).toBe('Give --co2-unit mmHg.');
    expect(co2UnitMismatch('kPa', 5.3)).toBeNull();
    expect(flowUnitMismatch('L/s', 45)?.hint).toMatch(/L\/min/);
    expect(flowUnitMismatch('mL/s', 0.6)?.hint).toBe('Give --flow-unit L/s.');
    expect(flowUnitMismatch('L/min', 45)).toBeNull();
  });
});

describe('units end to end', () => {
  const body = (co2: (i: number) => string, flow: (i: number) => string) =>
    Array.from({ length: 40 }, (_, i) => `${(i / 100).toFixed(2)},${flow(i)},${co2(i)}`).join('\n') + '\n';
  const co2Pct = (i: number) => (i % 10 < 5 ? '0.1' : '5.0');
  const flowLpm = (i: number) => (i % 10 < 5 ? '-30' : '30');
  it('options override header and values; a note records each choice', () => {
    const text = 'time,flow,co2\n' + body(co2Pct, flowLpm);
    const { blocks, report } = readRecordingText(text, { ...DEFAULT_INGEST, co2_unit: '%', flow_unit: 'L/min', pb_mmhg: 700, co2_percent: 'dry' }, 20, 'u.csv');
    const s = concatBlocks(blocks);
    expectClose(s.co2[5]!, 0.05 * (700 - 47), { rel: 1e-12 }, '5 % dry at PB 700');
    expectClose(s.flow[5]!, 0.5, { rel: 1e-12 }, '30 L/min');
    expect(report.settings.co2_unit).toMatchObject({ value: '%', origin: 'given' });
    expect(report.settings.pb_mmhg).toMatchObject({ value: 700, origin: 'given' });
    expect(report.notes.join('\n')).toMatch(/PB 700 mmHg, dry convention/);
  });
  it('inferred units are marked inferred with a warning note', () => {
    const text = 'time,flow,co2\n' + body(co2Pct, flowLpm);
    const { report } = readRecordingText(text, DEFAULT_INGEST, 20, 'u.csv');
    expect(report.units).toEqual({ time: 's', flow: 'L/min', co2: 'kPa' });
    expect(report.settings.flow_unit!.origin).toBe('inferred');
    expect(report.notes.filter((n) => n.startsWith('warning:')).length).toBe(2);
  });
});

describe('time unit from values', () => {
  it('steps of 10 with no unit in the header are read as ms (100 Hz), with a warning', () => {
    const rows = ['time,flow_lps,co2_mmhg', ...Array.from({ length: 30 }, (_, i) => `${i * 10},${i % 10 < 5 ? -0.3 : 0.3},${i % 10 < 5 ? 0.2 : 38}`)];
    const { blocks, report } = readRecordingText(rows.join('\n') + '\n', DEFAULT_INGEST, 20, 't.csv');
    const s = concatBlocks(blocks);
    expect(report.units.time).toBe('ms');
    expect(s.t[29]).toBe(290 / 1000);
    expectClose(report.rate_hz, 100, { rel: 1e-9 });
    expect(report.notes.join('\n')).toMatch(/warning: time unit inferred as ms/);
  });
});
