// Per-breath Enghoff dead space and the arterial alveolar dead-space fraction from blood gases: each breath uses the arterial PCO2 of the most recent sample drawn
// at or before the breath's start (none before the first sample; a sample drawn before the recording is not used). Same functions as the analysis with --paco2:
// setArterialColumns (Enghoff with the breath's inspired PCO2 when bohr_inspired_term is on, the apparatus volume
// removed; the arterial alveolar dead-space fraction; Fletcher's areas).
import { inspiredPco2For, setArterialColumns } from '../analyse/arterial-columns';
import type { BreathRow } from '../types';
import { samplesInRecording } from './before-recording';
import { GAS_DEFAULTS } from './gas-defaults';
import type { GasSample, Paco2Temperature } from './gas-types';
import { paco2Basis } from './paco2-basis';

/** paco2Temperature: the PaCO2 basis of the gas analysis (paco2Basis; default that of GAS_DEFAULTS), so that the
 *  per-breath values use the PaCO2 of the gas table's gradient. */
export function applyArterialPco2(
  rows: BreathRow[], samples: readonly GasSample[], inspiredTerm: boolean, apparatusMl: number,
  paco2Temperature: Paco2Temperature = GAS_DEFAULTS.paco2_temperature.value,
): void {
  const sorted = samplesInRecording(samples).sort((a, b) => a.time_s - b.time_s);
  let k = -1;
  for (const r of rows) {
    while (k + 1 < sorted.length && sorted[k + 1]!.time_s <= r.t_start_s) k++;
    if (k < 0) continue;
    const paco2 = paco2Basis(sorted[k]!, paco2Temperature).used_mmhg;
    setArterialColumns(r, paco2, inspiredPco2For(r, inspiredTerm), apparatusMl);
  }
}
