import { BREATH_COLUMNS, type BreathRow } from '../types.js';
import { csvTable } from './format.js';

/** breaths.csv: one row per breath, columns in BREATH_COLUMNS order, NaN as empty cells. */
export function breathsCsv(rows: readonly BreathRow[], extra: { column: string; value: string } | null = null): string {
  const cols = extra ? [extra.column, ...BREATH_COLUMNS] : [...BREATH_COLUMNS];
  const recs = rows.map((r) => (extra ? { [extra.column]: extra.value, ...r } : r) as unknown as Record<string, unknown>);
  return csvTable(cols, recs);
}
