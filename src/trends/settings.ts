// Settings of trend extraction and event detection (the lead merges them into the main settings as the `events`
// group). Every threshold is here with its default and the reason for it; src/trends/RULES.md explains the rules.

import { z } from 'zod';

/** What to call a fall (or rise) of V'CO2 and PETCO2 with steady ventilation when no blood gas brackets it. */
export type FallWithoutGas = 'unclassified' | 'perfusion';

export interface TrendSettings {
  /** trend bin length, s (one row of trends.csv per bin) */
  bin_s: number;
  /** a bin with fewer ok breaths than this has no trend values (NaN), only ok_share and breaths */
  min_ok_breaths: number;

  // --- change-point detection: tabular CUSUM (Page 1954) per signal, see src/trends/cusum.ts ---
  /** bins whose median is the in-control baseline (and whose robust SD standardises the signal) */
  reference_bins: number;
  /** CUSUM reference value k as a fraction of the smallest relevant change (Page: k = half the shift to detect) */
  cusum_k_fraction: number;
  /** standard deviation floor as a fraction of the smallest relevant change (bins are medians of many breaths, so a
   *  stable recording can have a near-zero spread; the floor keeps tiny wobbles from counting as many SDs) */
  sd_floor_fraction: number;
  /** false-alarm budget: target mean time between false CUSUM alarms over all signals together, hours (sets h) */
  false_alarm_hours: number;
  /** bins right after the change point left out of the "after" window (ramp, lung gas mixing) */
  settle_bins: number;
  /** a change must hold for this long after the settle bins (median of that window), s: sustained changes only */
  min_sustained_s: number;
  /** a change must also exceed this many standard errors of the before/after median difference (noisy signals) */
  confirm_z: number;
  /** bins before the change point whose median is the "before" value */
  before_bins: number;
  /** alarms of different signals whose change points lie within this time form one event, s */
  merge_s: number;

  // --- smallest relevant change per signal (detection and classification) ---
  vco2_min_change_pct: number;
  petco2_min_change_pct: number;
  ve_min_change_pct: number;
  /** Bohr VD/VT, absolute */
  vdvt_min_change: number;
  /** inspired PCO2, mmHg */
  fico2_min_change_mmhg: number;
  /** share of ok breaths, absolute */
  ok_share_min_change: number;
  /** CO2 delay used for alignment, s */
  delay_min_change_s: number;

  // --- classification ---
  /** minute ventilation counts as steady when it moved less than this, % */
  ve_steady_pct: number;
  /** PETCO2 counts as not having moved when it moved less than this, % */
  petco2_steady_pct: number;
  /** blood gas rule: share of the end-tidal change mirrored by PaCO2 at or above which a V'CO2/PETCO2 change is
   *  `perfusion`, below which it is `dead_space` */
  arterial_share_split: number;
  /** the PETCO2 difference between the two blood-gas times must be at least this for the rule to apply, mmHg */
  gas_min_petco2_change_mmhg: number;
  /** the "after" blood gas must be drawn at least this long after the change point, s */
  gas_settle_s: number;
  /** ... and at most this long after it, s */
  gas_after_max_s: number;
  /** ... and the "before" gas at most this long before it, s */
  gas_before_max_s: number;
  /** kind given to a V'CO2 + PETCO2 change with steady ventilation when no blood gas brackets it */
  fall_without_gas: FallWithoutGas;
}

export const DEFAULT_TRENDS: Readonly<TrendSettings> = {
  bin_s: 60,
  min_ok_breaths: 3,
  reference_bins: 5,
  cusum_k_fraction: 0.5,
  sd_floor_fraction: 0.2,
  false_alarm_hours: 24,
  settle_bins: 1,
  min_sustained_s: 180,
  confirm_z: 3,
  before_bins: 3,
  merge_s: 180,
  vco2_min_change_pct: 10,
  petco2_min_change_pct: 8,
  ve_min_change_pct: 10,
  vdvt_min_change: 0.05,
  fico2_min_change_mmhg: 2,
  ok_share_min_change: 0.25,
  delay_min_change_s: 0.3,
  ve_steady_pct: 5,
  petco2_steady_pct: 3,
  arterial_share_split: 0.5,
  gas_min_petco2_change_mmhg: 2,
  gas_settle_s: 60,
  gas_after_max_s: 1800,
  gas_before_max_s: 3600,
  fall_without_gas: 'unclassified',
};

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
