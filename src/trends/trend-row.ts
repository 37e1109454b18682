// One row of trends.csv: the breaths of one time bin summarised. NaN = not computable (empty cell).

/**
 * Per-bin trend values. Breaths belong to the bin that contains their start (t_start_s). Unless said otherwise a
 * value uses the bin's ok breaths only (status 'ok'); with fewer than `min_ok_breaths` ok breaths it is NaN.
 *
 * Rates are computed over the time the ok breaths cover, not over the bin length:
 *   V'CO2 = sum(VTCO2) / (sum(breath duration) / 60)   mL/min STPD   (sum of net VTCO2 over a window /
 *           window length in minutes; the window is the ok breaths' own time, so excluded breaths neither add CO2 nor
 *           time: this equals scaling by the ok share of the bin's time, and a bin that holds 13 or 15 breath starts
 *           is not biased by the bin edge)
 *   V'E   = sum(VTe) / 1000 / (sum(duration) / 60)     L/min (volume conditions as the flow sensor reports them)
 *   V'A   = sum(VTe - VDaw - apparatus) / 1000 / (sum(duration) / 60)   L/min: alveolar ventilation as "ventilation
 *           reaching alveoli", RR x (VT - VDaw), with VDaw the patient's airway plus the apparatus volume (neither
 *           reaches alveoli); not the gas-exchange-effective form RR x (VT - VDphys)
 *   RR    = 60 x n / sum(duration)                     breaths/min
 */
export interface TrendRow {
  /** bin start, s (recording time) */
  t_s: number;
  vco2_ml_min: number;
  ve_l_min: number;
  va_l_min: number;
  rr_bpm: number;
  /** median expired tidal volume, mL */
  vte_ml: number;
  /** median PETCO2, mmHg */
  petco2_mmhg: number;
  /** median airway dead space, mL */
  vd_aw_ml: number;
  /** median Bohr VD/VT */
  vdvt_bohr: number;
  /** median phase III slope, mmHg/L */
  slope3_mmhg_per_l: number;
  /** median mean inspired PCO2 over ALL breaths of the bin (rebreathing excludes breaths, so ok breaths would hide it) */
  fico2_mmhg: number;
  /** median CO2 delay used for the bin's breaths, ALL breaths, s */
  delay_s: number;
  /** ok breaths / breaths (NaN when the bin has no breath) */
  ok_share: number;
  /** breaths starting in the bin (all statuses) */
  breaths: number;
}

/** Column order of trends.csv. */
export const TREND_COLUMNS: readonly (keyof TrendRow)[] = [
  't_s', 'vco2_ml_min', 've_l_min', 'va_l_min', 'rr_bpm', 'vte_ml', 'petco2_mmhg', 'vd_aw_ml', 'vdvt_bohr',
  'slope3_mmhg_per_l', 'fico2_mmhg', 'delay_s', 'ok_share', 'breaths',
] as const;
