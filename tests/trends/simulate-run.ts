// Runs a simulator scenario straight into the analyser (no CSV) and keeps the breath rows and the truth breaths.
import { createAnalyser } from '../../src/analyse/analyser';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals, type SimParams, type TruthBreath } from '../../src/simulate/index';
import type { BloodGasPoint } from '../../src/trends/blood-gas';
import type { BreathRow, SampleBlock } from '../../src/types';

export interface SimRun {
  params: SimParams;
  breaths: BreathRow[];
  truth: TruthBreath[];
  /** wall time of simulation + analysis, ms */
  ms: number;
}

export function runScenario(name: string, overrides: Partial<SimParams>, seed: number, damage?: (b: SampleBlock) => void): SimRun {
  const params = scenarioParams(name, overrides);
  const t0 = performance.now();
  const analyser = createAnalyser(defaultSettings());
  const truth: TruthBreath[] = [];
  for (const c of simulateSignals(params, seed)) {
    damage?.(c.block);
    analyser.push(c.block);
    truth.push(...c.breaths);
  }
  const breaths = analyser.finish().breaths;
  return { params, breaths, truth, ms: performance.now() - t0 };
}

/** An arterial sample drawn at time t: the model's PaCO2 of the breath in progress (the simulated patient's truth). */
export function bloodGasAt(run: SimRun, t: number): BloodGasPoint {
  const b = run.truth.find((x) => x.t_start_s <= t && t < x.t_end_s) ?? run.truth.find((x) => x.t_start_s >= t);
  if (!b) throw new Error(`no simulated breath at ${t} s`);
  return { time_s: t, paco2_mmhg: b.paco2_mmhg };
}
