// Per-kg values of each breath from the patient's weight (chooseWeight: predicted body weight for adults with height
// and sex, else the actual weight): expired tidal volume, airway and Enghoff dead space per kg, V'CO2 per kg per
// minute. One function (perKilogram) for every per-kg value, as in the gas table.
import { perKilogram } from '../physiology/per-kilogram';
import type { BreathRow } from '../types';

/** Sets the per-kg columns of the rows in place (NaN when the weight is not positive). */
export function applyWeight(rows: BreathRow[], weightKg: number): void {
  for (const r of rows) {
    r.vt_exp_ml_per_kg = perKilogram(r.vt_exp_ml, weightKg);
    r.vd_aw_ml_per_kg = perKilogram(r.vd_aw_ml, weightKg);
    r.vd_enghoff_ml_per_kg = perKilogram(r.vd_enghoff_ml, weightKg);
    r.vco2_ml_kg_min = perKilogram(r.vco2_ml_min, weightKg);
  }
}
