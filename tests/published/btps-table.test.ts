// ATPS -> BTPS factor against the table of primer 7.3 (check W6). Tolerance 0.001 as the primer asks.
// "table" column: published: BTPS table in a public teaching package; identity with the ATS/ERS 2005 table
// (Miller MR et al. 2005 "Standardisation of spirometry", Eur Respir J 26:319-338) is from memory.
// "recomputed" column: common practice, no source (formula with a Buck-type vapour-pressure equation); used here as
// a tighter cross-check of our stated vapour-pressure equation (tolerance 1e-4 = rounding of the 4-decimal column).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { btpsFactor } from '../../src/physiology/index.js';

const TABLE: readonly [tempC: number, table: number, recomputed: number][] = [
  [20, 1.102, 1.1019], [21, 1.096, 1.0965], [22, 1.091, 1.091], [23, 1.085, 1.0855], [24, 1.08, 1.0799],
  [25, 1.075, 1.0743], [26, 1.068, 1.0686], [27, 1.063, 1.0628], [28, 1.057, 1.057], [29, 1.051, 1.051],
  [30, 1.045, 1.045], [31, 1.039, 1.0389], [32, 1.032, 1.0327], [33, 1.026, 1.0264], [34, 1.02, 1.0199],
  [35, 1.014, 1.0134], [36, 1.007, 1.0068], [37, 1.0, 1.0],
];

describe('BTPS factor (ATPS -> BTPS, PB 760)', () => {
  // published: BTPS table in a public teaching package; recomputed from the formula; identity with the ATS/ERS
  // table is from memory (primer W6)
  it('W6: 22 C -> 1.091, 20 C -> 1.102, 37 C -> 1.000 [published: BTPS table in a public teaching package]', () => {
    expectClose(btpsFactor(22, 760, true), 1.091, { abs: 0.001 });
    expectClose(btpsFactor(20, 760, true), 1.102, { abs: 0.001 });
    expectClose(btpsFactor(37, 760, true), 1.0, { abs: 0.001 });
  });

  for (const [tempC, table, recomputed] of TABLE) {
    it(`${tempC} C -> ${table} (table, abs 0.001) [published: BTPS table in a public teaching package; ATS/ERS identity from memory]`, () => {
      expectClose(btpsFactor(tempC, 760, true), table, { abs: 0.001 });
    });
    it(`${tempC} C -> ${recomputed} (recomputed, abs 1e-4) [common practice, no source]`, () => {
      expectClose(btpsFactor(tempC, 760, true), recomputed, { abs: 1e-4 });
    });
  }

  // ATPD -> BTPS: same formula with PH2O(T_amb) = 0 (primer 7.3). Expected value is the primer's formula evaluated by
  // hand with the conventional 47 mmHg: (310.15/295.15) * 760/713 = 1.12008; tolerance 0.001 covers 47 vs 47.10.
  it('ATPD 22 C -> 1.120 [common practice, no source: formula of primer 7.3 with PH2O(T_amb) = 0]', () => {
    expectClose(btpsFactor(22, 760, false), (310.15 / 295.15) * (760 / 713), { abs: 0.001 });
  });
});
