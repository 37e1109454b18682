// WFDB reader against records whose bytes are spelled out here by hand from the published format description:
// Moody GB, WFDB Applications Guide, header(5) and signal(5) (PhysioNet). No WFDB writer is packaged for the
// registries these machines reach, so each record below is written byte by byte, with its physical values worked
// out by hand beside it (physical = (digital - baseline) / gain, header(5)); the decoded values must match them
// within one digital step (1 / gain).
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/ingest/errors';
import { parseWfdbHeader } from '../../src/ingest/wfdb-header';
import { isWfdbName, readWfdbRecord, wfdbDigital, wfdbPhysical, wfdbSignalFileNames } from '../../src/ingest/wfdb-reader';
import { defaultSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';
import { expectClose } from '../helpers/expect-close';

const ingest = defaultSettings().ingest;
const text = (s: string) => new TextEncoder().encode(s);
const files = (entries: Record<string, number[]>) => new Map(Object.entries(entries).map(([k, v]) => [k, Uint8Array.from(v)]));

/** All samples of the blocks, concatenated. */
function samples(blocks: SampleBlock[]): { t: number[]; flow: number[]; co2: number[] } {
  const out = { t: [] as number[], flow: [] as number[], co2: [] as number[] };
  for (const b of blocks) {
    for (let i = 0; i < b.n; i++) {
      out.t.push(b.t_s[i]!);
      out.flow.push(b.flow_lps[i]!);
      out.co2.push(b.co2_mmhg[i]!);
    }
  }
  return out;
}

/** Each value within `step` of the hand-worked one (NaN where a NaN is expected). */
function expectValues(got: number[], want: number[], step: number, what: string): void {
  expect(got.length, `${what}: number of samples`).toBe(want.length);
  for (let i = 0; i < want.length; i++) {
    if (Number.isNaN(want[i]!)) expect(got[i], `${what} sample ${i}`).toBeNaN();
    else expectClose(got[i]!, want[i]!, { abs: step }, `${what} sample ${i}`);
  }
}

const read = (hea: string, dat: Map<string, Uint8Array>, settings = ingest) => readWfdbRecord(text(hea), dat, settings, 20, 'rec.hea');

function errorOf(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('no error');
}

// --- format 16, two signals interleaved in one file -----------------------------------------------------------
// frame k holds flow sample k then CO2 sample k, each 16-bit two's complement, least significant byte first.
//   flow (gain 1000 /L/s, baseline 0): 250 -> FA 00 -> 0.25 L/s; -400 = 0xFE70 -> 70 FE -> -0.4; 32767 -> FF 7F -> 32.767
//   CO2 (gain 500 /mmHg, baseline 0):  20000 = 0x4E20 -> 20 4E -> 40 mmHg; -1 -> FF FF -> -0.002; 0 -> 00 00 -> 0
//   checksums: 250 - 400 + 32767 = 32617; 20000 - 1 + 0 = 19999
const F16_HEA = [
  '# two signals in one file',
  'r16 2 100 3 10:15:30.5 25/4/2026',
  'r16.dat 16 1000(0)/L/s 16 0 250 32617 0 Flow',
  'r16.dat 16 500(0)/mmHg 16 0 20000 19999 0 CO2',
  '# info string',
].join('\r\n');
const F16_DAT = { 'r16.dat': [0xfa, 0x00, 0x20, 0x4e, 0x70, 0xfe, 0xff, 0xff, 0xff, 0x7f, 0x00, 0x00] };

// --- format 212, flow and CO2 in two files, three samples each (an odd count) ----------------------------------
// Two 12-bit samples per three bytes: s0 = byte0 | (byte1 & 0x0F) << 8; s1 = byte2 | (byte1 & 0xF0) << 4.
//   flow (gain 1000 /L/s): 0x7FF = 2047 -> 2.047 L/s; 0xFFE = -2 -> -0.002; 0xC18 = 3096 - 4096 = -1000 -> -1
//     pair 1: FF, (0xF << 4 | 0x7) = F7, FE; last sample alone in a byte pair: 18 0C
//   CO2 (gain 40, baseline -200, /mmHg): 0x000 = 0 -> (0 + 200) / 40 = 5 mmHg; 0x5DC = 1500 -> 1700 / 40 = 42.5;
//     0xF38 = 3896 - 4096 = -200 -> 0 mmHg. pair 1: 00, (0x5 << 4 | 0x0) = 50, DC; last: 38 0F
//   checksums: 2047 - 2 - 1000 = 1045; 0 + 1500 - 200 = 1300
const F212_HEA = [
  'r212 2 100 3',
  'r212a.dat 212 1000/L/s 12 0 2047 1045 0 Flow',
  'r212b.dat 212 40(-200)/mmHg 12 0 0 1300 0 CO2',
].join('\n');
const F212_DAT = { 'r212a.dat': [0xff, 0xf7, 0xfe, 0x18, 0x0c], 'r212b.dat': [0x00, 0x50, 0xdc, 0x38, 0x0f] };

// --- format 80 (8-bit offset binary), with "no data" samples -------------------------------------------------
// byte = digital + 128; digital -128 (byte 00) is the "no data" value.
//   flow (gain 100 /L/s): B2 = 178 -> 50 -> 0.5 L/s; 4E = 78 -> -50 -> -0.5; 00 -> no data; FF = 255 -> 127 -> 1.27
//   CO2 (gain 2 /mmHg): D0 = 208 -> 80 -> 40 mmHg; 80 -> 0 -> 0; 8A = 138 -> 10 -> 5; 00 -> no data
const F80_HEA = 'r80 2 100 4\nr80.dat 80 100/L/s 8 0 50 0 0 Flow\nr80.dat 80 2/mmHg 8 0 80 0 0 CO2\n';
const F80_DAT = { 'r80.dat': [0xb2, 0xd0, 0x4e, 0x80, 0x00, 0x8a, 0xff, 0x00] };

// --- multi-frequency: flow 2 samples per frame, CO2 1, format 16, frame rate 50 Hz ---------------------------
// frame: flow, flow, CO2. flow (gain 1000) 100..600 -> 0.1..0.6 L/s at 100 Hz; CO2 (gain 500) 10000, 10500,
// 11000 -> 20, 21, 22 mmHg at 50 Hz (0 s, 0.02 s, 0.04 s).
//   bytes: 64 00 C8 00 10 27 | 2C 01 90 01 04 29 | F4 01 58 02 F8 2A
const MF_HEA = 'mf 2 50 3\nmf.dat 16x2 1000/L/s 16 0 100 2100 0 Flow\nmf.dat 16 500/mmHg 16 0 10000 31500 0 CO2\n';
const MF_DAT = { 'mf.dat': [0x64, 0x00, 0xc8, 0x00, 0x10, 0x27, 0x2c, 0x01, 0x90, 0x01, 0x04, 0x29, 0xf4, 0x01, 0x58, 0x02, 0xf8, 0x2a] };

describe('WFDB header (header(5))', () => {
  it('record line, signal lines with gain(baseline)/units, comments and info strings', () => {
    const h = parseWfdbHeader(text(F16_HEA), 'rec.hea');
    expect([h.record, h.frequency_hz, h.frames, h.base_time, h.base_date]).toEqual(['r16', 100, 3, '10:15:30.5', '25/4/2026']);
    expect(h.signals.map((s) => [s.file, s.format, s.spf, s.gain, s.baseline, s.units, s.adc_resolution, s.initial_value, s.checksum, s.description]))
      .toEqual([['r16.dat', 16, 1, 1000, 0, 'L/s', 16, 250, 32617, 'Flow'], ['r16.dat', 16, 1, 500, 0, 'mmHg', 16, 20000, 19999, 'CO2']]);
    expect(h.info).toEqual([' info string']);
  });

  it('format modifiers xSPF:SKEW+OFFSET, counter frequency, defaults (gain 0 -> 200, baseline = ADC zero, description)', () => {
    const h = parseWfdbHeader(text('r 2 360/180(5) 10\nr.dat 212x4:2+512 0 11 1024\nr.dat 212x4:2+512 100/mV 12 1024 0 0 0   left  lead \n'), 'r.hea');
    expect([h.frequency_hz, h.counter_hz, h.base_counter, h.base_time]).toEqual([360, 180, 5, null]);
    const [a, b] = h.signals;
    expect([a!.spf, a!.skew, a!.byte_offset, a!.gain, a!.uncalibrated, a!.baseline, a!.units, a!.checksum, a!.description]).toEqual([4, 2, 512, 200, true, 1024, '', null, 'record r, signal 0']);
    expect([b!.gain, b!.uncalibrated, b!.baseline, b!.units, b!.description]).toEqual([100, false, 1024, 'mV', 'left  lead']);
  });

  it('the signal file names in first-use order, without duplicates', () => {
    expect(wfdbSignalFileNames(text(F16_HEA), 'rec.hea')).toEqual(['r16.dat']);
    expect(wfdbSignalFileNames(text(F212_HEA), 'rec.hea')).toEqual(['r212a.dat', 'r212b.dat']);
    expect(isWfdbName('a/B.HEA')).toBe(true);
    expect(isWfdbName('b.dat')).toBe(false);
  });
});

describe('WFDB samples decoded by hand (signal(5))', () => {
  it('wfdbDigital and wfdbPhysical on single byte groups', () => {
    expect(wfdbDigital(Uint8Array.of(0xff, 0x7f), 0, 0, 16)).toBe(32767);
    expect(wfdbDigital(Uint8Array.of(0x00, 0x80), 0, 0, 16)).toBe(-32768);
    expect(wfdbDigital(Uint8Array.of(0x80, 0x00), 0, 0, 61)).toBe(-32768);
    expect(wfdbDigital(Uint8Array.of(0xff, 0xf7, 0xfe), 0, 0, 212)).toBe(2047);
    expect(wfdbDigital(Uint8Array.of(0xff, 0xf7, 0xfe), 0, 1, 212)).toBe(-2);
    expect(wfdbDigital(Uint8Array.of(0x00, 0x08, 0x00), 0, 0, 212)).toBe(-2048);
    expect(wfdbDigital(Uint8Array.of(0x00), 0, 0, 80)).toBe(-128);
    expect(wfdbDigital(Uint8Array.of(0xfe, 0xff, 0xff), 0, 0, 24)).toBe(-2);
    expect(wfdbDigital(Uint8Array.of(0x00, 0x00, 0x00, 0x80), 0, 0, 32)).toBe(-(2 ** 31));
    expect(wfdbDigital(Uint8Array.of(0xff, 0xff), 0, 0, 160)).toBe(32767);
    // 0x7FF -> 2047 -> (2047 - 0) / 200 = 10.235 mV
    expect(wfdbPhysical(2047, { gain: 200, baseline: 0 })).toBe(10.235);
    // MIT-BIH style: baseline = ADC zero 1024, gain 200: 995 -> (995 - 1024) / 200 = -0.145
    expect(wfdbPhysical(995, { gain: 200, baseline: 1024 })).toBe(-0.145);
  });

  it('format 16, two signals interleaved: values, times, clock start from base time and date', () => {
    const { blocks, report } = read(F16_HEA, files(F16_DAT));
    const s = samples(blocks);
    expectValues(s.t, [0, 0.01, 0.02], 1e-12, 'time');
    expectValues(s.flow, [0.25, -0.4, 32.767], 1 / 1000, 'flow');
    expectValues(s.co2, [40, -0.002, 0], 1 / 500, 'CO2');
    // 25 April 2026 = 20568 days after 1970-01-01; 10:15:30.5 = 36930.5 s
    expect(report.clock_start).toEqual({ kind: 'date_time', seconds: 20568 * 86400 + 36930.5, text: '2026-04-25T10:15:30.500' });
    expect(report.notes).toContain('flow signal "Flow": checksum 32617 matches');
    expect(report.notes).toContain('CO2 signal "CO2": checksum 19999 matches');
    expect(report.columns).toEqual({ time: null, flow: 'Flow', co2: 'CO2' });
    expect(report.bytes).toBe(text(F16_HEA).length + 12);
    expect(report.rate_hz).toBe(100);
  });

  it('format 212, odd sample count in each of two files, both nibble halves, negative values, a baseline', () => {
    const { blocks, report } = read(F212_HEA, files(F212_DAT));
    const s = samples(blocks);
    expectValues(s.flow, [2.047, -0.002, -1], 1 / 1000, 'flow');
    expectValues(s.co2, [5, 42.5, 0], 1 / 40, 'CO2');
    expect(report.notes.filter((n) => n.includes('matches'))).toHaveLength(2);
    expect(report.clock_start).toBeUndefined();
    // a third byte after the last pair is padding, not an error
    expect(samples(read(F212_HEA, files({ ...F212_DAT, 'r212a.dat': [...F212_DAT['r212a.dat'], 0x00] })).blocks).flow).toHaveLength(3);
  });

  it('format 80 with "no data" samples: blank cells, counted; a long enough run becomes a gap', () => {
    const { blocks, report } = read(F80_HEA, files(F80_DAT));
    const s = samples(blocks);
    // flow sample 3 is "no data": its row holds CO2 only; the CO2 of flow sample 4 has no later CO2 sample -> NaN
    expectValues(s.t, [0, 0.01, 0.03], 1e-12, 'time');
    expectValues(s.flow, [0.5, -0.5, 1.27], 1 / 100, 'flow');
    expectValues(s.co2, [40, 0, NaN], 1 / 2, 'CO2');
    expect(report.notes.some((n) => n.startsWith('warning: 1 flow sample of signal "Flow" hold the format 80 "no data" value -128'))).toBe(true);
    expect(report.notes.some((n) => n.startsWith('warning: 1 CO2 sample of signal "CO2" hold the format 80 "no data" value -128'))).toBe(true);
    expect(report.co2_missing_samples).toBe(1);
    // with max_silence_s below the 20 ms the flow is silent, the missing sample leaves a gap (one NaN sample)
    const g = read(F80_HEA, files(F80_DAT), { ...ingest, max_silence_s: 0.015 });
    expect(g.report.gaps).toBe(1);
    expectValues(samples(g.blocks).flow, [0.5, -0.5, NaN, 1.27], 1 / 100, 'flow with gap');
  });

  it('multi-frequency record: flow 2 samples per frame, CO2 1; CO2 filled in between as for a table', () => {
    const { blocks, report } = read(MF_HEA, files(MF_DAT));
    const s = samples(blocks);
    expectValues(s.t, [0, 0.01, 0.02, 0.03, 0.04, 0.05], 1e-12, 'time');
    expectValues(s.flow, [0.1, 0.2, 0.3, 0.4, 0.5, 0.6], 1 / 1000, 'flow');
    // CO2 samples at 0, 0.02, 0.04 s; halfway values by linear interpolation; none after the last CO2 sample
    expectValues(s.co2, [20, 20.5, 21, 21.5, 22, NaN], 1 / 500, 'CO2');
    expect(report.rate_hz).toBe(100);
    expect(report.notes.some((n) => n.startsWith('CO2 is sampled at another rate than flow'))).toBe(true);
  });

  it('a checksum that does not match is a warning note, the values are still read', () => {
    const { blocks, report } = read(F16_HEA.replace('32617', '32616'), files(F16_DAT));
    expect(samples(blocks).flow).toHaveLength(3);
    expect(report.notes).toContain('warning: checksum mismatch for flow signal "Flow": the header gives 32616, its 3 samples sum to 32617 (16-bit); the signal file may be damaged or belong to another header, so its values are doubtful');
  });

  it('no number of samples in the header: the frames the file holds', () => {
    const { blocks, report } = read('r16 2 100\nr16.dat 16 1000/L/s\nr16.dat 16 500/mmHg\n', files(F16_DAT));
    expect(samples(blocks).flow).toHaveLength(3);
    expect(report.notes).toContain('the header does not state the number of samples: 3 frames, as many as the signal file holds');
    // no description: named as the WFDB library names them; chosen by units
    expect(report.columns).toEqual({ time: null, flow: 'record r16, signal 0', co2: 'record r16, signal 1' });
  });

  it('base time without a date: time of day; 0:0:0 0/0/0 (the default): no clock start', () => {
    const tod = read(F212_HEA.replace('r212 2 100 3', 'r212 2 100 3 23:59:59'), files(F212_DAT));
    expect(tod.report.clock_start).toEqual({ kind: 'time_of_day', seconds: 86399, text: '23:59:59.000' });
    const none = read(F212_HEA.replace('r212 2 100 3', 'r212 2 100 3 0:0:0 0/0/0'), files(F212_DAT));
    expect(none.report.clock_start).toBeUndefined();
  });

  it('signals chosen by description with --flow-col / --co2-col; --flow-unit overrides the units', () => {
    const r = read(F16_HEA, files(F16_DAT), { ...ingest, flow_col: 'flow', co2_col: 'co2', flow_unit: 'L/min' });
    expect(r.report.settings.flow_col).toEqual({ value: 'Flow', origin: 'given' });
    expectClose(samples(r.blocks).flow[0]!, 0.25 / 60, { rel: 1e-12 });
  });
});

describe('WFDB errors (one line, with a code)', () => {
  it('a truncated signal file', () => {
    const e = errorOf(() => read(F16_HEA, files({ 'r16.dat': F16_DAT['r16.dat'].slice(0, 11) })));
    expect(e.code).toBe('wfdb_truncated');
    expect(e.message).toBe('rec.hea: the signal file "r16.dat" ends after 11 bytes, but the 3 frames the header states need 12 bytes (it holds 2 whole frames). The signal file is cut off; copy or download it again.');
  });

  it('a signal file that was not given', () => {
    const e = errorOf(() => read(F212_HEA, files({ 'r212a.dat': F212_DAT['r212a.dat'] })));
    expect(e.code).toBe('wfdb_missing_signal_file');
    expect(e.message).toBe('rec.hea: the signal file "r212b.dat" named by the header is not among the files given ("r212a.dat"). Choose the .hea file together with its signal files.');
  });

  it('a bad header line names the line and the field', () => {
    const e = errorOf(() => read(F16_HEA.replace('r16.dat 16 500(0)', 'r16.dat 16q 500(0)'), files(F16_DAT)));
    expect(e.code).toBe('wfdb_bad_header');
    expect(e.line).toBe(4);
    expect(e.message).toMatch(/^rec\.hea line 4: field 2 of signal 2 \(format\[xsamples per frame\]\[:skew\]\[\+byte offset\]\) is "16q"\./);
    expect(errorOf(() => read('r 2 abc 3\n', files({}))).message).toContain('line 1: field 3 of the record line (sampling frequency) is "abc"');
    expect(errorOf(() => read('r 2 100 3\nr.dat 16 200/mV\n', files({}))).message).toContain('the record line states 2 signals but the header has 1 signal line');
    expect(errorOf(() => read('r 1 100 3\nr.dat 16 x/mV\n', files({}))).message).toContain('field 3 of signal 1 (ADC gain[(baseline)][/units]) is "x/mV"');
    expect(errorOf(() => read('# nothing\n\n', files({}))).code).toBe('wfdb_bad_header');
  });

  it('a missing channel names the signals that are there', () => {
    const e = errorOf(() => read(F16_HEA, files(F16_DAT), { ...ingest, flow_col: 'Pneumo' }));
    expect(e.code).toBe('columns_not_found');
    expect(e.message).toBe('rec.hea: no signal is labelled "Pneumo" (signals: "Flow" (L/s), "CO2" (mmHg)). Give --flow-col with one of these labels.');
    const e2 = errorOf(() => read(F16_HEA.replace('/mmHg', '/uV').replace(' CO2', ' ECG'), files(F16_DAT)));
    expect(e2.message).toContain('no signal looks like CO2 (dimension mmHg, kPa or %) (signals: "Flow" (L/s), "ECG" (uV))');
  });

  it('an unsupported format is named', () => {
    const e = errorOf(() => read(F16_HEA.replaceAll('r16.dat 16 ', 'r16.dat 8 '), files(F16_DAT)));
    expect(e.code).toBe('wfdb_unsupported');
    expect(e.message).toBe('rec.hea line 3: signal "Flow" is stored in WFDB format 8 (8-bit first differences), which phasewise does not read (it reads formats 16, 24, 32, 61, 80, 160 and 212). Convert the record to format 16 with the WFDB tools, then analyse it again.');
  });

  it('a multi-segment record is refused with what to do', () => {
    const e = errorOf(() => read('multi/3 2 360 45000\n100s 21600\nnull 1800\n100s 21600\n', files({})));
    expect(e.code).toBe('wfdb_unsupported');
    expect(e.message).toBe('rec.hea line 1: "multi/3" is a multi-segment WFDB record (3 segments listed in this header), which phasewise does not read. Analyse each segment\'s own header (.hea) as a recording, or join the segments into one single-segment record first.');
  });

  it('a skew and a signal file in another folder are refused', () => {
    expect(errorOf(() => read(F16_HEA.replace('r16.dat 16 1000', 'r16.dat 16:1 1000'), files(F16_DAT))).message).toContain('has a skew of 1 samples');
    expect(errorOf(() => wfdbSignalFileNames(text('r 1 100 3\n/data/r.dat 16 200/mV\n'), 'rec.hea')).message).toContain('signal file "/data/r.dat" is named with a folder');
  });
});
