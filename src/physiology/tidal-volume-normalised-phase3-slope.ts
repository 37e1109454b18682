/**
 * Phase III slope normalised by PĀECO2 and tidal volume, dimensionless: the rise of the phase III line over one
 * expired tidal volume, as a fraction of the mean alveolar expired PCO2. Multiplying by VT removes the fall of the
 * slope per litre with larger breaths (slopes of small breaths per litre are steeper).
 *
 * Formula: SnIII x VT = SIII [mmHg/L] x VT [L] / PĀECO2 [mmHg], VT = expired tidal volume. Source: derived here (no
 * published definition of a tidal-volume-normalised capnographic phase III slope could be found and read for this
 * project; this is the plain product of the PĀECO2-normalised slope and VT).
 *
 * NaN propagates; PĀECO2 = 0 gives an infinite value.
 *
 * @example tidalVolumeNormalisedPhase3Slope(10, 500, 40) // 0.125
 */
export function tidalVolumeNormalisedPhase3Slope(slopeMmhgPerL: number, tidalVolumeMl: number, paeco2Mmhg: number): number {
  return (slopeMmhgPerL * (tidalVolumeMl / 1000)) / paeco2Mmhg;
}
