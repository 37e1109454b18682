// The fast line scanner must give exactly what the slow reference path gives (papaparse splits lines,
// Number() reads cells): same samples bit for bit (Object.is, so NaN and -0 count), same report.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createTableReader, sniffTable, type IngestReport, type TableLayout } from '../../src/ingest';
import { DEFAULT_INGEST, type IngestSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';
import { concatBlocks, referenceRead, type Columns } from './reference-reader';

const HERE = dirname(fileURLToPath(import.meta.url));

const dir = join(HERE, '..', 'fixtures', 'ingest');

type Outcome = { samples: Columns; report: Omit<IngestReport, 'bytes'> } | { error: string };

function fast(text: string, layout: TableLayout, settings: IngestSettings): Outcome {
  try {
    const r = createTableReader(layout, settings, 'x.csv');
    const blocks: SampleBlock[] = [...r.push(text), ...r.end()];
    const { bytes: _b, ...report } = r.report();
    return { samples: concatBlocks(blocks), report };
  } catch (e) {
    return { error: (e as Error).message };
  }
}
function slow(text: string, layout: TableLayout, settings: IngestSettings): Outcome {
  try {
    const { samples, report } = referenceRead(text, layout, settings, 'x.csv');
    const { bytes: _b, ...rest } = report;
    return { samples, report: rest };
  } catch (e) {
    return { error: (e as Error).message };
  }
}

/** Equal bit for bit: Object.is per element (NaN === NaN, -0 !== 0). */
function expectSame(a: Outcome, b: Outcome): void {
  if ('error' in a || 'error' in b) {
    expect(a).toEqual(b);
    return;
  }
  expect(a.report).toEqual(b.report);
  for (const k of ['t', 'flow', 'co2', 'line'] as const) {
    expect(a.samples[k].length).toBe(b.samples[k].length);
    for (let i = 0; i < a.samples[k].length; i++) {
      if (!Object.is(a.samples[k][i], b.samples[k][i])) {
        expect.fail(`${k}[${i}] (line ${a.samples.line[i]}): fast ${a.samples[k][i]} vs reference ${b.samples[k][i]}`);
      }
    }
  }
}

describe('fast reader = papaparse + Number reference, on the fixtures', () => {
  const files: [string, Partial<IngestSettings>][] = [
    ['comma.csv', {}], ['semicolon-comma.csv', {}], ['tab.tsv', {}], ['bom-crlf.csv', {}], ['preamble-units-row.csv', {}],
    ['time-ms.csv', {}], ['clock-midnight.csv', {}], ['iso-time.csv', {}], ['no-time.csv', { rate_hz: 100 }],
    ['percent.csv', {}], ['quoted-decimal-comma.csv', {}], ['preamble-key-value.csv', {}], ['mixed-rate.csv', {}], ['gap.csv', {}], ['damaged.csv', {}],
  ];
  for (const [file, over] of files) {
    it(file, () => {
      const text = readFileSync(join(dir, file), 'utf8');
      const settings = { ...DEFAULT_INGEST, ...over };
      const layout = sniffTable(text, settings, 20, file);
      const a = fast(text, layout, settings);
      expect('error' in a).toBe(false);
      expectSame(a, slow(text, layout, settings));
    });
  }
});

// ---- random cells: numbers in many spellings, blanks, missing-value words, garbage, quotes, wrong field counts
const digits = (max: number) => fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: 0, maxLength: max });
const numberToken = (dec: string) =>
  fc.tuple(fc.constantFrom('', '', '-', '+'), digits(12), fc.option(digits(10), { nil: undefined }), fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '-', '+'), digits(3)), { nil: undefined, freq: 8 }))
    .map(([sign, a, b, e]) => sign + a + (b === undefined ? '' : dec + b) + (e ? e.join('') : ''));
