/**
 * A capnogram slope normalised by a PCO2, 1/L: the slope divided by the PCO2 it is read against, so that breaths and
 * patients with different CO2 levels compare. Used for the phase III slope over PETCO2 (`slope3_norm_per_l`), the
 * phase III slope over the mean alveolar expired PCO2 PĀECO2 (`slope3_norm_paeco2_per_l`) and the phase II slope over
 * PĀECO2 (`slope2_norm_paeco2_per_l`).
 *
 * Formula: Sn [1/L] = S [mmHg/L] / Pref [mmHg]. Source: Tusman G, Gogniat E, Bohm SH, Scandurra A, Suarez-Sipmann F,
 * Torroba A, Casella F, Giannasi S, San Roman E 2013, "Reference values for volumetric capnography-derived
 * non-invasive parameters in healthy individuals", J Clin Monit Comput 27:281-288, report a normalised phase III slope
 * (abstract); which PCO2 each column divides by is this project's choice, named in the column (the normalising PCO2
 * of that paper could not be read here: not verified).
 *
 * NaN propagates (and Pref = 0 gives an infinite value).
 *
 * @example normalisedSlope(10, 39) // 0.2564; normalisedSlope(10, 37.248) // 0.26847
 */
export function normalisedSlope(slopeMmhgPerL: number, referenceMmhg: number): number {
  return slopeMmhgPerL / referenceMmhg;
}
