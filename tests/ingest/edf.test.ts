// EDF+/BDF+ reader against files written by an independent writer: Debian's EDFlib 1.23 (libedf-dev), from a
// phasewise-simulated CSV (tests/fixtures/edf/make-fixtures.sh and .c; the fixtures are committed, CI does not
// rebuild them). Each fixture has a twin CSV written by the same C program with the physical values the file holds.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseEdfHeader } from '../../src/ingest/edf-header';
import { edfPhysical, edfRecordSamples, readEdfBytes } from '../../src/ingest/edf-reader';
import { InputError } from '../../src/ingest/errors';
import { analyseFile } from '../../src/node/analyse-file';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';

const DIR = join(__dirname, '..', 'fixtures', 'edf');
const load = (name: string) => new Uint8Array(readFileSync(join(DIR, name)));
const ingest = defaultSettings().ingest;

/** The simulated CSV given to the writer: time_s, flow_lps, co2_mmhg at 100 Hz, 60 s. */
function simulated(): { flow: number[]; co2: number[] } {
  const lines = readFileSync(join(DIR, 'sim.csv'), 'utf8').trim().split('\n').slice(1);
  const rows = lines.map((l) => l.split(',').map(Number));
  return { flow: rows.map((r) => r[1]!), co2: rows.map((r) => r[2]!) };
}

const FIXTURES = [
  { name: 'c100.edf', format: 'EDF', plus: 'C', co2_hz: 100 },
  { name: 'c50.edf', format: 'EDF', plus: 'C', co2_hz: 50 },
  { name: 'd100.edf', format: 'EDF', plus: 'D', co2_hz: 100 },
  { name: 'b50.bdf', format: 'BDF', plus: 'C', co2_hz: 50 },
] as const;

describe('EDF/BDF header (EDFlib-written fixtures)', () => {
  for (const f of FIXTURES) {
    it(`${f.name}: format, records, signals as written by make-fixtures.c`, () => {
      const b = load(f.name);
      const h = parseEdfHeader(b, b.length, f.name);
      expect(h.format).toBe(f.format);
      expect(h.plus).toBe(f.plus);
      expect(h.records).toBe(60);
      expect(h.record_s).toBe(1);
      expect(h.signals.map((s) => s.label)).toEqual(['Airflow', 'CO2', f.format === 'BDF' ? 'BDF Annotations' : 'EDF Annotations']);
      const bdf = f.format === 'BDF';
      expect(h.signals.slice(0, 2).map((s) => [s.dimension, s.pmin, s.pmax, s.samples_per_record])).toEqual([['L/s', bdf ? -10 : -3, bdf ? 10 : 3, 100], ['mmHg', bdf ? -100 : -60, bdf ? 100 : 60, f.co2_hz]]);
      const d = bdf ? [-1000000, 1000000] : [-30000, 30000];
      expect([h.signals[0]!.dmin, h.signals[0]!.dmax]).toEqual(d);
    });
  }
});

describe('EDF/BDF decoded physical values', () => {
  const sim = simulated();
  for (const f of FIXTURES) {
    it(`${f.name}: every flow and CO2 sample within one digital step of the value given to the writer`, () => {
      const b = load(f.name);
      const h = parseEdfHeader(b, b.length, f.name);
      const every = 100 / f.co2_hz;
      for (const [k, given, stride] of [[0, sim.flow, 1], [1, sim.co2, every]] as const) {
        const s = h.signals[k]!;
        const step = (s.pmax - s.pmin) / (s.dmax - s.dmin);
        let worst = 0;
        for (let r = 0; r < h.records; r++) {
          const got = edfRecordSamples(b, h, k, r);
          for (let i = 0; i < got.length; i++) worst = Math.max(worst, Math.abs(got[i]! - given[(r * 100) + i * stride]!));
        }
        expect(worst).toBeLessThanOrEqual(step);
        // nearest-value rounding in the writer: half a step (plus rounding of the scaling in double precision)
        expect(worst).toBeLessThanOrEqual(step / 2 + 1e-9);
      }
    });
  }
});

describe('EDF+ time axis and annotations', () => {
  it('EDF+C: annotations listed with onset and duration (written as 2.5 s for 1 s, and 42.5 s without duration)', () => {
    const { report } = readEdfBytes(load('c100.edf'), ingest, 20, 'c100.edf');
    expect(report.annotations).toEqual([
      { onset_s: 2.5, duration_s: 1, text: 'suction' },
      { onset_s: 42.5, duration_s: null, text: 'PEEP 8' },
    ]);
    expect(report.gaps).toBe(0);
    expect(report.rate_hz).toBe(100);
    expect(report.columns).toEqual({ time: null, flow: 'Airflow', co2: 'CO2' });
  });

  it('EDF+D: records 31..60 start 20 s later (their time-keeping TALs), one gap from 29.99 s to 50 s', () => {
    const { blocks, report } = readEdfBytes(load('d100.edf'), ingest, 20, 'd100.edf');
    expect(report.gaps).toBe(1);
    expectClose(report.gap_list[0]!.start_s, 29.99, { abs: 1e-9 });
    expectClose(report.gap_list[0]!.length_s, 20.01, { abs: 1e-9 });
    const t = blocks.flatMap((b) => [...b.t_s.subarray(0, b.n)]);
    expect(t.length).toBe(6001); // 6000 samples and the NaN gap marker
    expectClose(t[t.length - 1]!, 79.99, { abs: 1e-9 });
  });
});

