// CSV export round trips: parse our own files with papaparse and convert back to internal units.
// Unit factors here are written out independently of the simulator: 1 kPa = 7.50062 mmHg (NIST SP 811,
// 2008, Appendix B: 1 mmHg = 133.3224 Pa; mathjs uses 7.500638, 2.9e-6 apart), % = P / PB x 100 (ambient)
// or P / (PB - 47) x 100 (dry) `[common practice, no source]`; 1 L/s = 60 L/min = 1000 mL/s.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { concatBlocks, scenarioParams, simulateRecording, writeRecordingCsv, type SimParams } from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';

function render(params: SimParams, seed: number): { text: string; truth: ReturnType<typeof writeRecordingCsv> } {
  let text = '';
  const truth = writeRecordingCsv(params, seed, (t) => {
    text += t;
  });
  return { text, truth };
}

function parseRows(text: string, delimiter: string, skip: number): string[][] {
  const body = text.split(/\r?\n/).slice(skip).join('\n');
  return Papa.parse<string[]>(body, { delimiter, skipEmptyLines: true }).data;
}

const num = (cell: string, decimal: string): number => Number(decimal === ',' ? cell.replace(',', '.') : cell);

describe('CSV export round trip', () => {
  it('plain comma file: header time_s,flow_lps,co2_mmhg and values equal to the block within print rounding', () => {
    const p = scenarioParams('adult-healthy', { minutes: 0.5 });
    const { text, truth } = render(p, 4);
    const block = concatBlocks(simulateRecording(p, 4).blocks);
    const rows = parseRows(text, ',', 0);
    expect(rows[0]).toEqual(['time_s', 'flow_lps', 'co2_mmhg']);
    expect(rows.length - 1).toBe(block.n);
    expect(truth.export!.data_rows).toBe(block.n);
    for (let i = 0; i < block.n; i += 37) {
      expectClose(Number(rows[i + 1]![0]), block.t_s[i]!, { abs: 5e-4 });
      expectClose(Number(rows[i + 1]![1]), block.flow_lps[i]!, { abs: 5e-5 });
      expectClose(Number(rows[i + 1]![2]), block.co2_mmhg[i]!, { abs: 5e-3 });
    }
  });

  it('semicolon, decimal comma, L/min, kPa, expiration negative, units header, preamble', () => {
    const p = scenarioParams('adult-congested-region', {
      minutes: 0.5, delimiter: ';', decimal: ',', flow_unit: 'L/min', co2_unit: 'kPa', expiration_sign: 'negative',
      header_style: 'units', preamble_lines: 3,
    });
    const { text, truth } = render(p, 8);
    const block = concatBlocks(simulateRecording(p, 8).blocks);
    expect(truth.export!.header_line).toBe(4);
    const rows = parseRows(text, ';', 3);
    expect(rows[0]).toEqual(['Time (s)', 'Flow (L/min)', 'CO2 [kPa]']);
    for (let i = 0; i < block.n; i += 41) {
      const [t, f, c] = rows[i + 1]!;
      expect(f).toMatch(/^-?\d+,\d{2}$/);
      expectClose(num(t!, ','), block.t_s[i]!, { abs: 5e-4 });
      expectClose(-num(f!, ',') / 60, block.flow_lps[i]!, { abs: 0.005 / 60 + 1e-12 });
      expectClose(num(c!, ',') * 7.50062, block.co2_mmhg[i]!, { abs: 0.0005 * 7.50062 + 1e-4 });
    }
  });

  it('tab, mL/s, time in ms, CO2 % (dry convention), CO2 at half rate with blank cells, extra columns', () => {
    const p = scenarioParams('infant-cardiac-shunt', {
      minutes: 0.3, delimiter: '\t', flow_unit: 'mL/s', time_format: 'ms', co2_unit: '%', co2_percent: 'dry',
      pb_mmhg: 750, co2_rate_hz: 50, extra_columns: ['pressure', 'volume'],
    });
    const { text } = render(p, 2);
    const block = concatBlocks(simulateRecording(p, 2).blocks);
    const rows = parseRows(text, '\t', 0);
    expect(rows[0]).toEqual(['time_ms', 'flow_mlps', 'co2_pct', 'paw_cmh2o', 'volume_ml']);
    for (let i = 0; i < block.n; i++) {
      const [t, f, c, paw, vol] = rows[i + 1]!;
      expect(Number(t)).toBe(i * 10);
      expectClose(Number(f) / 1000, block.flow_lps[i]!, { abs: 0.05 / 1000 + 1e-12 });
      if (i % 2 === 1) expect(c).toBe('');
      else expectClose((Number(c) / 100) * (750 - 47), block.co2_mmhg[i]!, { abs: 0.0005 * 7.03 + 1e-4 });
      expect(Number.isFinite(Number(paw)) && Number.isFinite(Number(vol))).toBe(true);
    }
  });

  it('ISO and clock time stamps, CRLF, gaps and damaged lines are counted in the truth', () => {
    const p = scenarioParams('adult-spontaneous', {
      minutes: 1, time_format: 'clock', line_ending: '\r\n', damaged_line_fraction: 0.01,
      gaps: [{ t_s: 10, duration_s: 2, kind: 'rows' }, { t_s: 30, duration_s: 1, kind: 'blank' }],
    });
    const { text, truth } = render(p, 6);
    const ex = truth.export!;
    const lines = text.split('\r\n');
    expect(lines.at(-1)).toBe('');
    expect(lines.length - 1).toBe(ex.lines);
    expect(ex.omitted_gap_rows).toBe(200);
    expect(ex.blank_gap_rows).toBe(100);
    expect(ex.data_rows + ex.cut_lines + ex.omitted_gap_rows).toBe(6000);
    expect(ex.garbage_lines + ex.cut_lines).toBeGreaterThan(20);
    // every damaged line lacks fields or is not numeric; every other data line has 3 fields
    const damaged = new Set(ex.damaged_line_numbers);
    let wellFormed = 0;
    for (let k = 1; k < lines.length - 1; k++) {
      const cells = lines[k]!.split(',');
      const ok = cells.length === 3 && /^\d\d:\d\d:\d\d\.\d{3}$/.test(cells[0]!);
      if (damaged.has(k + 1)) expect(ok).toBe(false);
      if (ok) wellFormed++;
    }
    expect(wellFormed).toBe(ex.data_rows);
    expect(lines[1]!.startsWith('09:30:00.000,')).toBe(true);
    // rows 10.00-11.99 s are missing; 30.00-30.99 s have blank flow and CO2
    expect(text).not.toContain('09:30:10.500,');
    expect(text).toContain('09:30:30.500,,\r\n');
    const iso = render(scenarioParams('adult-healthy', { minutes: 0.05, time_format: 'iso' }), 1).text;
    expect(iso.split('\n')[2]!.startsWith('2024-05-14T09:30:00.010Z,')).toBe(true);
  });

  it('export options do not change the physiology: same truth breaths for different formats', () => {
    const base = scenarioParams('child-sidestream', { minutes: 0.5 });
    const other = scenarioParams('child-sidestream', { minutes: 0.5, delimiter: ';', decimal: ',', co2_unit: 'kPa', damaged_line_fraction: 0.05 });
    expect(render(other, 3).truth.breaths).toEqual(render(base, 3).truth.breaths);
  });
});
