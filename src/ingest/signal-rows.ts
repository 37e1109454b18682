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

/** Where the samples of the two signals lie and how to read them (see mergeByTime). */
export interface SignalPair {
  /** flow and CO2 samples to merge */
  nf: number;
  nc: number;
  /** flow sample i lies at i / perF, CO2 sample j at j / perC of one common period (whole numbers) */
  perF: number;
  perC: number;
  flowTime: (i: number) => number;
  co2Time: (j: number) => number;
  flowAt: (i: number) => number;
  co2At: (j: number) => number;
}

/**
 * Flow and CO2 samples merged by time into rows, the times compared exactly in integers (i perC against j perF):
 * equal times give one row with both values, otherwise a row with the other value blank (NaN). Samples are read in
 * time order, flow before CO2 at one time. Rows are numbered on from `line`; returns the last number used.
 */
export function mergeByTime(rows: RowAssembler, line: number, p: SignalPair): number {
  let i = 0;
  let j = 0;
  while (i < p.nf || j < p.nc) {
    const cmp = i >= p.nf ? 1 : j >= p.nc ? -1 : i * p.perC - j * p.perF;
    if (cmp === 0) {
      rows.row(++line, p.flowTime(i), p.flowAt(i), p.co2At(j));
      i++;
      j++;
    } else if (cmp < 0) {
      rows.row(++line, p.flowTime(i), p.flowAt(i), NaN);
      i++;
    } else {
      rows.row(++line, p.co2Time(j), NaN, p.co2At(j));
      j++;
    }
  }
  return line;
}
