import type { TrendSettings } from '../settings';
import type { TrendRow } from './trend-row';

/** An arterial blood gas: time (recording time, s) and PaCO2 (mmHg). */
export interface BloodGasPoint {
  time_s: number;
  paco2_mmhg: number;
}

/** The two blood gases around an event and what they show. */
export interface GasComparison {
  before: BloodGasPoint;
  after: BloodGasPoint;
  petco2_before_mmhg: number;
  petco2_after_mmhg: number;
  /** PaCO2 change / PETCO2 change between the two gas times */
  arterial_share: number;
}

/**
 * Share of the end-tidal change that arterial PCO2 follows, from one blood gas before and one after an event:
 *
 *   share = (PaCO2_after - PaCO2_before) / (PETCO2_after - PETCO2_before)      (PETCO2 from the trend bins of the gas times)
 *
 * Why it separates a fall in pulmonary blood flow from a rise in alveolar dead space (src/trends/RULES.md): the
 * alveolar ventilation equation PaCO2 = 0.863 V'CO2 / V'A (derived here, docs/methods.md; PaCO2 standing in for ideal
 * alveolar PCO2, the basis of Enghoff's dead space) says that while the effective alveolar ventilation is unchanged, PaCO2
 * moves with V'CO2, i.e. with PETCO2 (share ~ 1): less CO2 brought to the lungs. A rise in alveolar dead space lowers
 * the effective alveolar ventilation instead: the unperfused units return inspired gas and dilute the end-tidal gas,
 * while the perfused units (and the arterial blood) keep or raise their PCO2, so the arterial-end-tidal gradient widens
 * (common practice, no source: alveolar dead space widens the gradient) and the share is <= 0. Expired-gas measures alone (Bohr VD/VT
 * with alveolar PCO2 from phase III) do not see units that empty in parallel (derived here: src/simulate/MODEL.md).
 *
 * Gas choice: the latest gas before the change point (no older than gas_before_max_s, not before `notBefore_s`) and the
 * earliest gas from gas_settle_s to gas_after_max_s after it (before `notAfter_s`). Null when either is missing, a
 * PETCO2 is missing, or the PETCO2 difference is below gas_min_petco2_change_mmhg (the ratio would be noise).
 */
export function compareGases(
  gases: readonly BloodGasPoint[],
  trends: readonly TrendRow[],
  tEvent_s: number,
  o: TrendSettings,
  notBefore_s = -Infinity,
  notAfter_s = Infinity,
): GasComparison | null {
  const valid = gases.filter((g) => Number.isFinite(g.time_s) && Number.isFinite(g.paco2_mmhg));
  let before: BloodGasPoint | null = null;
  let after: BloodGasPoint | null = null;
  for (const g of valid) {
    if (g.time_s < tEvent_s && g.time_s >= tEvent_s - o.gas_before_max_s && g.time_s >= notBefore_s) {
      if (!before || g.time_s > before.time_s) before = g;
    }
    if (g.time_s >= tEvent_s + o.gas_settle_s && g.time_s <= tEvent_s + o.gas_after_max_s && g.time_s < notAfter_s) {
      if (!after || g.time_s < after.time_s) after = g;
    }
  }
  if (!before || !after) return null;
  const pBefore = petco2At(trends, before.time_s, o.bin_s);
  const pAfter = petco2At(trends, after.time_s, o.bin_s);
  const dPet = pAfter - pBefore;
  if (!(Math.abs(dPet) >= o.gas_min_petco2_change_mmhg)) return null;
  return {
    before,
    after,
    petco2_before_mmhg: pBefore,
    petco2_after_mmhg: pAfter,
    arterial_share: (after.paco2_mmhg - before.paco2_mmhg) / dPet,
  };
}

/** PETCO2 of the trend bin holding time t (or the nearest bin with a value, at most 2 bins away); NaN if none. */
export function petco2At(trends: readonly TrendRow[], t: number, binS: number): number {
  if (trends.length === 0) return NaN;
  const i0 = Math.floor((t - trends[0]!.t_s) / binS);
  for (const d of [0, -1, 1, -2, 2]) {
    const r = trends[i0 + d];
    if (r && Number.isFinite(r.petco2_mmhg)) return r.petco2_mmhg;
  }
  return NaN;
}
