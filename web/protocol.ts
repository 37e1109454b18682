// Messages between the page (main.ts) and the analysis worker (worker.ts).

import type { AnalysisCore, GasParseResult, IngestReport, TableLayout, Settings, SampleBlock, ComposedOutputs, GasInput } from '../src/index';
import type { PackedGeometry } from './geometry-store';
import type { PackedRows } from './row-columns';
import type { SignalWindow } from './signal-store';

/** To the reader worker (read-worker.ts), from the analysis worker. */
export type ReaderIn = { type: 'read'; file: File; companions: File[]; settings: Settings } | { type: 'ack' };

/** From the reader worker. */
export type ReaderOut =
  | { type: 'layout'; layout: TableLayout; head: string }
  | { type: 'count'; samples: number }
  | { type: 'block'; block: SampleBlock }
  | { type: 'progress'; bytes: number }
  | { type: 'done'; report: IngestReport }
  | { type: 'error'; message: string; code: string };

export type ToWorker =
  /** `companions`: the signal files chosen together with a WFDB header (empty for other recordings) */
  | { type: 'sniff'; file: File; companions: File[]; settings: Settings }
  | { type: 'analyse'; file: File; companions: File[]; settings: Settings; given: string[] }
  /** recompute the outputs of the last analysis with these exclusions and blood gases */
  | { type: 'compose'; id: number; excluded: [number, string][]; gas: GasInput | null }
  | { type: 'window'; id: number; t0: number; t1: number; columns: number }
  | { type: 'gas'; file: File; start: string | null };

/** A signal of a recording that stores signals rather than table columns (EDF/BDF, WFDB), as the mapping step lists it. */
export interface SignalInfo {
  /** EDF label, WFDB description */
  label: string;
  /** physical dimension / units as written (e.g. 'L/s', 'mmHg') */
  dimension: string;
  rate_hz: number;
  /** how digital values become physical ones (EDF: the physical range; WFDB: gain and baseline) */
  scaling: string;
  /** EDF: the transducer; WFDB: the signal file and its format */
  details: string;
}

/** The head of the file as the mapping step shows it. */
export interface Preview {
  layout: TableLayout;
  /** header cells (generated names when the file has none); for a file of signals, the signal labels */
  header: string[];
  /** for a recording of signals (EDF/BDF, WFDB): its data signals; the mapping step lists them instead of table rows */
  signals?: SignalInfo[];
  /** the first data rows, split at the delimiter */
  rows: string[][];
  /** 1-based line number of each preview row */
  lines: number[];
}

export interface Done {
  type: 'done';
  /** the analysis without its breath rows, which travel packed by column in `rows` */
  core: Omit<AnalysisCore, 'breaths'>;
  rows: PackedRows;
  report: IngestReport;
  geometry: PackedGeometry;
  /** calibration sign and offset applied to flow for display */
  sign: number;
  offset_lps: number;
  t_first_s: number;
  t_last_s: number;
  /** overall ranges for fixed chart scales: flow L/s (positive = expiration), CO2 mmHg */
  flow_range: [number, number];
  co2_range: [number, number];
  /** the outputs with no exclusion and no blood gas */
  outputs: ComposedOutputs;
  /** milliseconds spent reading + analysing in the worker */
  worker_ms: number;
  /** epoch ms when the worker posted this message (to time the transfer) */
  posted_epoch_ms: number;
}

export type FromWorker =
  | { type: 'sniffed'; preview: Preview }
  | { type: 'progress'; bytes: number; total: number; breaths: number }
  | Done
  | { type: 'window'; id: number; data: SignalWindow }
  | { type: 'composed'; id: number; outputs: ComposedOutputs; ms: number }
  | { type: 'gas'; result: GasParseResult; file: string }
  | { type: 'error'; stage: 'sniff' | 'analyse' | 'gas'; message: string; code: string };
