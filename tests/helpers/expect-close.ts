// Tolerance assertion for numeric tests. Passes when |actual - expected| <= abs OR <= rel * |expected|
// (whichever tolerance is given; both given = either suffices). Default: rel 1e-3.
// Fails with a message that shows actual, expected, the difference and the tolerance used.
import { expect } from 'vitest';

export interface CloseTolerance {
  abs?: number;
  rel?: number;
}

export function expectClose(actual: number, expected: number, tol: CloseTolerance = {}, label = ''): void {
  const rel = tol.rel ?? (tol.abs === undefined ? 1e-3 : undefined);
  const diff = Math.abs(actual - expected);
  const limits: number[] = [];
  if (tol.abs !== undefined) limits.push(tol.abs);
  if (rel !== undefined) limits.push(rel * Math.abs(expected));
  const limit = Math.max(...limits);
  const ok = Number.isFinite(actual) && Number.isFinite(expected) ? diff <= limit : Object.is(actual, expected);
  if (!ok) {
    const what = label ? `${label}: ` : '';
    const tolText = [tol.abs !== undefined ? `abs ${tol.abs}` : '', rel !== undefined ? `rel ${rel}` : '']
      .filter(Boolean)
      .join(', ');
    expect.fail(`${what}expected ${expected}, got ${actual} (difference ${diff}, allowed ${limit} from ${tolText})`);
  }
}
