// Hand-built BreathRow values for the blood-gas tests (not a test file). Unset numeric fields are NaN.
import { blankBreathRow } from '../../src/metrics/registry';
import type { BreathRow } from '../../src/types';
import type { GasSample } from '../../src/gas/index';

export function makeBreath(fields: Partial<BreathRow> & { t_start_s: number }): BreathRow {
  return { ...blankBreathRow(), breath: 0, t_end_s: fields.t_start_s + 4, ...fields };
}

/** Numbered breaths every 5 s from `fromS` (each 4 s long), all with the same fields. */
export function breathSeries(fromS: number, count: number, fields: Partial<BreathRow>): BreathRow[] {
  return Array.from({ length: count }, (_, i) => makeBreath({ ...fields, breath: i + 1, t_start_s: fromS + 5 * i }));
}

export function makeSample(fields: Partial<GasSample> & { time_s: number; paco2_mmhg: number }): GasSample {
  return {
    line: 2,
    pao2_mmhg: NaN,
    sao2_pct: NaN,
    svo2_pct: NaN,
    pvco2_mmhg: NaN,
    pvo2_mmhg: NaN,
    hb_g_dl: NaN,
    fio2_pct: NaN,
    temp_c: NaN,
    ...fields,
  };
}
