// The viewer's mapping step for EDF/BDF files reads the header alone (previewEdfHeader on the first edfHeaderBytes
// bytes): the same signal choice, units and notes as reading the whole file, and the same one-line errors.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { edfHeaderBytes } from '../../src/ingest/edf-header';
import { previewEdfHeader, readEdfBytes } from '../../src/ingest/edf-reader';
import { defaultSettings } from '../../src/settings';

const DIR = join(__dirname, '..', 'fixtures', 'edf');
const load = (name: string) => new Uint8Array(readFileSync(join(DIR, name)));
const ingest = defaultSettings().ingest;

describe('previewEdfHeader', () => {
  it('the header size stated in the fixed part: 256 bytes per signal plus 256 (3 signals: flow, CO2, annotations)', () => {
    expect(edfHeaderBytes(load('c100.edf').subarray(0, 256))).toBe(1024);
    expect(edfHeaderBytes(new Uint8Array(100))).toBe(256);
    const bad = load('c100.edf').slice(0, 256);
    bad.set(new TextEncoder().encode('abc     '), 184);
    expect(edfHeaderBytes(bad)).toBe(256);
  });

  for (const name of ['c100.edf', 'd100.edf', 'c50.edf', 'b50.bdf']) {
    it(`${name}: from the header bytes alone, the choice the whole-file reader makes`, () => {
      const bytes = load(name);
      const head = bytes.subarray(0, edfHeaderBytes(bytes.subarray(0, 256)));
      const { header, layout } = previewEdfHeader(head, bytes.length, ingest, 20, name);
      const { report } = readEdfBytes(bytes, ingest, 20, name);
      expect(header.signals.map((s) => s.label)).toEqual(['Airflow', 'CO2', name.endsWith('.bdf') ? 'BDF Annotations' : 'EDF Annotations']);
      expect(layout.names).toEqual({ time: null, flow: report.columns.flow, co2: report.columns.co2 });
      expect(layout.units.flow).toBe(report.units.flow);
      expect(layout.units.co2).toBe(report.units.co2);
      expect(layout.rate_hz).toBe(100);
      expect(layout.notes).toEqual(report.notes.slice(0, layout.notes.length));
    });
  }

  it('a truncated header and a missing signal: the whole-file reader\'s errors', () => {
    const bytes = load('c100.edf');
    expect(() => previewEdfHeader(bytes.subarray(0, 600), 600, ingest, 20, 'x.edf')).toThrow('x.edf: the file ends inside the EDF header (600 of 1024 bytes)');
    expect(() => previewEdfHeader(bytes.subarray(0, 1024), bytes.length, { ...ingest, co2_col: 'EtCO2' }, 20, 'x.edf')).toThrow(
      'x.edf: no signal is labelled "EtCO2" (signals: "Airflow" (L/s), "CO2" (mmHg)). Give --co2-col with one of these labels.',
    );
    expect(() => previewEdfHeader(bytes.subarray(0, 1024), bytes.length, ingest, 200, 'x.edf')).toThrow('below the minimum 200 Hz');
  });
});
