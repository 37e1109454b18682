// One row of trends.csv: the breaths of one time bin summarised. NaN = not computable (empty cell).
// The row type and the column order come from the metric registry (src/metrics/registry.ts, TREND_METRICS), which
// also holds each column's meaning; the formulas are in compute-trends.ts.
import { TREND_METRICS, type TrendRow } from '../metrics/registry';

export type { TrendRow };

/** Column order of trends.csv, from the metric registry. */
export const TREND_COLUMNS: readonly (keyof TrendRow)[] = TREND_METRICS.map((m) => m.key);
