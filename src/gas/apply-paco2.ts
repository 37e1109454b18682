// Per-breath Enghoff dead space from blood gases: each breath uses the arterial PCO2 of the most recent sample drawn
// at or before the breath's start (none before the first sample). Same formula as the analysis with --paco2:
// Enghoff VD/VT = (PaCO2 - PECO2) / (PaCO2 - PICO2) with the inspired term when bohr_inspired_term is on
// (primer 6.1; from memory: Enghoff H 1938, as restated in Anderson & Breen 2000 Crit Care).
import type { BreathRow } from '../types.js';
import type { GasSample } from './gas-types.js';

export function applyArterialPco2(rows: BreathRow[], samples: readonly GasSample[], inspiredTerm: boolean): void {
  const sorted = [...samples].sort((a, b) => a.time_s - b.time_s);
  let k = -1;
  for (const r of rows) {
    while (k + 1 < sorted.length && sorted[k + 1]!.time_s <= r.t_start_s) k++;
    if (k < 0) continue;
    const paco2 = sorted[k]!.paco2_mmhg;
    const inspired = inspiredTerm && Number.isFinite(r.fico2_mmhg) ? r.fico2_mmhg : 0;
    r.vdvt_enghoff = (paco2 - r.peco2_mmhg) / (paco2 - inspired);
    r.vd_enghoff_ml = r.vdvt_enghoff * r.vt_exp_ml;
  }
}
