// Number formatting of every output: the fast path must give exactly the text of the plain rule
// String(Number(x.toPrecision(6))) (common practice, no source: six significant digits, shortest round-trip text).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatNumber } from '../src/report/format';

const plain = (x: number) => (Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6)) === 0 ? 0 : Number(x.toPrecision(6))));

describe('formatNumber', () => {
  it('equals the plain rule on random doubles of every magnitude', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        expect(formatNumber(x)).toBe(plain(x));
      }),
      { numRuns: 20000, seed: 42 },
    );
    fc.assert(
      fc.property(fc.double({ min: -2e5, max: 2e5, noNaN: true }), (x) => {
        expect(formatNumber(x)).toBe(plain(x));
      }),
      { numRuns: 50000, seed: 43 },
    );
    for (const x of [1e-6, -1e-6, 99999.95, 99999.9999, 0.1 + 0.2, -0.000123456789, 12.5, 149.64800000001, 1e-7, 123456.7]) {
      expect(formatNumber(x)).toBe(plain(x));
    }
  });
  it('writes NaN, null and infinities as empty cells', () => {
    expect(formatNumber(NaN)).toBe('');
    expect(formatNumber(null)).toBe('');
    expect(formatNumber(Infinity)).toBe('');
  });
});
