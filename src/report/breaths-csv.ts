import { qualityOfStatus } from '../analyse/quality';
import { BREATH_COLUMNS, type BreathRow } from '../types';
import { csvTable } from './format';

/** breaths.csv columns: BREATH_COLUMNS with `quality` after `status`: ok, caution (kept in the summaries, flagged) or
 *  excluded, the class of the status value (qualityOfStatus). */
export const BREATHS_CSV_COLUMNS: readonly string[] = BREATH_COLUMNS.flatMap((c) => (c === 'status' ? [c, 'quality'] : [c]));

/** breaths.csv: one row per breath, columns in BREATHS_CSV_COLUMNS order, NaN as empty cells. */
export function breathsCsv(rows: readonly BreathRow[], extra: { column: string; value: string } | null = null): string {
  const cols = extra ? [extra.column, ...BREATHS_CSV_COLUMNS] : [...BREATHS_CSV_COLUMNS];
  const recs = rows.map(
    (r) => ({ ...(extra ? { [extra.column]: extra.value } : {}), ...r, quality: qualityOfStatus(r.status) }) as unknown as Record<string, unknown>,
  );
  return csvTable(cols, recs);
}
