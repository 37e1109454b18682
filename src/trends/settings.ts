// Validation of the `events` settings group (trend extraction and event detection). The settings themselves, each with
// its default and the reason for it, are TrendSettings and DEFAULT_TRENDS in src/settings.ts; src/trends/RULES.md
// explains the rules.

import { z } from 'zod';
import { DEFAULT_TRENDS, type TrendSettings } from '../settings';

const num = z.number().finite();
const pos = num.positive();
const nonneg = num.min(0);
const count = z.number().int();

/** Partial, strict schema of the `events` settings group (unknown keys and wrong types are refused). */
export const trendSettingsSchema = z
  .object({
    bin_s: num.min(5).max(3600),
    min_ok_breaths: count.min(1),
    reference_bins: count.min(2),
    cusum_k_fraction: num.min(0).max(2),
    sd_floor_fraction: num.min(0).max(2),
    false_alarm_hours: pos,
    settle_bins: count.min(0),
    min_sustained_s: pos,
    confirm_z: nonneg,
    before_bins: count.min(1),
    merge_s: nonneg,
    vco2_min_change_pct: pos,
    petco2_min_change_pct: pos,
    ve_min_change_pct: pos,
    vdvt_min_change: pos,
    fico2_min_change_mmhg: pos,
    ok_share_min_change: num.gt(0).max(1),
    delay_min_change_s: pos,
    ve_steady_pct: pos,
    petco2_steady_pct: pos,
    arterial_share_split: num,
    gas_min_petco2_change_mmhg: pos,
    gas_settle_s: nonneg,
    gas_after_max_s: pos,
    gas_before_max_s: pos,
    fall_without_gas: z.enum(['unclassified', 'perfusion']),
  })
  .strict()
  .partial();

/** Defaults merged with the given values (validated; throws zod's error for bad values). */
export function trendSettings(overrides: Partial<TrendSettings> = {}): TrendSettings {
  const parsed = trendSettingsSchema.parse(overrides);
  return { ...DEFAULT_TRENDS, ...(parsed as Partial<TrendSettings>) };
}
