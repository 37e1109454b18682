// The `gas` section of the settings file: every constant of the blood-gas analysis (GasOptions) can be set there,
// at the top level and in a `files` pattern entry; keys and ranges are checked (one-line message naming the key);
// precedence defaults < settings file < command-line options (gasOptionsFrom), and the result's `given` list names
// what the user set.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { settingsForRecording, settingsPlan, unusedGasWarnings } from '../../src/batch/file-settings';
import { gasOptionsFrom } from '../../src/cli/gas-step';
import { analyseGas } from '../../src/gas/index';
import { defaultSettings } from '../../src/settings';
import { parseSettingsFile } from '../../src/settings-file';
import { expectClose } from '../helpers/expect-close';
import { breathSeries, makeSample } from './make-breath';

const dir = mkdtempSync(join(tmpdir(), 'phasewise-gas-settings-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** the one-line message of a settings file that is refused */
function refusal(json: unknown): string {
  try {
    parseSettingsFile(JSON.stringify(json), 's.json');
  } catch (e) {
    return (e as Error).message;
  }
  return 'accepted';
}

const EVERY_KEY = {
  window_s: 90,
  rq: 1,
  hb_o2_capacity_ml_per_g: 1.39,
  o2_dissolved_ml_per_dl_per_mmhg: 0.0031,
  end_capillary_saturation: 'one',
  alveolar_gas_form: 'simplified',
  default_pv_a_co2_mmhg: 4,
  cardiac_output_l_min: 5,
  co2_slope_k: 0.6,
  gradient_change_mmhg: 3,
  band_level: 0.95,
  analyser_sd_mmhg: 1.5,
  drift_prior_mmhg2_per_h: 2,
};

describe('settings file: gas section', () => {
  it('holds every constant of the gas analysis, at the top level and in a files pattern entry', () => {
    const file = parseSettingsFile(JSON.stringify({ gas: EVERY_KEY, files: [{ pattern: 'icu/**', gas: { rq: 0.9 } }] }), 's.json');
    expect(file.gas).toEqual(EVERY_KEY);
    expect(file.files?.[0]?.gas).toEqual({ rq: 0.9 });
  });

  it('an unknown key is a one-line error naming it', () => {
    const m = refusal({ gas: { rqq: 0.8 } });
    expect(m).toContain('gas');
    expect(m).toContain('rqq');
    expect(m.split('\n')).toHaveLength(1);
    expect(refusal({ files: [{ pattern: '*', gas: { band: 0.9 } }] })).toContain('band');
  });

  it('ranges and choices are checked, naming the key', () => {
    expect(refusal({ gas: { rq: 1.5 } })).toContain('gas.rq');
    expect(refusal({ gas: { rq: 0.5 } })).toContain('gas.rq');
    expect(refusal({ gas: { rq: 1.3 } })).toBe('accepted');
    expect(refusal({ gas: { band_level: 0.5 } })).toContain('gas.band_level');
    expect(refusal({ gas: { band_level: 1 } })).toContain('gas.band_level');
    expect(refusal({ gas: { band_level: 0.999 } })).toBe('accepted');
    expect(refusal({ gas: { end_capillary_saturation: 'curve' } })).toContain('gas.end_capillary_saturation');
    expect(refusal({ gas: { alveolar_gas_form: 'short' } })).toContain('gas.alveolar_gas_form');
    expect(refusal({ gas: { window_s: 0 } })).toContain('gas.window_s');
    expect(refusal({ gas: { cardiac_output_l_min: -1 } })).toContain('gas.cardiac_output_l_min');
    expect(refusal({ gas: { analyser_sd_mmhg: -0.1 } })).toContain('gas.analyser_sd_mmhg');
  });
});

describe('gas options: defaults < settings file < command line', () => {
  it('the file sets the constants, a command-line option beats the file, and both are listed as given', () => {
    const o = gasOptionsFrom({ gasWindow: 30, cardiacOutput: 6 }, defaultSettings(), { window_s: 90, rq: 1, cardiac_output_l_min: 4 });
    expect(o.window_s).toBe(30);
    expect(o.cardiac_output_l_min).toBe(6);
    expect(o.rq).toBe(1);
    const settings = analyseGas([], [], o).settings;
    expect(settings.window_s).toBe(30);
    expect(settings.rq).toBe(1);
    expect(settings.band_level).toBe(0.8);
    expect(settings.given).toEqual(expect.arrayContaining(['window_s', 'rq', 'cardiac_output_l_min']));
    expect(settings.given).not.toContain('band_level');
  });

  it('the barometric pressure is listed as given only when the recording settings give one (it is always passed on)', () => {
    const plain = gasOptionsFrom({}, defaultSettings());
    expect(plain.pb_mmhg).toBe(760);
    expect(analyseGas([], [], plain).settings.given).not.toContain('pb_mmhg');
    const settings = defaultSettings();
    settings.ingest.pb_mmhg = 700;
    const high = analyseGas([], [], gasOptionsFrom({}, settings)).settings;
    expect(high.pb_mmhg).toBe(700);
    expect(high.given).toContain('pb_mmhg');
  });

  it('a recording takes the top-level gas section, then the gas of each files pattern it matches', () => {
    const path = join(dir, 'patterns.json');
    writeFileSync(path, JSON.stringify({ gas: { rq: 0.9, band_level: 0.9 }, files: [{ pattern: 'icu/**', gas: { rq: 1.1 } }] }));
    const plan = settingsPlan({ settings: path });
    expect(settingsForRecording(plan, ['icu/p1.csv']).gas).toEqual({ rq: 1.1, band_level: 0.9 });
    expect(settingsForRecording(plan, ['ward/p2.csv']).gas).toEqual({ rq: 0.9, band_level: 0.9 });
    expect(settingsForRecording(settingsPlan({}), ['ward/p2.csv']).gas).toEqual({});
  });

  it('batch has no blood-gas input: a gas section is a warning naming where it is, not silently dropped', () => {
    const path = join(dir, 'batch.json');
    writeFileSync(path, JSON.stringify({ gas: { rq: 0.9 }, files: [{ pattern: 'icu/**', gas: { rq: 1.1 } }, { pattern: 'ward/**', analysis: { apparatus_ml: 10 } }] }));
    const w = unusedGasWarnings(settingsPlan({ settings: path }));
    expect(w).toHaveLength(1);
    expect(w[0]).toContain('top-level "gas" section');
    expect(w[0]).toContain('pattern "icu/**"');
    expect(w[0]).not.toContain('ward');
    expect(unusedGasWarnings(settingsPlan({}))).toEqual([]);
  });
});

// Hand calculation (derived here; equations as in tests/gas/shunt-split.test.ts: alveolar gas equation, O2 contents
// Hb x capacity x saturation + dissolved x PO2, Qs/Qt = (Cc'O2 - CaO2) / (Cc'O2 - CvO2)):
// FiO2 0.5, PB 760, PH2O 47, PaCO2 40, R 1.0: PAO2 = 0.5 x 713 - 40 x (0.5 + 0.5 / 1.0) = 316.5 mmHg.
// Capacity 1.39, dissolved 0.0031, Hb 15, Sc'O2 1 ('one'): Cc'O2 = 20.85 + 0.98115 = 21.83115;
// CaO2 (SaO2 98 %, PaO2 100) = 20.433 + 0.31 = 20.743; CvO2 (SvO2 75 %, PvO2 40) = 15.6375 + 0.124 = 15.7615;
// Qs/Qt = 1.08815 / 6.06965 = 0.179277.
// With the defaults (R 0.8, 1.34, 0.003) and Sc'O2 'one': PAO2 = 356.5 - 45 = 311.5; Cc'O2 = 20.1 + 0.9345 = 21.0345,
// CaO2 = 19.698 + 0.3 = 19.998, CvO2 = 15.075 + 0.12 = 15.195: Qs/Qt = 1.0365 / 5.8395 = 0.177498.
describe('gas section changes the shunt fraction as the hand calculation says', () => {
  const breaths = breathSeries(50, 9, { petco2_mmhg: 35, peco2_mmhg: 26, vt_exp_ml: 500, vd_aw_ml: 150, vdvt_bohr: 0.3, vtco2_ml: 20, rr_bpm: 10 });
  const sample = makeSample({ time_s: 100, paco2_mmhg: 40, fio2_pct: 50, pao2_mmhg: 100, sao2_pct: 98, svo2_pct: 75, pvo2_mmhg: 40, hb_g_dl: 15 });
  it('R 1.0, capacity 1.39, dissolved 0.0031, Sc\'O2 1 -> 0.179277; the defaults with Sc\'O2 1 -> 0.177498', () => {
    const file = parseSettingsFile(
      JSON.stringify({ gas: { rq: 1, hb_o2_capacity_ml_per_g: 1.39, o2_dissolved_ml_per_dl_per_mmhg: 0.0031, end_capillary_saturation: 'one' } }),
      's.json',
    );
    const row = analyseGas(breaths, [sample], gasOptionsFrom({}, defaultSettings(), file.gas)).rows[0]!;
    expectClose(row.pao2_alv_mmhg, 316.5, { abs: 1e-9 });
    expectClose(row.shunt_fraction, 1.08815 / 6.06965, { rel: 1e-9 });
    const only = parseSettingsFile(JSON.stringify({ gas: { end_capillary_saturation: 'one' } }), 's.json');
    const base = analyseGas(breaths, [sample], gasOptionsFrom({}, defaultSettings(), only.gas)).rows[0]!;
    expectClose(base.pao2_alv_mmhg, 311.5, { abs: 1e-9 });
    expectClose(base.shunt_fraction, 1.0365 / 5.8395, { rel: 1e-9 });
  });
});
