// Rows from a recording of signals (EDF/BDF data records, WFDB frames): the layout the row assembler reads them with,
// and the merge of the flow and CO2 samples by time into rows (src/ingest/row-assembler.ts then treats them as the
// rows of a table: a slower CO2 signal is filled as blank CO2 cells are).
import type { SignalChannels } from './edf-channels';
import type { TableLayout } from './layout';
import type { RowAssembler } from './row-assembler';

/** The layout the row assembler needs for a recording of signals: seconds, the units' factors, the signal labels as
 *  column names (`labels`: every signal's, in file order; the chosen ones by the indices in `ch`). */
export function signalsLayout(labels: string[], ch: SignalChannels, rate: number): TableLayout {
  return {
    delimiter: '',
    decimal: '.',
    line_end: '\n',
    header_index: -1,
    header_line: 0,
    data_start_index: 0,
    header: labels,
    field_count: labels.length,
    header_trailing_empty: false,
    columns: { time: -1, flow: ch.flowIndex, co2: ch.co2Index },
    names: { time: null, flow: labels[ch.flowIndex]!, co2: labels[ch.co2Index]! },
    units: { time: 's', flow: ch.flowUnit, co2: ch.co2Unit },
    clock_kind: null,
    flow_factor: ch.flowFactor,
    co2_factor: ch.co2Factor,
    time_divisor: 1,
    rate_hz: rate,
    notes: ch.notes,
    settings: ch.settings,
  };
}

/** Two signals' samples and where they lie (see mergeByTime). */
export interface SignalPair {
  flow: Float64Array;
  co2: Float64Array;
  /** flow sample i lies at i / perF, CO2 sample j at j / perC of one common period (whole numbers) */
  perF: number;
  perC: number;
  /** times: flow sample i at onset_s + (i span_s) / rateF, CO2 sample j at onset_s + (j span_s) / rateC */
  onset_s: number;
  span_s: number;
  rateF: number;
  rateC: number;
}

/**
 * Flow and CO2 samples merged by time into rows, the times compared exactly in integers (i perC against j perF):
 * equal times give one row with both values, otherwise a row with the other value blank (NaN). Rows are numbered on
 * from `line`; returns the last number used.
 */
export function mergeByTime(rows: RowAssembler, line: number, p: SignalPair): number {
  const { flow, co2, perF, perC, onset_s, span_s, rateF, rateC } = p;
  const nf = flow.length;
  const nc = co2.length;
  let i = 0;
  let j = 0;
  while (i < nf || j < nc) {
    const cmp = i >= nf ? 1 : j >= nc ? -1 : i * perC - j * perF;
    if (cmp === 0) {
      rows.row(++line, onset_s + (i * span_s) / rateF, flow[i]!, co2[j]!);
      i++;
      j++;
    } else if (cmp < 0) {
      rows.row(++line, onset_s + (i * span_s) / rateF, flow[i]!, NaN);
      i++;
    } else {
      rows.row(++line, onset_s + (j * span_s) / rateC, NaN, co2[j]!);
      j++;
    }
  }
  return line;
}
