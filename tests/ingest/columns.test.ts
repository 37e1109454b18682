// Column choice: given names, header names (alias list), values; ambiguity and not-found errors.
import { describe, expect, it } from 'vitest';
import { InputError, readRecordingText, sniffTable } from '../../src/ingest';
import { nameScore } from '../../src/ingest/header-names';
import { DEFAULT_INGEST, type IngestSettings } from '../../src/settings';

/** A table with a breath-like pattern: flow changes sign, CO2 sits near 0 then on a plateau, pressure > 0. */
function table(header: string[], cols: ('t' | 'flow' | 'co2' | 'paw' | 'vol' | 'flow2')[], d = ',', n = 60): string {
  const lines = [header.join(d)];
  for (let i = 0; i < n; i++) {
    const exp = i % 20 >= 10;
    const cell = {
      t: (i / 100).toFixed(2),
      flow: (exp ? 0.4 : -0.5).toFixed(2),
      flow2: (exp ? -0.3 : 0.35).toFixed(2),
      co2: (exp ? 38 + (i % 3) : 0.3).toFixed(1),
      paw: (exp ? 5 : 20 - (i % 10)).toFixed(1),
      vol: String(100 + (i % 20) * 20),
    };
    lines.push(cols.map((c) => cell[c]).join(d));
  }
  return lines.join('\n') + '\n';
}
const sniff = (text: string, s: Partial<IngestSettings> = {}) => sniffTable(text, { ...DEFAULT_INGEST, ...s }, 20, 'c.csv');

describe('column names', () => {
  it.each([
    ['Zeit', 'time', 3], ['Timestamp', 'time', 3], ['t', 'time', 3], ['Elapsed time (s)', 'time', 3],
    ["V'", 'flow', 3], ['Flow Rate', 'flow', 3], ['Airway flow [L/min]', 'flow', 3], ['Insp Flow', 'flow', 2],
    ['CO₂ (mmHg)', 'co2', 3], ['PCO2', 'co2', 3], ['EtCO2', 'co2', 2], ['CO2 waveform', 'co2', 2],
    ['Paw', 'flow', 0], ['Volume', 'flow', 0], ['VCO2', 'co2', 0], ['Pressure', 'time', 0], ['O2 flow', 'flow', 0],
  ] as const)('%s scores %s for %s', (name, role, score) => {
    expect(nameScore(name, role)).toBe(score);
  });

  it('chooses by name, ignores pressure and volume, and says so', () => {
    const L = sniff(table(['Time', 'Paw', 'Flow', 'Volume', 'EtCO2', 'CO2'], ['t', 'paw', 'flow', 'vol', 'co2', 'co2']));
    expect(L.columns).toEqual({ time: 0, flow: 2, co2: 5 }); // CO2 (exact) beats EtCO2 (word)
    expect(L.notes).toContain('CO2 column "CO2" (column 6) chosen by name');
  });

  it('given names: case-insensitive, without the unit part, or a column number', () => {
    const text = table(['t', 'Flow A (L/s)', 'Flow B (L/s)', 'CO2'], ['t', 'flow', 'flow2', 'co2']);
    expect(sniff(text, { flow_col: 'FLOW B (L/S)' }).columns.flow).toBe(2);
    expect(sniff(text, { flow_col: 'flow b' }).columns.flow).toBe(2);
    expect(sniff(text, { flow_col: '2' }).columns.flow).toBe(1);
    expect(sniff(text, { flow_col: 'flow b' }).settings.flow_col).toMatchObject({ value: 'Flow B (L/s)', origin: 'given' });
  });

  it('a given name that is not in the header lists the header', () => {
    const text = table(['t', 'flow', 'co2'], ['t', 'flow', 'co2']);
    expect(() => sniff(text, { co2_col: 'capnogram' })).toThrow('c.csv line 1: no column named "capnogram" for CO2 (header: t,flow,co2). Give --co2-col with one of the header names (or a column number).');
  });

  it('two equally good names that both fit the values: ambiguous, naming the option', () => {
    const text = table(['t', 'Flow A', 'Flow B', 'CO2'], ['t', 'flow', 'flow2', 'co2']);
    try {
      sniff(text);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).code).toBe('ambiguous_column');
      expect((e as InputError).message).toMatch(/2 columns could be flow: "Flow A" \(column 2\) and "Flow B" \(column 3\).*Give --flow-col NAME\.$/);
    }
  });

  it('two equal names of which only one fits the values: chosen by values', () => {
    const text = table(['t', 'flow', 'flow', 'co2'], ['t', 'vol', 'flow', 'co2']);
    const L = sniff(text);
    expect(L.columns.flow).toBe(2);
    expect(L.notes.join('\n')).toMatch(/chosen by name and values/);
  });
});

describe('columns from values (no header names to go by)', () => {
  it('headerless table: time increases, flow changes sign, CO2 has a plateau near zero and high', () => {
    const text = table(['x'], ['co2', 't', 'flow']).split('\n').slice(1).join('\n');
    const { report } = readRecordingText(text, { ...DEFAULT_INGEST, co2_unit: 'mmHg', flow_unit: 'L/s' }, 20, 'h.csv');
    expect(report.header_line).toBe(0);
    expect(report.columns).toEqual({ time: 'column 2', flow: 'column 3', co2: 'column 1' });
    expect(report.notes.filter((n) => /chosen by its values/.test(n)).length).toBe(3);
    expect(report.rows).toBe(60);
  });

  it('unnamed columns that both change sign: ambiguous', () => {
    const text = table(['time', 'a', 'b', 'co2'], ['t', 'flow', 'flow2', 'co2']);
    expect(() => sniff(text)).toThrow(/2 columns could be flow: "a" \(column 2\) and "b" \(column 3\)/);
  });

  it('--rate uses the row index even when a time column exists, and says so', () => {
    const L = sniff(table(['time', 'flow', 'co2'], ['t', 'flow', 'co2']), { rate_hz: 50 });
    expect(L.columns.time).toBe(-1);
    expect(L.units.time).toBe('rate');
    expect(L.notes.join('\n')).toMatch(/time from the sampling rate 50 Hz/);
  });
});
