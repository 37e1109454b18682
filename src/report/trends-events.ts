// Trends per time bin and change events for one recording (browser-safe; used by analyse, batch and the viewer).
import { computeTrends, detectEvents, EVENT_COLUMNS, TREND_COLUMNS, type EventRow, type TrendRow } from '../trends/index.js';
import type { TrendSettings } from '../settings.js';
import type { BreathRow } from '../types.js';
import { csvTable } from './format.js';

export interface TrendsAndEvents {
  trends: TrendRow[];
  events: EventRow[];
}

export function trendsAndEvents(
  breaths: readonly BreathRow[],
  opts: TrendSettings,
  bloodGases: readonly { time_s: number; paco2_mmhg: number }[] = [],
): TrendsAndEvents {
  const trends = computeTrends(breaths, opts);
  const events = detectEvents(trends, opts, { blood_gases: bloodGases });
  return { trends, events };
}

export function trendsCsv(trends: readonly TrendRow[]): string {
  return csvTable(TREND_COLUMNS as readonly string[], trends as unknown as Record<string, unknown>[]);
}

export function eventsCsv(events: readonly EventRow[]): string {
  return csvTable(EVENT_COLUMNS as readonly string[], events as unknown as Record<string, unknown>[]);
}
