import type { EventRow } from './detect-events';
import { SIGNAL_LABEL, SIGNAL_UNIT } from './signals';

/** The caution printed with every event list. */
export const EVENT_CAUTION = 'Events are patterns in the data, not diagnoses.';

/** Recording time as H:MM:SS. */
export function clockText(t: number): string {
  if (!Number.isFinite(t)) return '--:--:--';
  const s = Math.max(0, Math.round(t));
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  return `${h}:${String(m).padStart(2, '0')}:${String(s % 60).padStart(2, '0')}`;
}

function valueText(v: number): string {
  if (!Number.isFinite(v)) return 'n/a';
  const a = Math.abs(v);
  return a >= 100 ? v.toFixed(0) : a >= 10 ? v.toFixed(1) : v.toFixed(2);
}

/**
 * One terminal line per event, e.g.
 * `0:12:00  perfusion     V'CO2 200 -> 157 mL/min (-21 %)  confidence 0.93  (pattern, not a diagnosis): ...note`
 */
export function formatEventLine(e: EventRow): string {
  const unit = SIGNAL_UNIT[e.signal] ? ` ${SIGNAL_UNIT[e.signal]}` : '';
  const pct = Number.isFinite(e.change_pct) ? ` (${e.change_pct > 0 ? '+' : ''}${e.change_pct.toFixed(0)} %)` : '';
  const head = `${clockText(e.t_s)}  ${e.kind.padEnd(12)}  ${SIGNAL_LABEL[e.signal]} ${valueText(e.before)} -> ${valueText(e.after)}${unit}${pct}`;
  return `${head}  confidence ${e.confidence.toFixed(2)}  (pattern, not a diagnosis)${e.note ? `: ${e.note}` : ''}`;
}