const space = fc.constantFrom('', '', '', ' ', '  ', '\t');
const cellToken = (dec: string, delim: string) =>
  fc.oneof(
    { weight: 8, arbitrary: fc.tuple(space, numberToken(dec), space).map((p) => p.join('')) },
    { weight: 2, arbitrary: fc.constantFrom('', ' ', 'NaN', 'nan', 'NA', '-', '--', 'null', '#N/A') },
    { weight: 1, arbitrary: numberToken(dec).map((n) => `"${n}"`) },
    { weight: 2, arbitrary: fc.constantFrom('1.2.3', '1,2,3', '.', '-.', 'e5', '1e', '0x1A', 'Infinity', '١٢', '1 2', '12abc', '+-1', '.5', '5.', '-0', '-0.0', '007', '9007199254740993', '0.1234567890123456789',
      // 17 significant digits where mantissa/10^k would differ from Number(): must take the careful path
      '1.8965975687618297', '1.5188590083201305', '9.2053068843714816', '-1.0833998088379865') },
    { weight: 1, arbitrary: fc.string({ unit: fc.constantFrom(...'ab.,;+-eE 019'), maxLength: 8 }) },
  ).map((t) => (t.includes(delim) && !t.startsWith('"') ? t.split(delim).join('') : t));

interface Config {
  delim: string;
  dec: '.' | ',';
}
const configs: Config[] = [{ delim: ',', dec: '.' }, { delim: ';', dec: ',' }, { delim: '\t', dec: '.' }, { delim: '\t', dec: ',' }];

function tableText(cfg: Config, rows: string[][], crlf: boolean, terminated: boolean): string {
  const head = ['time', 'flow', 'extra', 'co2'].join(cfg.delim);
  const clean = Array.from({ length: 12 }, (_, i) => [(i / 100).toFixed(2), i % 2 ? '0.4' : '-0.4', 'x', i % 2 ? '38.5' : '0.2'].map((c) => c.replace('.', cfg.dec)).join(cfg.delim));
  const body = rows.map((r) => r.join(cfg.delim));
  const eol = crlf ? '\r\n' : '\n';
  return [head, ...clean, ...body].join(eol) + (terminated ? eol : '');
}

describe('fast reader = reference on random cells (fast-check)', () => {
  for (const cfg of configs) {
    it(`delimiter ${JSON.stringify(cfg.delim)}, decimal '${cfg.dec}'`, () => {
      const settings: IngestSettings = { ...DEFAULT_INGEST, flow_unit: 'L/s', co2_unit: 'mmHg', time_unit: 's', decimal: cfg.dec, delimiter: cfg.delim };
      const row = fc.tuple(
        fc.oneof({ weight: 6, arbitrary: fc.constant('T') }, { weight: 1, arbitrary: cellToken(cfg.dec, cfg.delim) }),
        cellToken(cfg.dec, cfg.delim), cellToken(cfg.dec, cfg.delim), cellToken(cfg.dec, cfg.delim),
        fc.constantFrom(0, 0, 0, 0, 0, 0, -1, 1, 2),
      );
      fc.assert(
        fc.property(fc.array(row, { maxLength: 60 }), fc.boolean(), fc.boolean(), (rs, crlf, terminated) => {
          const rows = rs.map(([t, f, x, c, extra], i) => {
            const cells = [t === 'T' ? (0.12 + i / 100).toFixed(3).replace('.', cfg.dec) : t, f, x, c];
            if (extra < 0) cells.pop();
            for (let k = 0; k < extra; k++) cells.push(k === 0 ? '' : '9');
            return cells;
          });
          const text = tableText(cfg, rows, crlf, terminated);
          // the layout comes from the clean first rows; both readers then get the same layout and the whole text
          const layout = sniffTable(tableText(cfg, [], crlf, true), settings, 20, 'x.csv');
          expectSame(fast(text, layout, settings), slow(text, layout, settings));
        }),
        { numRuns: 150, seed: 20240305 },
      );
    });
  }
});

