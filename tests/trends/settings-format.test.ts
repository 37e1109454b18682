// Settings schema and the terminal line.
import { describe, expect, it } from 'vitest';
import type { EventRow } from '../../src/trends/detect-events';
import { EVENT_COLUMNS } from '../../src/trends/detect-events';
import { clockText, formatEventLine } from '../../src/trends/format-event';
import { DEFAULT_TRENDS } from '../../src/settings';
import { trendSettings, trendSettingsSchema } from '../../src/trends/settings';

describe('trend settings', () => {
  it('partial and strict: known keys pass, unknown keys and wrong types are refused', () => {
    expect(trendSettingsSchema.safeParse({ bin_s: 30 }).success).toBe(true);
    expect(trendSettingsSchema.safeParse({}).success).toBe(true);
    const unknown = trendSettingsSchema.safeParse({ bin_seconds: 30 });
    expect(unknown.success).toBe(false);
    expect(trendSettingsSchema.safeParse({ bin_s: '60' }).success).toBe(false);
    expect(trendSettingsSchema.safeParse({ fall_without_gas: 'dead_space' }).success).toBe(false);
    expect(trendSettingsSchema.safeParse({ false_alarm_hours: 0 }).success).toBe(false);
  });
  it('the schema covers every default key', () => {
    expect(trendSettingsSchema.safeParse({ ...DEFAULT_TRENDS }).success).toBe(true);
    expect(Object.keys(trendSettingsSchema.shape).sort()).toEqual(Object.keys(DEFAULT_TRENDS).sort());
  });
  it('trendSettings merges overrides over the defaults', () => {
    const s = trendSettings({ bin_s: 30 });
    expect(s.bin_s).toBe(30);
    expect(s.false_alarm_hours).toBe(DEFAULT_TRENDS.false_alarm_hours);
  });
});

describe('formatEventLine', () => {
  const e: EventRow = {
    t_s: 720, kind: 'perfusion', signal: 'vco2_ml_min', before: 200.6, after: 157.2, change_pct: -21.6, confidence: 0.93,
    t_alarm_s: 780, note: 'example',
  };
  it('shows time, kind, signal, values, change, confidence and the caution', () => {
    const line = formatEventLine(e);
    expect(line).toContain('0:12:00');
    expect(line).toContain('perfusion');
    expect(line).toContain("V'CO2 201 -> 157 mL/min (-22 %)");
    expect(line).toContain('confidence 0.93');
    expect(line).toContain('not a diagnosis');
  });
  it('clock text and missing change', () => {
    expect(clockText(3725)).toBe('1:02:05');
    expect(formatEventLine({ ...e, signal: 'fico2_mmhg', before: 0, after: 4, change_pct: NaN })).not.toContain('%)');
  });
  it('events.csv columns are those of the issue', () => {
    expect(EVENT_COLUMNS).toEqual(['t_s', 'kind', 'signal', 'before', 'after', 'change_pct', 'confidence']);
  });
});
