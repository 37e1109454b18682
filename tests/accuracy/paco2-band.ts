// Coverage of the PaCO2 band between blood gases, on simulated recordings whose true PaCO2 is known per breath.
// Each scenario is simulated and analysed; blood gases are drawn every `every_s` seconds (from 120 s on) with the true
// PaCO2 of the breath at that moment plus an analyser error drawn from a normal distribution with SD 1.02 mmHg (the SD
// of a random PCO2 measurement on a random analyser: Kampelmacher MJ, van Kesteren RG, Winckers EK 1997,
// "Instrumental variability of respiratory blood gases among different blood gas analysers in different
// laboratories", Eur Respir J 10:1341-1344). Coverage = share of estimated breaths whose true PaCO2 lies in the band.
// Used by paco2-band.test.ts and print-paco2-band.ts.
import { createAnalyser } from '../../src/analyse/analyser';
import { analyseGas } from '../../src/gas/index';
import { createRng, scenarioParams, simulateSignals, streamSeed } from '../../src/simulate/index';
import { defaultSettings } from '../../src/settings';
import type { BreathRow } from '../../src/types';
import { makeSample } from '../gas/make-breath';

export const ANALYSER_SD_MMHG = 1.02;

export interface CoverageCase {
  scenario: string;
  minutes: number;
  seed: number;
  every_s: number;
}

export const COVERAGE_CASES: CoverageCase[] = [
  { scenario: 'adult-stable-long', minutes: 40, seed: 21, every_s: 600 },
  { scenario: 'adult-perfusion-fall', minutes: 30, seed: 22, every_s: 480 },
  { scenario: 'adult-dead-space-rise', minutes: 30, seed: 23, every_s: 480 },
  { scenario: 'infant-cardiac-shunt', minutes: 20, seed: 24, every_s: 300 },
  { scenario: 'adult-tidal-volume-change', minutes: 30, seed: 25, every_s: 600 },
];

export interface Coverage {
  breaths: number;
  inside: number;
  median_half_width_mmhg: number;
}

/** Analyses one case and counts the breaths whose true PaCO2 lies inside the band at the given level. */
export function coverage(c: CoverageCase, level: number): Coverage {
  const params = scenarioParams(c.scenario, { minutes: c.minutes });
  const analyser = createAnalyser(defaultSettings());
  const truth: { t: number; paco2: number }[] = [];
  for (const chunk of simulateSignals(params, c.seed)) {
    analyser.push(chunk.block);
    for (const b of chunk.breaths) truth.push({ t: b.t_start_s, paco2: b.paco2_mmhg });
  }
  const rows: BreathRow[] = analyser.finish().breaths;
  const rng = createRng(streamSeed(c.seed, 9));
  const truthAt = (t: number) => truth.reduce((best, x) => (Math.abs(x.t - t) < Math.abs(best.t - t) ? x : best)).paco2;
  const samples = [];
  for (let t = 120; t < c.minutes * 60 - 30; t += c.every_s) {
    samples.push(makeSample({ time_s: t, paco2_mmhg: truthAt(t) + ANALYSER_SD_MMHG * rng.normal() }));
  }
  const result = analyseGas(rows, samples, { pb_mmhg: 760, band_level: level });
  let inside = 0;
  const halves: number[] = [];
  for (const e of result.estimates) {
    const p = truthAt(e.t_start_s);
    if (p >= e.band_low_mmhg && p <= e.band_high_mmhg) inside++;
    halves.push((e.band_high_mmhg - e.band_low_mmhg) / 2);
  }
  halves.sort((a, b) => a - b);
  return { breaths: result.estimates.length, inside, median_half_width_mmhg: halves[Math.floor(halves.length / 2)] ?? NaN };
}