describe('analysis of an EDF equals the analysis of its twin CSV', () => {
  // The twin CSV holds the same samples: time to 0.01 s (exact on the 100 Hz grid), physical values to 10
  // significant digits, which write them exactly (the fixtures' digital step is a round decimal: EDF flow 1e-4 L/s,
  // CO2 0.002 mmHg; BDF flow 1e-5 L/s, CO2 1e-4 mmHg), and CO2 cells blank where a 50 Hz CO2 has no sample.
  // Compared: the number of breaths and partial breaths, the gaps, and every field of every breath row (numbers
  // within abs 1e-9 / rel 1e-9, everything else equal). With CO2 at 50 Hz the analysis is sensitive to the last bits
  // of the samples (measured: CO2 samples 1.3e-13 mmHg apart moved airway dead space by 0.006 mL), so this also
  // checks that edfPhysical rounds once, as the parsing of a decimal cell does.
  for (const f of FIXTURES) {
    it(`${f.name}`, async () => {
      const settings = defaultSettings();
      const a = await analyseFile(join(DIR, f.name), settings);
      const b = await analyseFile(join(DIR, `${f.name}.twin.csv`), settings);
      expect(a.core.breaths.length).toBeGreaterThan(8);
      expect(a.core.breaths.length).toBe(b.core.breaths.length);
      expect(a.core.partial_breaths).toBe(b.core.partial_breaths);
      expect(a.report.gaps).toBe(b.report.gaps);
      for (let i = 0; i < a.core.breaths.length; i++) {
        const ra = a.core.breaths[i]! as unknown as Record<string, unknown>;
        const rb = b.core.breaths[i]! as unknown as Record<string, unknown>;
        expect(Object.keys(ra)).toEqual(Object.keys(rb));
        for (const k of Object.keys(ra)) {
          const x = ra[k];
          const y = rb[k];
          if (typeof x === 'number' && typeof y === 'number' && Number.isFinite(y)) expectClose(x, y, { abs: 1e-9, rel: 1e-9 }, `breath ${i + 1} ${k}`);
          else expect(x, `breath ${i + 1} ${k}`).toEqual(y);
        }
      }
    });
  }
});

describe('EDF errors (one line, with a code)', () => {
  const base = load('c100.edf');
  const errorOf = (bytes: Uint8Array, settings = ingest): InputError => {
    try {
      readEdfBytes(bytes, settings, 20, 'x.edf');
    } catch (e) {
      if (e instanceof InputError) return e;
      throw e;
    }
    throw new Error('no error');
  };
  const patch = (at: number, text: string): Uint8Array => {
    const b = base.slice();
    for (let i = 0; i < text.length; i++) b[at + i] = text.charCodeAt(i);
    return b;
  };

  it('a truncated file', () => {
    const e = errorOf(base.subarray(0, base.length - 100));
    expect(e.code).toBe('edf_truncated');
    expect(e.message).toContain('ends inside data record 60 of 60');
    expect(errorOf(base.subarray(0, 100)).code).toBe('edf_truncated');
  });

  it('a wrong record count in the header', () => {
    const e = errorOf(patch(236, '59      '));
    expect(e.code).toBe('edf_record_count');
    expect(e.message).toContain('states 59 data records');
    expect(errorOf(patch(236, '61      ')).code).toBe('edf_truncated');
  });

  it('impossible headers: version, header size, digital range, record duration', () => {
    expect(errorOf(patch(0, 'X')).code).toBe('edf_bad_header');
    expect(errorOf(patch(184, '512     ')).message).toContain('512 header bytes for 3 signals');
    // digital maximum of signal 1 (Airflow): fixed part, then labels 16, transducers 80, dimensions 8, pmin 8, pmax 8, dmin 8 (x 3 signals)
    const dmaxAt = 256 + 3 * (16 + 80 + 8 + 8 + 8 + 8);
    expect(errorOf(patch(dmaxAt, '-40000  ')).message).toContain('digital maximum -40000 not above its minimum');
    expect(errorOf(patch(244, '0       ')).message).toContain('record duration is 0 s');
    expect(errorOf(patch(244, 'abc     ')).message).toMatch(/^x\.edf: .*"abc", not a number\./);
  });

  it('missing channels name the labels that are there', () => {
    const e = errorOf(base, { ...ingest, flow_col: 'Pneumo' });
    expect(e.code).toBe('columns_not_found');
    expect(e.message).toBe('x.edf: no signal is labelled "Pneumo" (signals: "Airflow" (L/s), "CO2" (mmHg)). Give --flow-col with one of these labels.');
    // the CO2 dimension and label changed: nothing looks like CO2
    const dimAt = 256 + 3 * (16 + 80) + 8;
    const b = patch(dimAt, 'uV      ');
    for (let i = 0; i < 3; i++) b[256 + 16 + i] = 'EEG'.charCodeAt(i);
    const e2 = errorOf(b);
    expect(e2.code).toBe('columns_not_found');
    expect(e2.message).toContain('no signal looks like CO2 (dimension mmHg, kPa or %) (signals: "Airflow" (L/s), "EEG" (uV))');
  });

  it('signals chosen by label with --flow-col / --co2-col', () => {
    const { report } = readEdfBytes(base, { ...ingest, flow_col: 'airflow', co2_col: 'CO2' }, 20, 'x.edf');
    expect(report.settings.flow_col).toEqual({ value: 'Airflow', origin: 'given' });
  });
});