// ---- clock stamps: the scanner's in-place reader (clock-scan.ts) against the regular-expression reader
const two = fc.integer({ min: 0, max: 99 }).map((n) => String(n).padStart(2, '0'));
const frac = fc.oneof(fc.constant(''), fc.tuple(fc.constantFrom('.', ','), digits(15)).map(([d, x]) => d + x));
const timeOfDay = fc.tuple(fc.oneof(two, fc.integer({ min: 0, max: 9 }).map(String)), two, two, frac).map(([h, m, s, f]) => `${h}:${m}:${s}${f}`);
const zone = fc.constantFrom('', 'Z', '+01:00', '-05:30', '+0100', '-02', '+1', 'z', '+01:0');
const inRange = (lo: number, hi: number) => fc.oneof({ weight: 5, arbitrary: fc.integer({ min: lo, max: hi }).map((n) => String(n).padStart(2, '0')) }, { weight: 1, arbitrary: two });
const dateTime = fc.tuple(fc.integer({ min: 1990, max: 2040 }), inRange(1, 12), inRange(1, 28), fc.constantFrom('T', ' ', 'T', 't'), inRange(0, 23), inRange(0, 59), inRange(0, 59), frac, zone)
  .map(([y, mo, d, sep, h, mi, s, f, z]) => `${y}-${mo}-${d}${sep}${h}:${mi}:${s}${f}${z}`);

describe('clock stamps: fast reader = regular-expression reader (fast-check)', () => {
  for (const kind of ['time_of_day', 'date_time'] as const) {
    it(kind, () => {
      const first = kind === 'time_of_day' ? '23:59:59.000' : '2024-03-05T23:59:59.000+01:00';
      const stamp = (i: number) => {
        const t = 86399 + i * 0.01;
        const hh = Math.floor(t / 3600) % 24;
        const mm = Math.floor((t % 3600) / 60);
        const ss = (t % 60).toFixed(3).padStart(6, '0');
        const clock = `${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}:${ss}`;
        return kind === 'time_of_day' ? clock : `2024-03-0${t >= 86400 ? 6 : 5}T${clock}+01:00`;
      };
      const clean = [first, ...Array.from({ length: 11 }, (_, i) => stamp(i + 1))].map((t, i) => `${t},${i % 2 ? 0.4 : -0.4},${i % 2 ? 38 : 0.2}`);
      const head = ['time,flow,co2', ...clean].join('\n') + '\n';
      const settings: IngestSettings = { ...DEFAULT_INGEST, flow_unit: 'L/s', co2_unit: 'mmHg' };
      const layout = sniffTable(head, settings, 20, 'x.csv');
      expect(layout.units.time).toBe('clock');
      expect(layout.clock_kind).toBe(kind);
      const cell = fc.oneof({ weight: 4, arbitrary: fc.constant('NEXT') }, { weight: 3, arbitrary: kind === 'time_of_day' ? timeOfDay : dateTime },
        { weight: 1, arbitrary: fc.tuple(space, kind === 'time_of_day' ? timeOfDay : dateTime, space).map((p) => p.join('')) },
        { weight: 1, arbitrary: fc.constantFrom('', '10:00', '1:2:3', '10:00:00.', '24:00:00', '23:60:00', '23:59:61', '2024-13-01T10:00:00', '2024-02-31T10:00:00Z', '"10:00:00.5"', '10:00:00.1234567890123456') });
      fc.assert(
        fc.property(fc.array(cell, { maxLength: 40 }), (cells) => {
          const rows = cells.map((c, i) => `${c === 'NEXT' ? stamp(12 + i) : c},${i % 3 ? 0.3 : -0.3},${i % 4 ? 37 : 0.4}`);
          const text = head + rows.join('\n') + '\n';
          expectSame(fast(text, layout, settings), slow(text, layout, settings));
        }),
        { numRuns: 200, seed: 42 },
      );
    });
  }
});
