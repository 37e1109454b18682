// The viewer's mapping step for a WFDB record reads the header and checks the chosen signal files without decoding
// them (previewWfdbRecord): the same signal choice, units and notes as readWfdbRecord, and its one-line errors for a
// signal file not chosen with the header.
import { describe, expect, it } from 'vitest';
import { previewWfdbRecord, readWfdbRecord } from '../../src/ingest/wfdb-reader';
import { defaultSettings } from '../../src/settings';

const ingest = defaultSettings().ingest;
const text = (s: string) => new TextEncoder().encode(s);
// two signals in one format-16 file, 3 frames at 100 Hz: flow 1000 ADC units per L/s, CO2 10 per mmHg (header(5))
const HEA = 'rec 2 100 3\nr.dat 16 1000/L/s 16 0 0 0 0 Airway flow\nr.dat 16 10/mmHg 16 0 0 0 0 CO2\n';
// flow 0.1, -0.2, 0.3 L/s and CO2 5, 6, 7 mmHg, little-endian 16-bit, interleaved frame by frame (signal(5))
const DAT = Uint8Array.of(100, 0, 50, 0, 56, 255, 60, 0, 44, 1, 70, 0);

describe('previewWfdbRecord', () => {
  it('the choice and layout readWfdbRecord uses', () => {
    const files = new Map([['r.dat', DAT]]);
    const { header, layout } = previewWfdbRecord(text(HEA), files, ingest, 'rec.hea');
    const { report } = readWfdbRecord(text(HEA), files, ingest, 20, 'rec.hea');
    expect(header.signals.map((s) => s.description)).toEqual(['Airway flow', 'CO2']);
    expect(layout.names).toEqual({ time: null, flow: 'Airway flow', co2: 'CO2' });
    expect(layout.names.flow).toBe(report.columns.flow);
    expect(layout.units.flow).toBe(report.units.flow);
    expect(layout.units.co2).toBe(report.units.co2);
    expect(layout.rate_hz).toBe(100);
    expect(report.notes.slice(0, 2)).toEqual(layout.notes.slice(0, 2));
  });

  it('the header chosen without its signal file: the file is named, and what to do', () => {
    expect(() => previewWfdbRecord(text(HEA), new Map(), ingest, 'rec.hea')).toThrow(
      'rec.hea: the signal file "r.dat" named by the header is not among the files given (none). Choose the .hea file together with its signal files.',
    );
  });
});
