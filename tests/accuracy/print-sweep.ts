// Prints the accuracy sweep as a table: `npx tsx tests/accuracy/print-sweep.ts [count]`.
import { checkLimits, runCombo, sweepCombos } from './sweep';
const n = Number(process.argv[2] ?? 50);
const keys = ['vd_aw_ml', 'petco2_mmhg', 'peco2_mmhg', 'slope3_mmhg_per_l', 'vdvt_enghoff'];
let fails = 0;
for (const c of sweepCombos(n)) {
  const r = runCombo(c);
  const f = checkLimits(r);
  if (f.length) fails++;
  const cells = keys.map((k) => `${k.split('_')[0]} ${r.measured[k]!.toFixed(2)}/${r.truth[k]!.toFixed(2)}`);
  console.log(`${f.length ? 'FAIL' : 'ok  '} ${c.name.padEnd(58)} ${r.used}/${r.breaths} ${cells.join('  ')}${f.length ? '\n      ' + f.join('\n      ') : ''}`);
}
console.log(`${n - fails} of ${n} combinations within limits`);
