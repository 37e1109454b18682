import { detExp } from '../numeric/det-math';

/**
 * Sequential emptying of lung compartments during one expiration (the 'compartments' lung model, MODEL.md).
 *
 * Compartment i holds the share v_i of the alveolar expired volume U and empties over the expiration (duration S) with
 * its own time constant tau_i, like a passive R-C unit [common practice, no source: first-order respiratory
 * mechanics, as breath-flow.ts]: by pseudo-time s it has delivered
 *   U_i(s) = v_i U g_i(s),   g_i(s) = (1 - exp(-s/tau_i)) / (1 - exp(-S/tau_i)),
 * so every compartment delivers exactly its share by the end of expiration. The gas leaving the alveoli at s is the
 * flow-weighted mix  P(s) = sum v_i g_i'(s) PE_i / sum v_i g_i'(s),  g_i'(s) = exp(-s/tau_i) / (tau_i (1 - exp(-S/tau_i))),
 * at cumulative alveolar volume u(s) = sum U_i(s): short time constants dominate early, long ones late, so a slow
 * compartment with high PCO2 (low V/Q) raises the end of the plateau and the phase III slope is a result of the
 * unevenness. The schedule runs on pseudo-time, not on the flow wave at the airway opening, and PCO2 within a
 * compartment is constant over the breath (no rise from continuing gas exchange) [derived here].
 * Tabulated at n + 1 points of s and read by linear interpolation in u.
 */
export interface AlveolarProfile {
  /** cumulative alveolar expired volume at each table point, mL (0 .. U, increasing) */
  u_ml: Float64Array;
  /** PCO2 of the gas leaving the alveoli at that volume, mmHg */
  p_mmhg: Float64Array;
}

export function sequentialEmptyingProfile(
  shares: readonly number[],
  tausS: readonly number[],
  peMmhg: readonly number[],
  alveolarVolumeMl: number,
  expirationS: number,
  n = 512,
): AlveolarProfile {
  const m = shares.length;
  const norm = tausS.map((tau) => 1 - detExp(-expirationS / tau));
  const u = new Float64Array(n + 1);
  const p = new Float64Array(n + 1);
  for (let j = 0; j <= n; j++) {
    const s = (expirationS * j) / n;
    let vol = 0;
    let w = 0;
    let wp = 0;
    for (let i = 0; i < m; i++) {
      const e = detExp(-s / tausS[i]!);
      vol += (shares[i]! * (1 - e)) / norm[i]!;
      const dens = (shares[i]! * e) / (tausS[i]! * norm[i]!);
      w += dens;
      wp += dens * peMmhg[i]!;
    }
    u[j] = alveolarVolumeMl * vol;
    p[j] = wp / w;
  }
  u[n] = alveolarVolumeMl;
  return { u_ml: u, p_mmhg: p };
}

/** PCO2 of the alveolar gas at cumulative alveolar expired volume uMl (clamped to the table), mmHg. */
export function profileAt(pr: AlveolarProfile, uMl: number): number {
  const u = pr.u_ml;
  const last = u.length - 1;
  if (!(uMl > 0)) return pr.p_mmhg[0]!;
  if (uMl >= u[last]!) return pr.p_mmhg[last]!;
  let lo = 0;
  let hi = last;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (u[mid]! <= uMl) lo = mid;
    else hi = mid;
  }
  const span = u[hi]! - u[lo]!;
  const f = span > 0 ? (uMl - u[lo]!) / span : 0;
  return pr.p_mmhg[lo]! + f * (pr.p_mmhg[hi]! - pr.p_mmhg[lo]!);
}
