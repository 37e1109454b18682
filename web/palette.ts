// The viewer's own colours (defined in the core, src/report/html/palette.ts, so the HTML report uses the same ones).
import { qualityOfStatus } from '../src/analyse/quality';

export { COLOURS, TREND_COLOURS } from '../src/report/html/palette';
import { COLOURS } from '../src/report/html/palette';

/** Class of a breath's status for colours and CSS: ok, caution (kept in the summaries), flagged (excluded by the
 *  analysis) or excluded by the reviewer. */
export function statusClass(status: string): 'ok' | 'caution' | 'flagged' | 'excluded' {
  if (status.includes('excluded_by_user')) return 'excluded';
  const q = qualityOfStatus(status);
  return q === 'excluded' ? 'flagged' : q;
}

/** Colour of a breath's status (statusClass). */
export function statusColour(status: string): string {
  return COLOURS[statusClass(status)];
}
