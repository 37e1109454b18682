// Flow volumes reported at ambient conditions are converted to BTPS at ingest. Check value: the BTPS factor at 22 C
// and PB 760 mmHg is 1.091 (the spirometry BTPS table, common practice, no source; formula derived in docs/methods.md);
// dry gas (ATPD) uses no water vapour at ambient temperature.
import { describe, expect, it } from 'vitest';
import { readRecordingText } from '../../src/ingest/index';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';

const text = 'time_s,flow_lps,co2_mmhg\n' + Array.from({ length: 200 }, (_, i) => `${(i / 100).toFixed(2)},${(0.5 * Math.sin(i / 10)).toFixed(4)},${(20 + 10 * Math.sin(i / 10)).toFixed(2)}`).join('\n') + '\n';

function flows(condition: 'btps' | 'atps' | 'atpd', temp = 22): number[] {
  const s = defaultSettings();
  s.ingest.flow_condition = condition;
  s.ingest.flow_temp_c = temp;
  const { blocks, report } = readRecordingText(text, s.ingest, 20, 'f.csv');
  if (condition !== 'btps') expect(report.notes.some((n) => n.includes('to BTPS'))).toBe(true);
  return blocks.flatMap((b) => Array.from(b.flow_lps.subarray(0, b.n)));
}

describe('flow condition', () => {
  it('ATPS at 22 C scales flow by the BTPS factor 1.091', () => {
    const a = flows('btps');
    const b = flows('atps');
    const k = b[15]! / a[15]!;
    expectClose(k, 1.091, { abs: 0.001 });
    expect(b.every((v, i) => Math.abs(v - a[i]! * k) < 1e-12)).toBe(true);
  });
  it('ATPD converts dry gas: a larger factor than ATPS at the same temperature; BTPS is unchanged', () => {
    const a = flows('btps');
    const d = flows('atpd')[15]! / a[15]!;
    expect(d).toBeGreaterThan(1.091);
    // dry gas at 22 C: (310.15/295.15) * 760/713 = 1.1201 (the formula with PH2O(T) = 0; derived here)
    expectClose(d, 1.1201, { abs: 0.0005 });
  });
});
