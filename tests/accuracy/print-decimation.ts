// Prints the sampling-rate sweep: `npx tsx tests/accuracy/print-decimation.ts [none|mmhg|kpa] [end|centre] [pattern]`,
// or the markdown table of docs/accuracy.md: `npx tsx tests/accuracy/print-decimation.ts --markdown`.
import { PATTERNS, RATES_HZ, checkRate, runPattern, type FlowStamp, type Rounding } from './decimation';

if (process.argv[2] === '--markdown') printMarkdown();
else printText();

function printText(): void {
  const rounding = (process.argv[2] ?? 'none') as Rounding;
  const stamp = (process.argv[3] ?? 'end') as FlowStamp;
  const only = process.argv[4];
  for (const p of PATTERNS) {
    if (only && !p.name.includes(only)) continue;
    const { sim, results } = runPattern(p, undefined, rounding, stamp);
    const t = sim.truth;
    console.log(`${p.name}: truth VDaw ${t.vd_aw_ml!.toFixed(2)} PETCO2 ${t.petco2_mmhg!.toFixed(2)} PECO2 ${t.peco2_mmhg!.toFixed(3)} slope ${t.slope3_mmhg_per_l!.toFixed(2)} VTCO2 ${t.vtco2_ml!.toFixed(3)}`);
    for (const r of results) {
      const m = r.medians;
      const fails = checkRate(p, sim, results[0]!, r);
      console.log(
        `  ${String(r.rate_hz).padStart(4)} Hz ${r.used}/${r.breaths} delay ${(r.delay_s * 1000).toFixed(1)} ms  VDaw ${m.vd_aw_ml!.toFixed(2)} (${((100 * (m.vd_aw_ml! - t.vd_aw_ml!)) / t.vd_aw_ml!).toFixed(2)} %)` +
          `  PETCO2 ${(m.petco2_mmhg! - t.petco2_mmhg!).toFixed(2)}  PECO2 ${(m.peco2_mmhg! - t.peco2_mmhg!).toFixed(3)}  slope ${((100 * (m.slope3_mmhg_per_l! - t.slope3_mmhg_per_l!)) / t.slope3_mmhg_per_l!).toFixed(1)} %` +
          `  VTCO2 ${((100 * (m.vtco2_ml! - t.vtco2_ml!)) / t.vtco2_ml!).toFixed(2)} %${fails.length ? '  FAIL ' + fails.join('; ') : ''}`,
      );
    }
  }
}

/** One row per pattern and rate: errors of the medians against truth, and whether the limits hold. */
function printMarkdown(): void {
  const sign = (x: number, d: number): string => (Number.isFinite(x) ? (x >= 0 ? '+' : '−') + Math.abs(x).toFixed(d) : '–');
  console.log('| pattern | rate | VDaw error | PĒCO2 error (mmHg) | PETCO2 error (mmHg) | phase III slope error | within the limits |');
  console.log('|---|---|---|---|---|---|---|');
  for (const rounding of ['none', 'mmhg'] as Rounding[]) {
    for (const p of PATTERNS) {
      const { sim, results } = runPattern(p, RATES_HZ, rounding);
      const t = sim.truth;
      for (const r of results) {
        const m = r.medians;
        const vd = p.infant ? `${sign(m.vd_aw_ml! - t.vd_aw_ml!, 2)} mL` : `${sign((100 * (m.vd_aw_ml! - t.vd_aw_ml!)) / t.vd_aw_ml!, 1)} %`;
        const ok = r.rate_hz === 1000 ? '(reference)' : checkRate(p, sim, results[0]!, r).length ? 'no' : 'yes';
        const name = rounding === 'mmhg' ? `${p.name}, CO2 in whole mmHg` : p.name;
        console.log(
          `| ${name} | ${r.rate_hz} Hz | ${Number.isFinite(m.vd_aw_ml!) ? vd : 'no usable breaths'} | ${sign(m.peco2_mmhg! - t.peco2_mmhg!, 2)} | ` +
            `${sign(m.petco2_mmhg! - t.petco2_mmhg!, 2)} | ${sign((100 * (m.slope3_mmhg_per_l! - t.slope3_mmhg_per_l!)) / t.slope3_mmhg_per_l!, 1)}${Number.isFinite(m.slope3_mmhg_per_l!) ? ' %' : ''} | ${ok} |`,
        );
      }
    }
  }
}
