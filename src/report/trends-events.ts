// Trends per time bin and change events for one recording (browser-safe; used by analyse, batch and the viewer).
import { computeTrends, detectEvents, EVENT_COLUMNS, TREND_COLUMNS, type EventRow, type TrendRow } from '../trends/index';
import type { SummaryBreaths } from '../analyse/quality';
import type { TrendSettings } from '../settings';
import type { Paco2Estimate } from '../gas/gas-types';
import type { BreathRow } from '../types';
import { csvTable } from './format';

export interface TrendsAndEvents {
  trends: TrendRow[];
  events: EventRow[];
}

export function trendsAndEvents(
  breaths: readonly BreathRow[],
  opts: TrendSettings & { summary_breaths?: SummaryBreaths },
  bloodGases: readonly { time_s: number; paco2_mmhg: number }[] = [],
  apparatusMl = 0,
  estimates: readonly Paco2Estimate[] = [],
): TrendsAndEvents {
  const trends = computeTrends(breaths, opts, apparatusMl, estimates);
  const events = detectEvents(trends, opts, { blood_gases: bloodGases });
  return { trends, events };
}

export function trendsCsv(trends: readonly TrendRow[]): string {
  return csvTable(TREND_COLUMNS as readonly string[], trends as unknown as Record<string, unknown>[]);
}

export function eventsCsv(events: readonly EventRow[]): string {
  return csvTable(EVENT_COLUMNS as readonly string[], events as unknown as Record<string, unknown>[]);
}
