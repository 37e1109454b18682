import type { TrendSettings } from '../settings';
import type { TrendRow } from './trend-row';

/** Trend columns watched for changes. */
export type TrendSignal = 'vco2_ml_min' | 'petco2_mmhg' | 've_l_min' | 'vdvt_bohr' | 'fico2_mmhg' | 'ok_share' | 'delay_s';

export const TREND_SIGNALS: readonly TrendSignal[] = [
  'vco2_ml_min', 'petco2_mmhg', 've_l_min', 'vdvt_bohr', 'fico2_mmhg', 'ok_share', 'delay_s',
] as const;

/** Short readable names for the terminal. */
export const SIGNAL_LABEL: Readonly<Record<TrendSignal, string>> = {
  vco2_ml_min: "V'CO2",
  petco2_mmhg: 'PETCO2',
  ve_l_min: "V'E",
  vdvt_bohr: 'VD/VT Bohr',
  fico2_mmhg: 'inspired PCO2',
  ok_share: 'ok-breath share',
  delay_s: 'CO2 delay',
};

export const SIGNAL_UNIT: Readonly<Record<TrendSignal, string>> = {
  vco2_ml_min: 'mL/min',
  petco2_mmhg: 'mmHg',
  ve_l_min: 'L/min',
  vdvt_bohr: '',
  fico2_mmhg: 'mmHg',
  ok_share: '',
  delay_s: 's',
};

/**
 * Smallest relevant change of a signal in its own units, at the level `reference`: relative signals (V'CO2, PETCO2,
 * V'E) use a percentage of |reference|, the others an absolute amount. NaN when it cannot be formed.
 */
export function minChange(signal: TrendSignal, reference: number, o: TrendSettings): number {
  switch (signal) {
    case 'vco2_ml_min':
      return (o.vco2_min_change_pct / 100) * Math.abs(reference);
    case 'petco2_mmhg':
      return (o.petco2_min_change_pct / 100) * Math.abs(reference);
    case 've_l_min':
      return (o.ve_min_change_pct / 100) * Math.abs(reference);
    case 'vdvt_bohr':
      return o.vdvt_min_change;
    case 'fico2_mmhg':
      return o.fico2_min_change_mmhg;
    case 'ok_share':
      return o.ok_share_min_change;
    case 'delay_s':
      return o.delay_min_change_s;
  }
}

export function signalValues(rows: readonly TrendRow[], signal: TrendSignal): Float64Array {
  const x = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) x[i] = rows[i]![signal];
  return x;
}
