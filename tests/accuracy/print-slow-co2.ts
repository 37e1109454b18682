// Prints the effect of a CO2 channel slower than flow: each pattern of the sampling-rate sweep exported with flow at
// 100 Hz (averaged over each interval) and CO2 point-sampled at 100, 50 or 25 Hz, the rows between CO2 samples
// interpolated linearly as the reader does. `npx tsx tests/accuracy/print-slow-co2.ts` (table in docs/accuracy.md).
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { quantile } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { PATTERNS, decimate, simulatePattern } from './decimation';

console.log('| pattern | CO2 rate | VDaw error | PĒCO2 error (mmHg) | time constant (ms) |');
console.log('|---|---|---|---|---|');
for (const p of PATTERNS) {
  const sim = simulatePattern(p);
  const b = decimate(sim.block, 1000, 100);
  for (const every of [1, 2, 4]) {
    const co2 = new Float64Array(b.n);
    for (let i = 0; i < b.n; i++) {
      const k0 = i - (i % every);
      const k1 = k0 + every;
      const w = k1 < b.n ? (b.t_s[i]! - b.t_s[k0]!) / (b.t_s[k1]! - b.t_s[k0]!) : 0;
      co2[i] = k1 < b.n ? b.co2_mmhg[k0]! + w * (b.co2_mmhg[k1]! - b.co2_mmhg[k0]!) : b.co2_mmhg[k0]!;
    }
    const analyser = createAnalyser(defaultSettings());
    analyser.push({ ...b, co2_mmhg: co2 });
    const core = analyser.finish();
    const used = core.breaths.filter((x) => usableForSummary(x));
    const med = (k: 'vd_aw_ml' | 'peco2_mmhg') => quantile(used.map((x) => x[k] as number), 0.5);
    const t = sim.truth;
    const vd = p.infant ? `${(med('vd_aw_ml') - t.vd_aw_ml!).toFixed(2)} mL` : `${((100 * med('vd_aw_ml')) / t.vd_aw_ml! - 100).toFixed(1)} %`;
    console.log(`| ${p.name} | ${100 / every} Hz | ${vd} | ${(med('peco2_mmhg') - t.peco2_mmhg!).toFixed(2)} | ${core.calibration.response_ms.toFixed(1)} |`);
  }
}
