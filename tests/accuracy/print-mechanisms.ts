// Prints the tables of docs/mechanisms.md: each compartment-model scenario through the command line (`phasewise
// simulate`, then `phasewise analyse --gas`), the tool's numbers beside the simulator's truth. Truth is the median of
// the breaths in the 60 s before the blood gas, the analysis's default window (gas.window_s).
// Run after `node scripts/build.mjs`: `npx tsx tests/accuracy/print-mechanisms.ts`.
// The simulator has no oxygen model, so the gas file's saturations are made up to carry the simulator's shunt
// fraction through the saturation route the analysis uses when PaO2, Hb and FiO2 are missing: SvO2 70 %,
// SaO2 = 100 - 30 s (so (1 - SaO2) / (1 - SvO2) = s with Sc'O2 = 1); PaCO2 and PvCO2 are the true medians.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const BIN = join(import.meta.dirname, '../../bin/phasewise.cjs');
const dir = mkdtempSync(join(tmpdir(), 'phasewise-mech-'));

interface Case {
  scenario: string;
  label: string;
  /** time of the blood gas, s, and the truth window before it */
  gas_t_s: number;
  from_s: number;
}

const CASES: Case[] = [
  { scenario: 'adult-mech-healthy', label: 'healthy (reference)', gas_t_s: 170, from_s: 110 },
  { scenario: 'adult-mech-congested', label: 'congested: low V/Q + 15 % shunt', gas_t_s: 170, from_s: 110 },
  { scenario: 'infant-mech-cyanotic-shunt', label: 'cyanotic infant: 40 % shunt', gas_t_s: 170, from_s: 110 },
  { scenario: 'adult-mech-embolism', label: 'embolus at 6 min: 30 % of ventilation unperfused', gas_t_s: 840, from_s: 780 },
  { scenario: 'adult-mech-low-output', label: 'cardiac output 5.0 -> 1.8 L/min at 6 min: zone 1', gas_t_s: 840, from_s: 780 },
];

type Row = Record<string, number>;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

function cli(args: string[]): void {
  execFileSync(process.execPath, [BIN, ...args], { stdio: 'pipe' });
}

/** Median of each truth field over the breaths in [from, to). */
function truthWindow(truthFile: string, from: number, to: number): Row {
  const truth = JSON.parse(readFileSync(truthFile, 'utf8')) as { breaths: Row[] };
  const inside = truth.breaths.filter((b) => b.t_start_s! >= from && b.t_end_s! <= to);
  const out: Row = {};
  for (const k of Object.keys(inside[0]!)) out[k] = median(inside.map((b) => b[k]!));
  return out;
}

/** The data rows of a CSV as numbers by column name (text cells become NaN; status is kept apart). */
function csvRows(file: string): { row: Row; status: string }[] {
  const [head, ...lines] = readFileSync(file, 'utf8').trim().split('\n');
  const names = head!.split(',');
  return lines.map((line) => {
    const cells = line.split(',');
    return { row: Object.fromEntries(names.map((n, i) => [n, Number(cells[i])])), status: cells[names.indexOf('status')] ?? '' };
  });
}

/** Median of a breaths.csv column over the ok and caution breaths inside [from, to]. */
function breathsMedian(file: string, column: string, from: number, to: number): number {
  const rows = csvRows(file).filter((r) => (r.status === 'ok' || r.status.startsWith('caution')) && r.row.t_start_s! >= from && r.row.t_end_s! <= to);
  return median(rows.map((r) => r.row[column]!));
}

function runCase(c: Case): { t: Row; g: Row; m: Row } {
  const csv = join(dir, `${c.scenario}.csv`);
  cli(['simulate', c.scenario, '--out', csv, '--seed', '1']);
  const t = truthWindow(csv.replace(/\.csv$/, '.truth.json'), c.from_s, c.gas_t_s);
  const s = t.shunt_fraction!;
  const gasFile = join(dir, `${c.scenario}.gas.csv`);
  const sa = (100 - 30 * s).toFixed(1);
  writeFileSync(gasFile, `time_s,paco2_mmhg,pvco2_mmhg,sao2_pct,svo2_pct\n${c.gas_t_s},${t.paco2_mmhg!.toFixed(1)},${t.pvco2_mmhg!.toFixed(1)},${sa},70\n`);
  const out = join(dir, `${c.scenario}-out`);
  cli(['analyse', csv, '--gas', gasFile, '--out', out]);
  const breaths = join(out, 'breaths.csv');
  const m: Row = { slope3_mmhg_per_l: breathsMedian(breaths, 'slope3_mmhg_per_l', c.from_s, c.gas_t_s) };
  return { t, g: csvRows(join(out, 'gas.csv'))[0]!.row, m };
}

const f = (x: number | undefined, d = 1) => (x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(d));

