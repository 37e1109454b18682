// Shared data shapes of the phasewise core. Internal units are fixed once (see DEVELOPERS.md):
// time s, flow L/s (positive = expiration), volume mL (BTPS as delivered by the flow sensor), CO2 mmHg.
// Every field name carries its unit.

/** A block of samples on the flow's time base, already converted to internal units and signs.
 *  NaN in flow_lps or co2_mmhg marks a missing sample (gap); the analyser splits breaths there. */
export interface SampleBlock {
  t_s: Float64Array;
  flow_lps: Float64Array;
  co2_mmhg: Float64Array;
  /** number of valid entries (arrays may be longer) */
  n: number;
  /** 1-based source line numbers of each sample (for messages); optional */
  line?: Int32Array;
}

/** A data problem found while reading or analysing (never thrown; collected and reported). */
export interface Issue {
  code: string;
  message: string;
  line?: number;
  column?: number;
  severity: 'info' | 'warning' | 'error';
}

/** How a setting got its value: given by the user (option or settings file), inferred from data, or default. */
export type SettingOrigin = 'given' | 'inferred' | 'default';

export interface RecordedSetting {
  value: unknown;
  origin: SettingOrigin;
  note?: string;
}

// One analysed breath (one row of breaths.csv): the type is derived from the metric registry, which also gives the
// column order and the metrics that summary.json summarises.
export { BREATH_COLUMNS, SUMMARY_METRICS, type BreathRow } from './metrics/registry';

export interface MetricSummary {
  median: number | null;
  p25: number | null;
  p75: number | null;
  n: number;
}
