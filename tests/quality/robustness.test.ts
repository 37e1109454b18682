// Bad input never escapes as an exception (acceptance test): property-based tests (fast-check) feed random and
// mutated recordings — dropped, duplicated, garbled and truncated lines, random units in the header, NaN and huge
// values, random bytes — and assert the analysis either returns a result with full row accounting
// (rows = rows_used + rows_skipped) or fails with a clear one-line error of a known kind.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from '../../src/analyse/analyser';
import { isInputError } from '../../src/ingest/index';
import { analyseText } from '../../src/pipeline/analyse-text';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, writeRecordingCsv } from '../../src/simulate/index';

function baseCsv(): string {
  let text = '';
  writeRecordingCsv(scenarioParams('adult-healthy', { minutes: 0.75 }), 3, (t) => (text += t));
  return text;
}
const BASE = baseCsv();
const LINES = BASE.split('\n');

type Mutation =
  | { kind: 'drop'; at: number; count: number }
  | { kind: 'duplicate'; at: number; count: number }
  | { kind: 'garble'; at: number; text: string }
  | { kind: 'truncate'; at: number }
  | { kind: 'cell'; at: number; value: string }
  | { kind: 'header'; text: string };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('drop' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 400 }) }),
  fc.record({ kind: fc.constant('duplicate' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 50 }) }),
  fc.record({ kind: fc.constant('garble' as const), at: fc.nat(), text: fc.string({ maxLength: 40 }) }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({
    kind: fc.constant('cell' as const),
    at: fc.nat(),
    value: fc.constantFrom('NaN', '', '1e308', '-1e308', 'Infinity', '99999999', '-', 'abc', '0x1F', '1,5', '  '),
  }),
  fc.record({
    kind: fc.constant('header' as const),
    text: fc.constantFrom(
      'time_s,flow_lps,co2_mmhg',
      'Time (ms),Flow (L/min),CO2 [kPa]',
      'time_s,flow_mlps,co2_pct',
      't,a,b',
      'time,flow,co2,co2',
      '',
      'flow_lps,co2_mmhg',
    ),
  }),
);

function apply(lines: string[], m: Mutation): string[] {
  const out = [...lines];
  const i = lines.length ? m.kind === 'header' ? 0 : (m as { at: number }).at % lines.length : 0;
  switch (m.kind) {
    case 'drop':
      out.splice(i, m.count);
      break;
    case 'duplicate':
      out.splice(i, 0, ...lines.slice(i, i + m.count));
      break;
    case 'garble':
      out[i] = (out[i] ?? '').slice(0, 5) + m.text;
      break;
    case 'truncate':
      return out.slice(0, i).concat([(out[i] ?? '').slice(0, 3)]);
    case 'cell': {
      const cells = (out[i] ?? '').split(',');
      cells[i % Math.max(1, cells.length)] = m.value;
      out[i] = cells.join(',');
      break;
    }
    case 'header':
      out[0] = m.text;
      break;
  }
  return out;
}

function runSafely(text: string): 'result' | 'error' {
  try {
    const r = analyseText(text, defaultSettings(), new Set(), 'mutated.csv');
    const inp = r.summary.input;
    expect(inp.rows).toBe(inp.rows_used + inp.rows_skipped);
    expect(r.summary.breaths.found).toBe(r.core.breaths.length);
    JSON.stringify(r.summary);
    return 'result';
  } catch (e) {
    if (isInputError(e) || e instanceof AnalysisInputError) {
      expect(e.message).not.toContain('\n');
      expect(e.message.length).toBeGreaterThan(10);
      return 'error';
    }
    throw e;
  }
}

describe('robustness: mutated recordings give a result with row accounting or a clear error', () => {
  it('unmutated base recording analyses cleanly', () => {
    const r = analyseText(BASE, defaultSettings(), new Set(), 'base.csv');
    expect(r.summary.input.rows_skipped).toBe(0);
    expect(r.summary.breaths.ok).toBeGreaterThan(5);
  });

  it('random line and cell mutations', () => {
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 6 }), (ms) => {
        let lines = LINES;
        for (const m of ms) lines = apply(lines, m);
        runSafely(lines.join('\n'));
      }),
      { numRuns: 60, seed: 20261201 },
    );
  });

  it('random text and random bytes decoded as text', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 2000 }), fc.uint8Array({ maxLength: 3000 }).map((b) => new TextDecoder().decode(b))), (text) => {
        runSafely(text);
      }),
      { numRuns: 80, seed: 7 },
    );
  });

  it('a recording that lost its CO2 halfway still analyses the readable part and counts the damage', () => {
    const lines = [...LINES];
    for (let i = Math.floor(lines.length / 2); i < lines.length - 1; i += 3) lines[i] = 'ERR';
    const r = analyseText(lines.join('\n'), defaultSettings(), new Set(), 'damaged.csv');
    expect(r.summary.input.rows_skipped).toBeGreaterThan(100);
    expect(r.summary.input.rows).toBe(r.summary.input.rows_used + r.summary.input.rows_skipped);
    expect(r.summary.breaths.found).toBeGreaterThan(3);
  });
});
