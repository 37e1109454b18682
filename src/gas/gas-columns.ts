import { GAS_METRICS, PACO2_ESTIMATE_METRICS } from '../metrics/registry';
import type { GasRow, Paco2Estimate } from './gas-types';

/** Column order of gas.csv (one row per blood-gas sample), from the metric registry. NaN -> empty cell; booleans as
 *  true/false. */
export const GAS_COLUMNS: readonly (keyof GasRow)[] = GAS_METRICS.map((m) => m.key);

/** Column order for the per-breath PaCO2 estimates (paco2_estimates.csv), from the metric registry. */
export const PACO2_ESTIMATE_COLUMNS: readonly (keyof Paco2Estimate)[] = PACO2_ESTIMATE_METRICS.map((m) => m.key);
