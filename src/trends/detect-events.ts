import { compareGases, type BloodGasPoint } from './blood-gas';
import { classifyPattern, signalDelta, type ChangePattern, type EventKind } from './classify';
import { chartArlBins, detectSignalChanges, medianBack, medianWindow, sustainedBins, type SignalChange } from './detect-changes';
import type { TrendSettings } from '../settings';
import { signalValues, TREND_SIGNALS, type TrendSignal } from './signals';
import type { TrendRow } from './trend-row';

/** One detected event (one row of events.csv; `t_alarm_s` and `note` are extra fields for the terminal and viewer). */
export interface EventRow {
  /** estimated onset: start of the first changed trend bin, s */
  t_s: number;
  kind: EventKind;
  /** the signal that carries the kind (or that raised the alarm, for unclassified events) */
  signal: TrendSignal;
  /** median of the signal over the bins before the onset, in the signal's unit */
  before: number;
  /** median over the sustained window after the onset */
  after: number;
  /** 100 (after - before) / |before|; NaN when before is 0 and for inspired PCO2 and the CO2 delay (baseline ~0) */
  change_pct: number;
  /** 0..1, how clearly the data match the rule (RULES.md) */
  confidence: number;
  /** end of the trend bin in which the first CUSUM alarm of the event was raised, s */
  t_alarm_s: number;
  /** the pattern in words */
  note: string;
}

/** Column order of events.csv (as in the issue). */
export const EVENT_COLUMNS: readonly (keyof EventRow)[] = ['t_s', 'kind', 'signal', 'before', 'after', 'change_pct', 'confidence'] as const;

/** Signals whose change is given in %; inspired PCO2 and the CO2 delay are normally near 0, so a % of them means
 *  nothing and change_pct is left empty (NaN) for them. */
const PERCENT_SIGNALS: ReadonlySet<TrendSignal> = new Set(['vco2_ml_min', 'petco2_mmhg', 've_l_min', 'vdvt_bohr', 'ok_share']);

/** Optional data that sharpen the classification. */
export interface EventContext {
  /** arterial blood gases (recording time, PaCO2): separate a perfusion fall from a dead-space rise (RULES.md R5) */
  blood_gases?: readonly BloodGasPoint[];
}

/**
 * Sustained changes in the trend table, classified by pattern.
 * 1. Each watched signal (signals.ts TREND_SIGNALS: V'CO2, PETCO2, V'E, Bohr VD/VT, inspired PCO2, ok share, CO2
 *    delay) runs its own CUSUM (detect-changes.ts). The false-alarm budget `false_alarm_hours` is shared: each chart
 *    gets an in-control ARL of budget x number of signals, so all charts together alarm falsely about once per budget.
 * 2. Confirmed changes whose change points lie within `merge_s` of the first one form one event; its onset is the
 *    earliest change point.
 * 3. For every signal, before = median of the `before_bins` bins before the onset, after = median of the sustained
 *    window after `settle_bins`; the pattern of these changes (and blood gases, if given) is classified
 *    (classify.ts, RULES.md).
 * `trends` must be consecutive bins of `opts.bin_s` (as computeTrends returns them).
 */
export function detectEvents(trends: readonly TrendRow[], opts: TrendSettings, context: EventContext = {}): EventRow[] {
  if (trends.length === 0) return [];
  const values = new Map<TrendSignal, Float64Array>();
  for (const s of TREND_SIGNALS) values.set(s, signalValues(trends, s));
  const arl = chartArlBins(opts, TREND_SIGNALS.length);
  const changes: SignalChange[] = [];
  for (const s of TREND_SIGNALS) changes.push(...detectSignalChanges(values.get(s)!, s, opts, arl));
  changes.sort((a, b) => a.change_index - b.change_index || a.alarm_index - b.alarm_index);

  const clusters: SignalChange[][] = [];
  for (const c of changes) {
    const last = clusters[clusters.length - 1];
    if (last && (c.change_index - last[0]!.change_index) * opts.bin_s <= opts.merge_s) last.push(c);
    else clusters.push([c]);
  }

  const after = sustainedBins(opts);
  const onsets = clusters.map((cl) => trends[cl[0]!.change_index]!.t_s);
  return clusters.map((cl, ci) => {
    const onset = cl[0]!.change_index;
    const pattern = {} as ChangePattern;
    for (const s of TREND_SIGNALS) {
      const x = values.get(s)!;
      const before = medianBack(x, onset - opts.before_bins, onset, opts.before_bins);
      const afterMed = medianWindow(x, onset + opts.settle_bins, onset + opts.settle_bins + after, Math.ceil(after / 2));
      pattern[s] = signalDelta(before, afterMed);
    }
    const gas = context.blood_gases?.length
      ? compareGases(context.blood_gases, trends, onsets[ci]!, opts, ci > 0 ? onsets[ci - 1]! : -Infinity, onsets[ci + 1] ?? Infinity)
      : null;
    const cls = classifyPattern(pattern, gas, opts);
    const trigger = strongest(cl);
    const signal = cls.signal ?? trigger.signal;
    const d = pattern[signal];
    const pct = PERCENT_SIGNALS.has(signal) ? d.pct : NaN;
    const firstAlarm = Math.min(...cl.map((c) => c.alarm_index));
    return {
      t_s: trends[onset]!.t_s,
      kind: cls.kind,
      signal,
      before: d.before,
      after: d.after,
      change_pct: pct,
      confidence: cls.confidence,
      t_alarm_s: trends[firstAlarm]!.t_s + opts.bin_s,
      note: `${cls.note} [alarm: ${[...new Set(cl.map((c) => c.signal))].join(', ')}]`,
    };
  });
}

/** The change in the cluster that is largest relative to its own median level (the alarm's "leading" signal). */
function strongest(cl: SignalChange[]): SignalChange {
  let best = cl[0]!;
  let bestScore = -Infinity;
  for (const c of cl) {
    const score = Math.abs(c.after - c.before) / Math.max(Math.abs(c.before), 1e-9);
    if (score > bestScore) {
      bestScore = score;
      best = c;
    }
  }
  return best;
}