console.log('| scenario | PaCO2 | PETCO2: tool (line end) / truth line end / truth gas | Pa−ET: tool / truth (gas) | Pa−PĀECO2: tool / truth | by shunt: tool / truth | rest: tool / truth (V/Q + dead space) | truth V/Q / dead space / emptying |');
console.log('|---|---|---|---|---|---|---|---|');
const second: string[] = [];
for (const c of CASES) {
  const { t, g, m } = runCase(c);
  const restTruth = t.grad_vq_mmhg! + t.grad_dead_space_mmhg!;
  console.log(
    `| ${c.label} | ${f(g.paco2_mmhg)} | ${f(g.petco2_mmhg)} / ${f(t.petco2_line_end_mmhg)} / ${f(t.petco2_mmhg)} | ${f(g.gradient_mmhg)} / ${f(t.grad_total_mmhg)} | ` +
      `${f(g.gradient_alv_mmhg)} / ${f(t.paco2_mmhg! - t.paeco2_mmhg!)} | ${f(g.gradient_shunt_mmhg)} / ${f(t.grad_shunt_mmhg)} | ${f(g.gradient_rest_mmhg)} / ${f(restTruth)} | ` +
      `${f(t.grad_vq_mmhg)} / ${f(t.grad_dead_space_mmhg)} / ${f(t.grad_emptying_mmhg)} |`,
  );
  second.push(
    `| ${c.label} | ${f(g.vd_aw_ml)} / ${f(t.vd_aw_ml)} | ${f(g.vdvt_bohr, 3)} / ${f(t.vdvt_bohr, 3)} | ${f(g.vdvt_enghoff, 3)} / ${f(t.vdvt_enghoff, 3)} | ` +
      `${f(m.slope3_mmhg_per_l)} / ${f(t.slope3_mmhg_per_l)} | ${f(t.alv_dead_space_fraction, 3)} | ${f(t.zone1_fraction, 3)} |`,
  );
}
console.log('\n| scenario | VDaw (mL): tool / truth | Bohr VD/VT: tool / truth | Enghoff VD/VT: tool / truth | phase III slope (mmHg/L): tool / truth | truth unperfused share | truth zone 1 |');
console.log('|---|---|---|---|---|---|---|');
for (const line of second) console.log(line);

// event detection on the two recordings with an event at 6 min: without a blood gas, and with one before (300 s) and
// one after (840 s), each carrying the true medians of its 60 s window
console.log('\n| scenario | events found: without gases | with gases at 5 and 14 min |');
console.log('|---|---|---|');
for (const c of CASES.filter((x) => x.gas_t_s > 600)) {
  const csv = join(dir, `${c.scenario}.csv`);
  const truthFile = csv.replace(/\.csv$/, '.truth.json');
  const line = (tS: number) => {
    const t = truthWindow(truthFile, tS - 60, tS);
    return `${tS},${t.paco2_mmhg!.toFixed(1)},${t.pvco2_mmhg!.toFixed(1)},${(100 - 30 * t.shunt_fraction!).toFixed(1)},70`;
  };
  const gasFile = join(dir, `${c.scenario}.two-gases.csv`);
  writeFileSync(gasFile, `time_s,paco2_mmhg,pvco2_mmhg,sao2_pct,svo2_pct\n${line(300)}\n${line(840)}\n`);
  const events = (out: string) =>
    readFileSync(join(out, 'events.csv'), 'utf8').trim().split('\n').slice(1)
      .map((l) => l.split(','))
      .map(([t, kind]) => `${f(Number(t) / 60, 1)} min ${kind}`)
      .join('; ') || 'none';
  const plain = join(dir, `${c.scenario}-plain`);
  cli(['analyse', csv, '--out', plain]);
  const withGas = join(dir, `${c.scenario}-two-gases`);
  cli(['analyse', csv, '--gas', gasFile, '--out', withGas]);
  console.log(`| ${c.label} | ${events(plain)} | ${events(withGas)} |`);
}

// sidestream sample flow: the same infant with and without the 150 mL/min drawn before the flow sensor; the third
// row gives the analysis a flow offset of 0 (settings file), so it does not take the -Qs at end-expiratory rest for a
// zero offset and remove it
console.log('\n| infant, sidestream | VTE (mL): tool / truth | VTCO2 (mL): tool / truth | VDaw (mL): tool / truth | flow offset the tool removed (mL/s) | truth Qs × Te (mL) |');
console.log('|---|---|---|---|---|---|');
const zeroOffset = join(dir, 'zero-offset.json');
writeFileSync(zeroOffset, '{"analysis":{"flow_offset_lps":0}}\n');
for (const [flow, fixed] of [[0, false], [150, false], [150, true]] as const) {
  const csv = join(dir, `sample-${flow}.csv`);
  cli(['simulate', 'infant-sidestream-sample-flow', '--out', csv, '--seed', '1', '--set', `sample_flow_ml_min=${flow}`]);
  const t = truthWindow(csv.replace(/\.csv$/, '.truth.json'), 0, 1e9);
  const out = join(dir, `sample-${flow}-${fixed}-out`);
  cli(['analyse', csv, '--out', out, ...(fixed ? ['--settings', zeroOffset] : [])]);
  const sum = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as {
    metrics: Record<string, { median: number }>;
    flow_offset_lps: { value: number };
  };
  const m = sum.metrics;
  const label = `sample flow ${flow} mL/min${fixed ? ', offset set to 0' : ''}`;
  console.log(
    `| ${label} | ${f(m.vt_exp_ml!.median, 2)} / ${f(t.vt_exp_ml, 2)} | ${f(m.vtco2_ml!.median, 3)} / ${f(t.vtco2_ml, 3)} | ` +
      `${f(m.vd_aw_ml!.median, 2)} / ${f(t.vd_aw_ml, 2)} | ${f(1000 * sum.flow_offset_lps.value, 2)} | ${f(t.sample_loss_exp_ml ?? 0, 2)} |`,
  );
}
