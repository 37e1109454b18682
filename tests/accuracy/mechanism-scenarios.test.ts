// The analysis on recordings from the 'compartments' lung model, where the phase III slope, the alveolar dead space
// and the gradient arise from the compartments (src/simulate/lung-compartments.ts) instead of being inputs. The
// limits are those of docs/accuracy.md; PETCO2 is compared with the truth of the same definition: the default
// petco2_method 'line_end' reads the phase III line at the end of expiration (truth petco2_line_end_mmhg), 'last' the
// gas itself (truth petco2_mmhg), which a curved phase III lifts above the line.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { quantile } from '../../src/numeric/stats';
import { defaultSettings, type AnalysisSettings } from '../../src/settings';
import { scenarioParams, simulateSignals, type TruthBreath } from '../../src/simulate/index';
import type { BreathRow, SampleBlock } from '../../src/types';
import { expectClose } from '../helpers/expect-close';

interface Run {
  blocks: SampleBlock[];
  truth: TruthBreath[];
  paco2: number;
}

function simulate(name: string, seed: number): Run {
  const blocks: SampleBlock[] = [];
  const truth: TruthBreath[] = [];
  for (const chunk of simulateSignals(scenarioParams(name, { minutes: 2 }), seed)) {
    blocks.push(chunk.block);
    truth.push(...chunk.breaths);
  }
  return { blocks, truth, paco2: quantile(truth.map((b) => b.paco2_mmhg), 0.5) };
}

/** Medians of the breaths the summary uses, analysed with the true median PaCO2. */
function analyse(run: Run, petco2Method: AnalysisSettings['petco2_method']): { used: number; all: number; med: (k: keyof BreathRow) => number } {
  const settings = defaultSettings();
  settings.analysis.paco2_mmhg = run.paco2;
  settings.analysis.petco2_method = petco2Method;
  const analyser = createAnalyser(settings);
  for (const b of run.blocks) analyser.push(b);
  const core = analyser.finish();
  const used = core.breaths.filter((b) => usableForSummary(b));
  return { used: used.length, all: core.breaths.length, med: (k) => quantile(used.map((b) => b[k] as number), 0.5) };
}

const truthMedian = (run: Run, k: keyof TruthBreath) => quantile(run.truth.map((b) => b[k] as number), 0.5);

describe('analysis of the compartment-model scenarios recovers the truth within the accuracy limits', () => {
  for (const [name, seed] of [['adult-mech-congested', 7], ['infant-mech-cyanotic-shunt', 7]] as const) {
    it(`${name}`, () => {
      const run = simulate(name, seed);
      const a = analyse(run, 'line_end');
      expect(a.used).toBeGreaterThanOrEqual(0.5 * a.all);
      const vd = truthMedian(run, 'vd_aw_ml');
      expectClose(a.med('vd_aw_ml'), vd, { abs: Math.max(2, 0.03 * vd) }, 'airway dead space');
      expectClose(a.med('petco2_mmhg'), truthMedian(run, 'petco2_line_end_mmhg'), { abs: 1 }, 'PETCO2 (line end)');
      expectClose(a.med('peco2_mmhg'), truthMedian(run, 'peco2_mmhg'), { rel: 0.03 }, 'mixed expired PCO2');
      expectClose(a.med('vdvt_enghoff'), truthMedian(run, 'vdvt_enghoff'), { abs: 0.02 }, 'Enghoff VD/VT');
      expectClose(a.med('slope3_mmhg_per_l'), truthMedian(run, 'slope3_mmhg_per_l'), { rel: 0.15 }, 'phase III slope');
      expectClose(a.med('vtco2_ml'), truthMedian(run, 'vtco2_ml'), { rel: 0.03 }, 'VTCO2');
      const last = analyse(run, 'last');
      expectClose(last.med('petco2_mmhg'), truthMedian(run, 'petco2_mmhg'), { abs: 1 }, 'PETCO2 (last value)');
    });
  }
});
