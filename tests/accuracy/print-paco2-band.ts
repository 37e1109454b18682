// Prints the coverage of the PaCO2 band per scenario and pooled: `npx tsx tests/accuracy/print-paco2-band.ts`
// (the table in docs/accuracy.md; the cases and the simulated blood gases are described in paco2-band.ts).
import { COVERAGE_CASES, coverage } from './paco2-band';

console.log('| scenario | gases every | breaths | nominal 80 %: covered | half-width (median) | nominal 95 %: covered | half-width (median) |');
console.log('|---|---|---|---|---|---|---|');
const pooled = { n: 0, in80: 0, in95: 0 };
for (const c of COVERAGE_CASES) {
  const a = coverage(c, 0.8);
  const b = coverage(c, 0.95);
  pooled.n += a.breaths;
  pooled.in80 += a.inside;
  pooled.in95 += b.inside;
  const pct = (x: number, n: number) => `${((100 * x) / n).toFixed(1)} %`;
  console.log(
    `| ${c.scenario} (${c.minutes} min) | ${c.every_s / 60} min | ${a.breaths} | ${pct(a.inside, a.breaths)} | ${a.median_half_width_mmhg.toFixed(1)} mmHg | ` +
      `${pct(b.inside, b.breaths)} | ${b.median_half_width_mmhg.toFixed(1)} mmHg |`,
  );
}
console.log(`| all | | ${pooled.n} | ${((100 * pooled.in80) / pooled.n).toFixed(1)} % | | ${((100 * pooled.in95) / pooled.n).toFixed(1)} % | |`);
