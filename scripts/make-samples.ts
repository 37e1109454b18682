// Regenerates sample-waveforms/*.csv, their *.truth.json files and sample-waveforms/README.md from the simulator.
// Run from the repository root (tsx is not a project dependency; esbuild is):
//   npx esbuild scripts/make-samples.ts --bundle --platform=node --format=cjs --outfile=dist/make-samples.cjs \
//     --log-level=warning && node dist/make-samples.cjs
// (or `npx tsx scripts/make-samples.ts` where tsx is available). Deterministic: same files every run.
import { mkdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { simulateToFiles } from '../src/cli/simulate-command';
import { scenarioParams, summariseBreaths, type SimParams, type Truth } from '../src/simulate/index';

interface Sample {
  file: string;
  scenario: string;
  seed: number;
  overrides: Partial<SimParams>;
  format: string;
  lookFor: string;
}

const SAMPLES: Sample[] = [
  {
    file: 'adult-healthy.csv',
    scenario: 'adult-healthy',
    seed: 101,
    overrides: { minutes: 3 },
    format: 'comma, decimal point, `time_s,flow_lps,co2_mmhg`, expiration positive, 100 Hz',
    lookFor: 'Reference: square inspiratory flow with pause, passive expiration, flat-ish phase III; PETCO2 a little below PaCO2.',
  },
  {
    file: 'adult-congested-region.csv',
    scenario: 'adult-congested-region',
    seed: 102,
    overrides: {
      minutes: 3, delimiter: ';', decimal: ',', flow_unit: 'L/min', co2_unit: 'kPa', header_style: 'units', preamble_lines: 3,
    },
    format: 'semicolon, decimal comma, `Time (s);Flow (L/min);CO2 [kPa]`, 3 preamble lines, 100 Hz',
    lookFor: 'High alveolar dead space: Enghoff VD/VT far above Bohr, a large PaCO2-PETCO2 gradient, steep phase III; decelerating inspiratory flow.',
  },
  {
    file: 'infant-cardiac-shunt.csv',
    scenario: 'infant-cardiac-shunt',
    seed: 103,
    overrides: {
      minutes: 2, rate_hz: 200, delimiter: '\t', flow_unit: 'mL/s', expiration_sign: 'negative', time_format: 'ms',
      extra_columns: ['pressure', 'volume'],
    },
    format: 'tab, `time_ms, flow_mlps, co2_mmhg, paw_cmh2o, volume_ml`, expiration NEGATIVE, 200 Hz',
    lookFor: 'Small VT (~28 mL) at 40/min; the shunt raises PaCO2 above end-capillary PCO2, so PaCO2-PETCO2 is large although VDaw is small.',
  },
  {
    file: 'child-sidestream.csv',
    scenario: 'child-sidestream',
    seed: 104,
    overrides: { minutes: 3, co2_rate_hz: 50, co2_unit: '%', time_format: 'iso', preamble_lines: 5 },
    format: 'comma, ISO 8601 time, `flow_lps` at 100 Hz, `co2_pct` (ambient: % of PB 760) at 50 Hz with blank cells between, 5 preamble lines',
    lookFor: 'CO2 lags flow by 1.5 s and rises slowly (150 ms); align before analysis. CO2 cells are blank on every other row.',
  },
  {
    file: 'adult-perfusion-fall.csv',
    scenario: 'adult-perfusion-fall',
    seed: 105,
    overrides: { minutes: 30, rate_hz: 50 },
    format: 'comma, decimal point, `time_s,flow_lps,co2_mmhg`, 50 Hz, 30 min',
    lookFor: 'At 12:00 pulmonary blood flow falls 5.0 -> 1.5 L/min: VTCO2 and PETCO2 drop with unchanged ventilation, then creep back as body CO2 stores fill.',
  },
  {
    file: 'adult-spontaneous-messy.csv',
    scenario: 'adult-spontaneous',
    seed: 106,
    overrides: {
      minutes: 3, time_format: 'clock', line_ending: '\r\n', damaged_line_fraction: 0.002,
      gaps: [
        { t_s: 61.3, duration_s: 2.5, kind: 'rows' },
        { t_s: 120.7, duration_s: 1.2, kind: 'blank' },
      ],
    },
    format: 'comma, clock time `HH:MM:SS.fff`, CRLF line ends, a 2.5 s gap without rows at 61.3 s, blank cells 120.7-121.9 s, damaged lines',
    lookFor: 'Irregular spontaneous breaths with end-expiratory pauses and cardiogenic oscillations; the reader must skip damaged lines and split breaths at gaps.',
  },
];

const OUT_DIR = 'sample-waveforms';

function fmt(x: number | undefined, digits: number): string {
  return x === undefined || !Number.isFinite(x) ? '-' : x.toFixed(digits);
}

function trueValues(truth: Truth): string {
  const parts = (s: Record<string, number>): string =>
    `VDaw ${fmt(s.vd_aw_ml, 1)} mL, PETCO2 ${fmt(s.petco2_mmhg, 1)}, PaCO2 ${fmt(s.paco2_mmhg, 1)} mmHg, ` +
    `VD/VT Bohr ${fmt(s.vdvt_bohr, 3)} / Enghoff ${fmt(s.vdvt_enghoff, 3)}`;
  const event = truth.events[0];
  if (!event) return parts(truth.summary);
  const before = summariseBreaths(truth.breaths.filter((b) => b.t_end_s <= event.t_s));
  const last = truth.breaths.at(-1)?.t_end_s ?? 0;
  const after = summariseBreaths(truth.breaths.filter((b) => b.t_start_s >= event.t_s + event.ramp_s && b.t_start_s < event.t_s + event.ramp_s + 120));
  const end = summariseBreaths(truth.breaths.filter((b) => b.t_start_s >= last - 120));
  return `before: ${parts(before)}; first 2 min after: ${parts(after)}; last 2 min: ${parts(end)}`;
}

mkdirSync(OUT_DIR, { recursive: true });
const rows: string[] = [];
let totalBytes = 0;
for (const s of SAMPLES) {
  const params = scenarioParams(s.scenario, s.overrides);
  const path = join(OUT_DIR, s.file);
  const truth = simulateToFiles(params, s.seed, path);
  const bytes = statSync(path).size + statSync(path.replace(/\.csv$/, '.truth.json')).size;
  totalBytes += bytes;
  rows.push(`| \`${s.file}\` | ${s.scenario} (seed ${s.seed}) | ${s.format} | ${s.lookFor} | ${trueValues(truth)} |`);
  process.stdout.write(`${path}: ${truth.breath_count} breaths, ${(bytes / 1e6).toFixed(2)} MB with truth\n`);
}

const readme = `# Sample waveforms

Simulated recordings of invented patients, made by the phasewise simulator (\`src/simulate/\`, model in
DEVELOPERS.md, "Simulator model"). They are not clinical data. Each \`FILE.csv\` has a \`FILE.truth.json\` beside it with
all simulation parameters, the seed, the true values of every complete breath (times, volumes, airway/alveolar/
physiologic dead space, PaCO2, PETCO2, PECO2, VTCO2, phase III slope, shunt fraction), their medians (\`summary\`),
the events and, for the CSV, export statistics (line numbers of damaged lines, rows in gaps).

True values below are medians over all complete breaths of the noise-free model (PETCO2 = true curve at end of
expiration; Bohr with the true phase III line at mid phase III; Enghoff with the true PaCO2). Pressures in mmHg.

| file | scenario | format | what to look for | true values |
|---|---|---|---|---|
${rows.join('\n')}

Regenerate (deterministic) from the repository root:

\`\`\`
npx esbuild scripts/make-samples.ts --bundle --platform=node --format=cjs --outfile=dist/make-samples.cjs --log-level=warning
node dist/make-samples.cjs
\`\`\`

Make other recordings with \`phasewise simulate SCENARIO --out FILE.csv [--minutes N] [--seed N] [--set key=value]\`;
\`phasewise simulate --list\` describes the scenarios.
`;
writeFileSync(join(OUT_DIR, 'README.md'), readme);
process.stdout.write(`total ${(totalBytes / 1e6).toFixed(2)} MB\n`);