describe('edfPhysical', () => {
  it('the scaling of Kemp et al. (1992) at the limits and in between (worked by hand)', () => {
    const s = { pmin: -60, pmax: 60, dmin: -30000, dmax: 30000 };
    expect(edfPhysical(-30000, s)).toBe(-60);
    expect(edfPhysical(30000, s)).toBe(60);
    expect(edfPhysical(18000, s)).toBe(36); // 48000 * 120 / 60000 - 60
    expect(edfPhysical(6257, s)).toBe(12.514); // 36257 * 120 / 60000 - 60, the double nearest 12.514
    // BDF-style limits with a non-zero offset: 0 .. 100 % over -8388608 .. 8388607
    expectClose(edfPhysical(0, { pmin: 0, pmax: 100, dmin: -8388608, dmax: 8388607 }), 8388608 * 100 / 16777215, { rel: 1e-15 });
  });
});

describe('EDF variants and channel choice', () => {
  const base = load('c100.edf');
  const patch = (b: Uint8Array, at: number, text: string): Uint8Array => {
    const c = b.slice();
    for (let i = 0; i < text.length; i++) c[at + i] = text.charCodeAt(i);
    return c;
  };
  const code = (f: () => unknown): string => {
    try {
      f();
    } catch (e) {
      return e instanceof InputError ? e.code : String(e);
    }
    return 'none';
  };

  it('plain EDF (blank reserved field): records follow each other, annotation TALs still listed', () => {
    const b = patch(base, 192, ' '.repeat(44));
    const h = parseEdfHeader(b, b.length, 'x.edf');
    expect(h.plus).toBeNull();
    const { report } = readEdfBytes(b, ingest, 20, 'x.edf');
    expect(report.gaps).toBe(0);
    expect(report.samples).toBe(6000);
  });

  it('EDF+D read as EDF+C ignores the time-keeping TALs: no gap', () => {
    const b = patch(load('d100.edf'), 192, 'EDF+C');
    expect(readEdfBytes(b, ingest, 20, 'x.edf').report.gaps).toBe(0);
  });

  it('an EDF+D record whose time-keeping TAL goes back in time is refused', () => {
    // record 31 (index 30) of d100.edf: "+50" -> "+10", before record 30 ends
    const d = load('d100.edf');
    const at = 1024 + 30 * parseEdfHeader(d, d.length, 'x').record_bytes + 400;
    const b = patch(d, at, '+10');
    expect(code(() => readEdfBytes(b, ingest, 20, 'x.edf'))).toBe('time_not_increasing');
  });

  it('two signals in L/s: the one labelled flow wins; two labelled flow: ambiguous', () => {
    // CO2 dimension -> L/s and label -> "Pressure": flow is still Airflow by its label, CO2 missing
    const dimAt = 256 + 3 * (16 + 80) + 8;
    const b = patch(patch(base, dimAt, 'L/s     '), 256 + 16, 'Pressure        ');
    expect(code(() => readEdfBytes(b, ingest, 20, 'x.edf'))).toBe('columns_not_found');
    const c = patch(patch(base, dimAt, 'L/s     '), 256 + 16, 'Flow 2          ');
    expect(code(() => readEdfBytes(c, ingest, 20, 'x.edf'))).toBe('ambiguous_column');
  });

  it('--flow-unit overrides the dimension (L/min: flow / 60); a non-flow dimension without it is unit_mismatch', () => {
    const a = readEdfBytes(base, ingest, 20, 'x.edf');
    const m = readEdfBytes(base, { ...ingest, flow_unit: 'L/min' }, 20, 'x.edf');
    expectClose(m.blocks[0]!.flow_lps[10]!, a.blocks[0]!.flow_lps[10]! / 60, { rel: 1e-12 });
    const dimAt = 256 + 3 * (16 + 80);
    expect(code(() => readEdfBytes(patch(base, dimAt, 'uV      '), { ...ingest, flow_col: 'Airflow' }, 20, 'x.edf'))).toBe('unit_mismatch');
  });

  it('a flow signal slower than min_rate_hz is rate_too_low', () => {
    expect(code(() => readEdfBytes(base, ingest, 200, 'x.edf'))).toBe('rate_too_low');
  });
});
