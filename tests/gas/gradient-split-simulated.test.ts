// The arterial–end-tidal gradient split on simulator recordings with known shunt and alveolar dead space
// (acceptance test). The simulator mixes shunted venous and end-capillary blood linearly (derived here, docs/methods.md
// Derivations), so the truth is:
// gradient = PaCO2 - PETCO2; alveolar gradient = PaCO2 - PĀECO2 (mean alveolar expired PCO2, the split's alveolar
// gas); shunt part = PaCO2 - Pc'CO2 (Pc'CO2 = perfused alveolar PCO2); rest = Pc'CO2 - PĀECO2.
// The blood-gas rows are built from the simulator's truth (PaCO2, PvCO2) and oxygen values constructed to carry the
// simulator's shunt fraction through Berggren's equation (Hb 14 g/dL, FiO2 50 %, SvO2 65 %, Sc'O2 1); the tool must
// recover shunt fraction, gradient and both parts from these inputs and its own breath analysis.
// Limits (ours): shunt fraction ±0.02, gradient and its parts ±0.6 mmHg.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { quantile } from '../../src/numeric/stats';
import { analyseGas, type GasSample } from '../../src/gas/index';
import { alveolarGasPao2, oxygenContent, severinghausPo2, severinghausSaturation } from '../../src/physiology/index';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals, type TruthBreath } from '../../src/simulate/index';

const HB = 14;
const FIO2 = 0.5;
const SVO2 = 0.65;

/** Arterial PO2 that makes Berggren's equation give shunt s (bisection on the dissociation curve). */
function arterialPo2For(s: number, paco2: number): { pao2: number; sao2: number } {
  const pAO2 = alveolarGasPao2({ fio2: FIO2, pbMmhg: 760, paco2Mmhg: paco2, rq: 0.8 });
  const cc = oxygenContent(HB, 1, pAO2);
  const cv = oxygenContent(HB, SVO2, severinghausPo2(SVO2));
  const ca = cc - s * (cc - cv);
  let lo = 10;
  let hi = pAO2;
  for (let i = 0; i < 100; i++) {
    const mid = 0.5 * (lo + hi);
    if (oxygenContent(HB, severinghausSaturation(mid), mid) < ca) lo = mid;
    else hi = mid;
  }
  const pao2 = 0.5 * (lo + hi);
  return { pao2, sao2: severinghausSaturation(pao2) };
}

function run(scenario: string) {
  const p = scenarioParams(scenario, { minutes: 3 });
  const truth: TruthBreath[] = [];
  const analyser = createAnalyser(defaultSettings());
  for (const c of simulateSignals(p, 11)) {
    analyser.push(c.block);
    truth.push(...c.breaths);
  }
  const core = analyser.finish();
  const near = (t: number) => truth.filter((b) => b.t_start_s > t - 60 && b.t_end_s <= t);
  const samples: GasSample[] = [100, 170].map((t, k) => {
    const tb = near(t);
    const paco2 = quantile(tb.map((b) => b.paco2_mmhg), 0.5);
    const s = tb[0]!.shunt_fraction;
    const { pao2, sao2 } = arterialPo2For(s, paco2);
    return {
      line: k + 2,
      time_s: t,
      paco2_mmhg: paco2,
      pao2_mmhg: pao2,
      sao2_pct: 100 * sao2,
      svo2_pct: 100 * SVO2,
      pvco2_mmhg: quantile(tb.map((b) => b.pvco2_mmhg), 0.5),
      pvo2_mmhg: NaN,
      hb_g_dl: HB,
      fio2_pct: 100 * FIO2,
      temp_c: NaN,
    };
  });
  const result = analyseGas(core.breaths, samples, { pb_mmhg: 760 });
  return { result, truth, near, samples };
}

describe('gradient split on simulated recordings with known shunt and dead space', () => {
  for (const scenario of ['infant-cardiac-shunt', 'adult-congested-region']) {
    it(`${scenario}: shunt fraction, gradient, shunt part and rest recover the truth`, () => {
      const { result, near, samples } = run(scenario);
      expect(result.rows.length).toBe(2);
      for (const [i, row] of result.rows.entries()) {
        const tb = near(samples[i]!.time_s);
        const med = (f: (b: TruthBreath) => number) => quantile(tb.map(f), 0.5);
        const paco2 = samples[i]!.paco2_mmhg;
        const petco2 = med((b) => b.petco2_mmhg);
        const pcap = med((b) => b.pa_perfused_mmhg);
        const paeco2 = med((b) => b.paeco2_mmhg);
        expect(Math.abs(row.shunt_fraction - tb[0]!.shunt_fraction), 'shunt fraction').toBeLessThan(0.02);
        expect(Math.abs(row.gradient_mmhg - (paco2 - petco2)), 'gradient').toBeLessThan(0.6);
        expect(Math.abs(row.gradient_shunt_mmhg - (paco2 - pcap)), 'shunt part').toBeLessThan(0.6);
        expect(Math.abs(row.gradient_alv_mmhg - (paco2 - paeco2)), 'alveolar gradient').toBeLessThan(0.6);
        expect(Math.abs(row.gradient_rest_mmhg - (pcap - paeco2)), 'rest').toBeLessThan(0.6);
        expect(row.gradient_rest_mmhg, 'rest not negative').toBeGreaterThanOrEqual(0);
        expect(row.pvco2_source).toBe('measured');
        expect(row.shunt_method).toBe('contents');
      }
    });
  }
});
