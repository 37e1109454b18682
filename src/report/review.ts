// The reviewer's decisions on top of the analysis (viewer): breaths excluded by hand, with a reason.
//
// Choice (the CLI has no such notion): an excluded breath keeps every computed value; its status becomes
// `excluded_by_user:<reason>` (or `<automatic status>+excluded_by_user:<reason>` when the analysis had already
// flagged it; a caution breath drops its `caution:` prefix, as it is now excluded), and the code `excluded_by_user`
// is added to its flags, so that the summary counts it under breaths.excluded_by_reason.excluded_by_user and
// usableForSummary leaves it out of every median.
// The summary also gets one note naming the excluded breaths (outputs.ts). With no exclusion nothing changes, so
// the exports are byte-identical to the CLI's.

import type { BreathRow } from '../types';

/** Flag code added to a breath excluded by the reviewer. */
export const USER_EXCLUDED = 'excluded_by_user';

/** Reasons offered in the viewer (slugs: they end up inside the status cell of breaths.csv). */
export const EXCLUSION_REASONS: Record<string, string> = {
  artefact: 'artefact in flow or CO2',
  cough: 'cough or patient effort',
  suction: 'suction or circuit handling',
  disconnection: 'disconnection or leak seen on the curve',
  manual: 'manual or sigh breath',
  other: 'other (see notes)',
};

/** Turns free text into a reason slug: lower case, letters, digits, '_' and '-' only, at most 40 characters. */
export function reasonSlug(text: string): string {
  const s = text
    .trim()
    .toLowerCase()
    .replace(/[^a-z0-9_-]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .slice(0, 40);
  return s || 'other';
}

/** Status of a breath the reviewer excluded. */
export function excludedStatus(row: BreathRow, reason: string): string {
  const tag = `${USER_EXCLUDED}:${reasonSlug(reason)}`;
  if (row.status === 'ok') return tag;
  return `${row.status.replace(/^caution:/, '')}+${tag}`;
}

/** Rows as exported: the analyser's rows, with copies for the excluded ones. */
export function reviewedRows(rows: readonly BreathRow[], excluded: ReadonlyMap<number, string>): BreathRow[] {
  if (excluded.size === 0) return rows as BreathRow[];
  return rows.map((r, i) => {
    const reason = excluded.get(i);
    if (reason === undefined) return r;
    return { ...r, status: excludedStatus(r, reason), flags: [...r.flags, USER_EXCLUDED] };
  });
}

/** One note naming the excluded breaths (first 50), or null when none. */
export function exclusionNote(rows: readonly BreathRow[], excluded: ReadonlyMap<number, string>): string | null {
  if (excluded.size === 0) return null;
  const items = [...excluded.entries()].sort((a, b) => a[0] - b[0]);
  const shown = items.slice(0, 50).map(([i, reason]) => `${rows[i]?.breath ?? i + 1} (${reasonSlug(reason)})`);
  const more = items.length > 50 ? `, and ${items.length - 50} more` : '';
  const plural = items.length === 1 ? '' : 's';
  return `${items.length} breath${plural} excluded by hand in the viewer: breath${plural} ${shown.join(', ')}${more}`;
}
