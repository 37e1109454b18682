// Property tests (fast-check):
// 1. text pushed in pieces split anywhere (mid-line, mid-number, between CR and LF) reads exactly like one push;
// 2. random garbage, truncation, duplicated and dropped lines never escape as anything but an InputError, and a
//    result always keeps rows = rows_used + rows_skipped.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createTableReader, InputError, readRecordingText, sniffTable, type TableLayout } from '../../src/ingest';
import { DEFAULT_INGEST, type IngestSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';
import { concatBlocks } from './reference-reader';

const HERE = dirname(fileURLToPath(import.meta.url));

const dir = join(HERE, '..', 'fixtures', 'ingest');

function readInPieces(text: string, cuts: number[], layout: TableLayout, settings: IngestSettings) {
  const r = createTableReader(layout, settings, 'p.csv');
  const blocks: SampleBlock[] = [];
  let from = 0;
  for (const c of [...cuts].sort((a, b) => a - b)) {
    blocks.push(...r.push(text.slice(from, c)));
    from = c;
  }
  blocks.push(...r.push(text.slice(from)), ...r.end());
  return { samples: concatBlocks(blocks), report: r.report() };
}

/** A longer table with damage, mixed-rate blanks, a gap and CRLF line ends. */
function longText(): string {
  const rows = ['# preamble', 'time;flow;co2'];
  for (let i = 0; i < 400; i++) {
    const t = (i < 200 ? i : i + 80) / 100;
    const co2 = i % 2 ? '' : (i % 40 < 20 ? 0.3 : 38 + (i % 7) / 10).toFixed(2).replace('.', ',');
    rows.push(`${t.toFixed(2).replace('.', ',')};${(Math.sin(i / 6) * 0.5).toFixed(4).replace('.', ',')};${co2}`);
    if (i % 97 === 5) rows.push('broken;line');
  }
  return rows.join('\r\n') + '\r\n0,99;1';
}

describe('chunk splits do not change the result', () => {
  const cases: [string, string, Partial<IngestSettings>][] = [
    ['bom-crlf.csv', readFileSync(join(dir, 'bom-crlf.csv'), 'utf8'), {}],
    ['damaged.csv', readFileSync(join(dir, 'damaged.csv'), 'utf8'), {}],
    ['mixed-rate.csv', readFileSync(join(dir, 'mixed-rate.csv'), 'utf8'), {}],
    ['quoted-decimal-comma.csv', readFileSync(join(dir, 'quoted-decimal-comma.csv'), 'utf8'), {}],
    ['clock-midnight.csv', readFileSync(join(dir, 'clock-midnight.csv'), 'utf8'), {}],
    ['long CRLF table', longText(), {}],
  ];
  for (const [name, text, over] of cases) {
    it(name, () => {
      const settings = { ...DEFAULT_INGEST, ...over };
      const layout = sniffTable(text, settings, 20, 'p.csv');
      const whole = readInPieces(text, [], layout, settings);
      expect(whole.report.rows_used).toBeGreaterThan(0);
      fc.assert(
        fc.property(fc.array(fc.integer({ min: 0, max: text.length }), { maxLength: 40 }), (cuts) => {
          expect(readInPieces(text, cuts, layout, settings)).toEqual(whole);
        }),
        { numRuns: 120, seed: 7 },
      );
      // every split between CR and LF, and one character at a time
      const crlf = [...text.matchAll(/\r\n/g)].map((m) => m.index! + 1);
      expect(readInPieces(text, crlf, layout, settings)).toEqual(whole);
      if (text.length < 5000) expect(readInPieces(text, Array.from({ length: text.length }, (_, i) => i), layout, settings)).toEqual(whole);
    });
  }
});

describe('damaged input: a result with full accounting, or an InputError', () => {
  const base = ['time,flow,co2', ...Array.from({ length: 60 }, (_, i) => `${(i / 100).toFixed(2)},${i % 20 < 10 ? -0.4 : 0.45},${i % 20 < 10 ? 0.3 : 38.2}`)];
  const garbage = fc.oneof(
    fc.string(),
    fc.string({ unit: 'binary', maxLength: 30 }),
    fc.string({ unit: fc.constantFrom(...'0123456789.,;-+e "\t\rNaN'), maxLength: 30 }),
    fc.constantFrom('', '#', '1,2', '1,2,3,4', ',,', 'NaN,NaN,NaN', '1e999,1,1', '"1,2",3,4', '"unclosed,1,2', '\u0000'),
  );
  const mutation = fc.oneof(
    fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), line: garbage }),
    fc.record({ kind: fc.constant('drop' as const), at: fc.nat() }),
    fc.record({ kind: fc.constant('duplicate' as const), at: fc.nat() }),
    fc.record({ kind: fc.constant('garble' as const), at: fc.nat(), line: garbage }),
  );
  it('never throws anything but InputError; rows = rows_used + rows_skipped', () => {
    fc.assert(
      fc.property(fc.array(mutation, { maxLength: 25 }), fc.option(fc.nat(), { nil: undefined }), fc.constantFrom('\n', '\r\n'), (muts, cut, eol) => {
        const lines = [...base];
        for (const m of muts) {
          const i = 1 + (m.at % lines.length);
          if (m.kind === 'insert') lines.splice(i, 0, m.line);
          else if (m.kind === 'drop') lines.splice(i, 1);
          else if (m.kind === 'duplicate') lines.splice(i, 0, lines[Math.min(i, lines.length - 1)]!);
          else lines[Math.min(i, lines.length - 1)] = m.line;
        }
        let text = lines.join(eol) + eol;
        if (cut !== undefined) text = text.slice(0, cut % (text.length + 1));
        try {
          const { blocks, report } = readRecordingText(text, DEFAULT_INGEST, 20, 'm.csv');
          expect(report.rows).toBe(report.rows_used + report.rows_skipped);
          expect(Object.values(report.skipped_by_reason).reduce((a, b) => a + b, 0)).toBe(report.rows_skipped);
          expect(report.skipped_examples.length).toBe(Math.min(10, report.rows_skipped));
          const totalLines = text.split(/\r?\n/).length;
          for (const ex of report.skipped_examples) expect(ex.line).toBeLessThanOrEqual(totalLines);
          expect(blocks.reduce((a, b) => a + b.n, 0)).toBe(report.samples);
          for (const b of blocks) for (let k = 1; k < b.n; k++) expect(b.t_s[k]!).toBeGreaterThan(b.t_s[k - 1]!);
        } catch (e) {
          if (!(e instanceof InputError)) throw e;
          expect(e.message).not.toMatch(/\n/);
          expect(e.message.startsWith('m.csv')).toBe(true);
        }
      }),
      { numRuns: 400, seed: 11 },
    );
  });
});
