/**
 * Seeded pseudo-random numbers for the simulator (no Math.random, no global state).
 *
 * Generator: mulberry32, a 32-bit state generator with period 2^32 [common practice, no source: public-domain
 * algorithm by T. Ettinger, widely restated]. Good enough for simulated breath-to-breath variability and sensor
 * noise; not for cryptography.
 * Normal deviates: Box-Muller transform (Box GEP, Muller ME 1958, "A note on the generation of random normal
 * deviates", Ann Math Stat 29:610-611).
 *
 * Independent streams (breath pattern, sensor noise, export damage) are derived from one seed with `streamSeed`,
 * so that changing, say, the noise level does not change the breath pattern of the same seed.
 */
export interface Rng {
  /** uniform in [0, 1) */
  uniform(): number;
  /** standard normal N(0, 1) */
  normal(): number;
}

/** Mix a user seed and a stream number into a 32-bit seed (integer hash, [common practice, no source]). */
export function streamSeed(seed: number, stream: number): number {
  let h = (Math.floor(seed) ^ Math.imul(stream + 1, 0x9e3779b1)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b) >>> 0;
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35) >>> 0;
  return (h ^ (h >>> 16)) >>> 0;
}

/** mulberry32 generator with a Box-Muller normal. Deterministic for a given seed. */
export function createRng(seed: number): Rng {
  let state = seed >>> 0;
  let spare = NaN;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (!Number.isNaN(spare)) {
      const z = spare;
      spare = NaN;
      return z;
    }
    let u = uniform();
    while (u <= 0) u = uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  return { uniform, normal };
}
