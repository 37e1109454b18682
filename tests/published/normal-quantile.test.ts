// Standard normal quantiles against the table of Abramowitz M, Stegun IA 1964, Handbook of Mathematical Functions
// (Table 26.1 and 26.2): z(0.9) = 1.281552, z(0.975) = 1.959964, z(0.995) = 2.575829; the rational approximation
// 26.2.23 that normalQuantile uses is stated there to be within 4.5e-4.
import { describe, expect, it } from 'vitest';
import { normalQuantile } from '../../src/numeric/stats';
import { expectClose } from '../helpers/expect-close';

describe('normalQuantile (Abramowitz & Stegun 1964, 26.2.23)', () => {
  it('matches the tabulated quantiles within 4.5e-4, symmetric about 0.5', () => {
    for (const [p, z] of [[0.9, 1.281552], [0.975, 1.959964], [0.995, 2.575829]] as const) {
      expectClose(normalQuantile(p), z, { abs: 4.5e-4 });
      expectClose(normalQuantile(1 - p), -z, { abs: 4.5e-4 });
    }
    expect(Math.abs(normalQuantile(0.5))).toBeLessThan(4.5e-4);
    expect(normalQuantile(0)).toBeNaN();
    expect(normalQuantile(1)).toBeNaN();
  });
});
