import { EVENT_KIND_OF, type EventParam, type SimEvent, type SimParams } from './params';

/** A truth record of one event (recording time, kind, readable description). */
export interface TruthEvent {
  t_s: number;
  kind: string;
  param: EventParam;
  from: number;
  to: number;
  ramp_s: number;
  description: string;
}

/** Events sorted by onset time (stable for equal times). */
export function sortedEvents(events: readonly SimEvent[]): SimEvent[] {
  return events.map((e, i) => ({ e, i })).sort((a, b) => a.e.t_s - b.e.t_s || a.i - b.i).map((x) => x.e);
}

/**
 * Value of an event-driven parameter at recording time t_s: the base value changed by every event of that parameter
 * that has started; a ramp moves linearly from the value at its onset to `to` over ramp_s seconds (a step when 0).
 */
export function paramAt(params: SimParams, sorted: readonly SimEvent[], name: EventParam, tS: number): number {
  let value = params[name];
  for (const e of sorted) {
    if (e.t_s > tS) break;
    if (e.param !== name) continue;
    const frac = e.ramp_s > 0 ? Math.min(1, (tS - e.t_s) / e.ramp_s) : 1;
    value = value + (e.to - value) * frac;
  }
  return value;
}

/** Truth records of the events (the value before each event is computed from the earlier ones). */
export function truthEvents(params: SimParams): TruthEvent[] {
  const sorted = sortedEvents(params.events);
  return sorted.map((e) => {
    const before = paramAt(params, sorted.filter((x) => x !== e), e.param, e.t_s);
    const kind = EVENT_KIND_OF[e.param];
    const what = e.ramp_s > 0 ? `ramp over ${e.ramp_s} s` : 'step';
    return {
      t_s: e.t_s,
      kind,
      param: e.param,
      from: before,
      to: e.to,
      ramp_s: e.ramp_s,
      description: e.description ?? `${e.param} ${before} -> ${e.to} (${what})`,
    };
  });
}
