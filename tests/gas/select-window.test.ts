// Which breaths a blood-gas sample is matched with: ok breaths entirely inside the window before the sample.
import { describe, expect, it } from 'vitest';
import { selectWindowBreaths } from '../../src/gas/index';
import { makeBreath } from './make-breath';

describe('selectWindowBreaths', () => {
  const breaths = [
    makeBreath({ breath: 1, t_start_s: 30, t_end_s: 34 }), // before the window (sample at 100, window 60 -> from 40)
    makeBreath({ breath: 2, t_start_s: 39, t_end_s: 43 }), // starts before the window edge
    makeBreath({ breath: 3, t_start_s: 40, t_end_s: 44 }), // exactly at the window start: in
    makeBreath({ breath: 4, t_start_s: 60, t_end_s: 64, status: 'leak' }), // not ok
    makeBreath({ breath: 5, t_start_s: 70, t_end_s: 74, status: 'ok' }),
    makeBreath({ breath: 6, t_start_s: 95, t_end_s: 100 }), // ends exactly at the sample: in
    makeBreath({ breath: 7, t_start_s: 98, t_end_s: 102 }), // in progress when the blood was drawn: out
    makeBreath({ breath: 8, t_start_s: 120, t_end_s: 124 }), // after the sample
    makeBreath({ breath: 9, t_start_s: 80, t_end_s: NaN }), // no end time: its start stands in
  ];

  it('keeps only ok breaths inside [t - window, t]', () => {
    expect(selectWindowBreaths(breaths, 100, 60).map((b) => b.breath)).toEqual([3, 5, 6, 9]);
  });

  it('a shorter window keeps fewer breaths; no breaths gives an empty list', () => {
    expect(selectWindowBreaths(breaths, 100, 10).map((b) => b.breath)).toEqual([6]);
    expect(selectWindowBreaths(breaths, 20, 60)).toEqual([]);
  });

  it('status must be exactly ok', () => {
    const flagged = [makeBreath({ breath: 1, t_start_s: 90, status: 'outlier' }), makeBreath({ breath: 2, t_start_s: 91, status: 'OK' })];
    expect(selectWindowBreaths(flagged, 100, 60)).toEqual([]);
  });
});
