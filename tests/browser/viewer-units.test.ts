// Unit tests of the viewer's pure modules (run in Node, no browser): the shapes drawn on the breath view agree with
// the core's own numbers, the overview decimation keeps every extreme, the reviewer's exclusions, the settings form
// and the geometry packing. Internal-consistency checks on a simulated sample file, not checks of any formula
// against published values (those live in tests/published/).

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  applySettings,
  composeOutputs,
  createAnalyser,
  defaultSettings,
  GAS_DEFAULTS,
  detExp,
  detLog,
  excludedStatus,
  exclusionNote,
  exportRows,
  parseSettingsFile,
  readRecordingText,
  reasonSlug,
  reviewedRows,
  SETTING_GROUPS,
  USER_EXCLUDED,
  type BreathGeometry,
  type BreathRow,
} from '../../src/index';
import { expectClose } from '../helpers/expect-close';
import { fletcherRegions, fowlerAreas, polygonArea } from '../../web/breath-shapes';
import { breathCurve, GeometryWriter } from '../../web/geometry-store';
import { changedKeys, changedSettingsFile, fieldSpecs, parseField, settingsFileText, settingsFromFile, withSetting } from '../../web/settings-form';
import { gasFieldId, gasFieldSpecs, gasSettingsFromTexts } from '../../web/gas-settings';
import { packRows, unpackRows } from '../../web/row-columns';
import { SignalStore } from '../../web/signal-store';
import { ROOT } from './harness';
import { usableForSummary } from '../../src/analyse/quality';
import { statusClass } from '../../web/palette';

function analyseSample(name: string): { rows: BreathRow[]; geometry: BreathGeometry[] } {
  const settings = defaultSettings();
  const text = readFileSync(join(ROOT, 'sample-waveforms', name), 'utf8');
  const geometry: BreathGeometry[] = [];
  const analyser = createAnalyser(settings, (e) => geometry.push(e.decomposition.geometry));
  const { blocks } = readRecordingText(text, settings.ingest, settings.analysis.min_rate_hz, name);
  for (const b of blocks) analyser.push(b);
  return { rows: analyser.finish().breaths, geometry };
}

const sample = analyseSample('adult-healthy.csv');

describe('breath view shapes agree with the core', () => {
  const ok = sample.rows.map((r, i) => [r, sample.geometry[i]!] as const).filter(([r]) => r.status === 'ok' && Number.isFinite(r.vd_aw_ml));

  it('has breaths to check', () => {
    expect(ok.length).toBeGreaterThan(30);
  });

  it("Fowler's two shaded areas are equal at the core's V* (to 0.5 % of the CO2 area)", () => {
    for (const [r, g] of ok) {
      const a = fowlerAreas(g, r.vd_aw_ml, g.fowler_limit_ml)!;
      expect(a).not.toBeNull();
      const p = polygonArea(a.p);
      const q = polygonArea(a.q);
      expect(p).toBeGreaterThan(100);
      // the tolerance is relative to the whole expired CO2 area (both polygons are small next to it)
      expect(Math.abs(p - q)).toBeLessThan(0.005 * r.peco2_mmhg * r.vt_exp_ml);
    }
  });

  it("Fletcher's X + Y + Z tile PaCO2 x VT, X is the CO2 area and Z = PaCO2 x V* (Fletcher et al. 1981 relations)", () => {
    for (const [r, g] of ok.slice(0, 10)) {
      let top = 0;
      for (const v of g.co2_mmhg) top = Math.max(top, v);
      const paco2 = top + 5;
      const reg = fletcherRegions(g, r.vd_aw_ml, r.vt_exp_ml, paco2)!;
      const x = polygonArea(reg.x);
      const y = polygonArea(reg.y);
      const z = polygonArea(reg.z);
      expectClose(x + y + z, paco2 * r.vt_exp_ml, { rel: 0.01 });
      expectClose(x, r.peco2_mmhg * r.vt_exp_ml, { rel: 0.01 });
      expectClose(z, paco2 * r.vd_aw_ml, { rel: 0.02 });
    }
  });

  it('gives no shapes without V* or a line', () => {
    const g = sample.geometry[0]!;
    expect(fowlerAreas(g, NaN, 500)).toBeNull();
    expect(fletcherRegions({ ...g, line_intercept_mmhg: NaN }, 150, 500, 40)).toBeNull();
    expect(fletcherRegions(g, 150, 500, NaN)).toBeNull();
  });
});

describe('geometry packing', () => {
  it('returns each breath unchanged (to Float32 precision)', () => {
    const w = new GeometryWriter();
    for (const g of sample.geometry) w.add(g);
    const packed = w.pack();
    expect(packed.count).toBe(sample.geometry.length);
    for (const i of [0, 7, sample.geometry.length - 1]) {
      const g = sample.geometry[i]!;
      const c = breathCurve(packed, i)!;
      expect(c.v_ml.length).toBe(g.v_ml.length);
      expect(c.co2_mmhg[5]).toBe(Math.fround(g.co2_mmhg[5]!));
      expect(c.co2_raw_mmhg[c.co2_raw_mmhg.length - 1]).toBe(Math.fround(g.co2_raw_mmhg[g.co2_raw_mmhg.length - 1]!));
      expect(c.line_slope_mmhg_per_ml).toBe(g.line_slope_mmhg_per_ml);
      expect(c.fowler_limit_ml).toBe(g.fowler_limit_ml);
    }
    expect(breathCurve(packed, -1)).toBeNull();
    expect(breathCurve(packed, packed.count)).toBeNull();
  });
});

describe('deterministic exp and log (worker)', () => {
  const ulps = (a: number, b: number): number => {
    const d = new DataView(new ArrayBuffer(16));
    d.setFloat64(0, a);
    d.setFloat64(8, b);
    return Math.abs(Number(d.getBigInt64(0) - d.getBigInt64(8)));
  };
  let seed = 99;
  const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);

  it('stay within 1 ulp of the host Math.exp / Math.log (100,000 arguments each)', () => {
    let worstExp = 0;
    let worstLog = 0;
    for (let i = 0; i < 100_000; i++) {
      const x = (rnd() - 0.5) * 1400;
      worstExp = Math.max(worstExp, ulps(detExp(x), Math.exp(x)));
      const y = 10 ** ((rnd() - 0.5) * 600);
      worstLog = Math.max(worstLog, ulps(detLog(y), Math.log(y)));
    }
    expect(worstExp).toBeLessThanOrEqual(1);
    expect(worstLog).toBeLessThanOrEqual(1);
  });

  it('give the special values of the ECMAScript rules and known logarithms', () => {
    expect(detExp(0)).toBe(1);
    expect(Object.is(detExp(-0), 1)).toBe(true);
    expect(detExp(Infinity)).toBe(Infinity);
    expect(detExp(-Infinity)).toBe(0);
    expect(detExp(800)).toBe(Infinity);
    expect(detExp(-800)).toBe(0);
    expect(detExp(NaN)).toBeNaN();
    expect(ulps(detExp(1), Math.E)).toBeLessThanOrEqual(1); // fdlibm's e^1 is 1 ulp above the double nearest e
    expect(detLog(1)).toBe(0);
    expect(detLog(0)).toBe(-Infinity);
    expect(detLog(-1)).toBeNaN();
    expect(detLog(Infinity)).toBe(Infinity);
    expect(detLog(NaN)).toBeNaN();
    expect(detLog(2)).toBe(0.6931471805599453); // the double nearest ln 2
    expect(detLog(Math.E)).toBe(1);
    expectClose(detLog(5e-324), -744.4400719213812, { rel: 1e-15 }); // ln(2^-1074) = -1074 ln 2
  });
});

describe('breath rows packed by column', () => {
  it('come back identical (every number bit for bit, NaN included, strings, flag lists, key order)', () => {
    const rows = sample.rows.map((r, i) => (i === 3 ? { ...r, flags: ['leak', 'outlier'], status: 'leak+outlier', vd_aw_ml: -0 } : r));
    const back = unpackRows(structuredClone(packRows(rows)));
    expect(back.length).toBe(rows.length);
    for (let i = 0; i < rows.length; i++) {
      const a = rows[i] as unknown as Record<string, unknown>;
      const b = back[i] as unknown as Record<string, unknown>;
      expect(Object.keys(b)).toEqual(Object.keys(a));
      for (const k of Object.keys(a)) {
        if (typeof a[k] === 'number') expect(Object.is(a[k], b[k]), `${i} ${k}`).toBe(true);
        else expect(b[k]).toEqual(a[k]);
      }
    }
    expect(unpackRows(packRows([]))).toEqual([]);
  });
});

describe('overview decimation', () => {
  const n = 200_000;
  const t = new Float64Array(n);
  const f = new Float64Array(n);
  const c = new Float64Array(n);
  let seed = 7;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  for (let i = 0; i < n; i++) {
    t[i] = i / 100;
    f[i] = Math.sin(i / 50) + 0.3 * (rnd() - 0.5);
    c[i] = 20 + 20 * Math.sin(i / 70) + rnd();
  }
  f[123_456] = 9; // a spike the display must not lose
  c[50_000] = NaN; // a gap
  f[50_000] = NaN;
  const store = new SignalStore(1000); // deliberately small: forces growth
  for (let i = 0; i < n; i += 4096) store.append(t.subarray(i), f.subarray(i), c.subarray(i), Math.min(4096, n - i));
  store.finalize();

  it('returns raw samples with the sign and offset applied when they fit', () => {
    const w = store.window(10, 12, 800, -1, 0.25);
    expect(w.decimated).toBe(false);
    expect(w.t_s[0]).toBeLessThanOrEqual(10);
    expect(w.t_s[w.t_s.length - 1]).toBeGreaterThanOrEqual(12);
    const i = w.t_s.indexOf(11);
    expect(w.flow_lps[i]).toBeCloseTo(-(Math.fround(f[1100]!) - 0.25), 6);
  });

  it('keeps the minimum and maximum of every pixel column (checked against a brute-force scan)', () => {
    const w = store.window(0, 2000, 700, 1, 0);
    expect(w.decimated).toBe(true);
    expect(w.t_s.length).toBe(1400);
    let allMax = -Infinity;
    for (const v of w.flow_lps) if (v !== null && v > allMax) allMax = v;
    expect(allMax).toBe(Math.fround(9));
    for (let k = 0; k < w.t_s.length; k += 2) {
      const a = Math.round(w.t_s[k]! * 100);
      const b = Math.round(w.t_s[k + 2] !== undefined ? w.t_s[k + 2]! * 100 : n);
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = a; i < b; i++) {
        const v = Math.fround(f[i]!);
        if (!Number.isNaN(v)) {
          lo = Math.min(lo, v);
          hi = Math.max(hi, v);
        }
      }
      expect(w.flow_lps[k]).toBe(lo);
      expect(w.flow_lps[k + 1]).toBe(hi);
    }
    for (let k = 1; k < w.t_s.length; k++) expect(w.t_s[k]!).toBeGreaterThan(w.t_s[k - 1]!);
  });

  it('reports the overall ranges', () => {
    const r = store.ranges();
    expect(r.flow[1]).toBe(Math.fround(9));
    expect(r.co2[0]).toBeGreaterThan(-1);
    expect(r.co2[1]).toBeLessThan(42);
  });
});

describe('outputs', () => {
  it('never change the analyser rows (exclusions and gas work on copies)', () => {
    const settings = defaultSettings();
    const text = readFileSync(join(ROOT, 'sample-waveforms', 'adult-healthy.csv'), 'utf8');
    const analyser = createAnalyser(settings);
    const read = readRecordingText(text, settings.ingest, settings.analysis.min_rate_hz, 'adult-healthy.csv');
    for (const b of read.blocks) analyser.push(b);
    const core = analyser.finish();
    const before = JSON.stringify(core.breaths);
    const gas = { file: 'g.csv', rejected: [], samples: [{ line: 2, time_s: 60, paco2_mmhg: 42, pao2_mmhg: NaN, sao2_pct: NaN, svo2_pct: NaN, pvco2_mmhg: NaN, pvo2_mmhg: NaN, hb_g_dl: NaN, fio2_pct: NaN, temp_c: NaN }] };
    const o = composeOutputs(core, read.report, settings, new Set(), new Map([[1, 'cough']]), gas);
    expect(JSON.stringify(core.breaths)).toBe(before);
    expect(o.rows[1]!.status).toBe('excluded_by_user:cough');
    const late = o.rows.findIndex((r) => r.t_start_s >= 60);
    expect(Number.isFinite(o.rows[late]!.vdvt_enghoff)).toBe(true);
    expect(Number.isFinite(o.rows[0]!.vdvt_enghoff)).toBe(false);
    expect(o.summary.breaths.excluded_by_reason.excluded_by_user).toBe(1);
    expect(exportRows(core, settings, new Map(), null)).toBe(core.breaths);
  });
});

describe("reviewer's exclusions", () => {
  const rows = sample.rows;

  it('marks only the excluded breaths and leaves the analysis rows untouched', () => {
    const before = JSON.stringify(rows);
    const ex = new Map([[2, 'cough'], [5, 'Tube moved!']]);
    const out = reviewedRows(rows, ex);
    expect(JSON.stringify(rows)).toBe(before);
    expect(out[2]!.status).toBe('excluded_by_user:cough');
    expect(out[5]!.status).toBe('excluded_by_user:tube_moved');
    expect(out[5]!.flags).toContain(USER_EXCLUDED);
    expect(out[3]).toBe(rows[3]);
    expect(reviewedRows(rows, new Map())).toBe(rows);
    expect(exclusionNote(rows, ex)).toBe('2 breaths excluded by hand in the viewer: breaths 3 (cough), 6 (tube_moved)');
    expect(exclusionNote(rows, new Map())).toBeNull();
  });

  it('keeps an automatic status in front of the reviewer tag', () => {
    expect(excludedStatus({ ...rows[0]!, status: 'leak+outlier' }, 'artefact')).toBe('leak+outlier+excluded_by_user:artefact');
    expect(reasonSlug('  ')).toBe('other');
    expect(reasonSlug('a,b"c')).toBe('a_b_c');
  });

  it('a caution breath excluded by hand loses its caution: prefix and leaves the summaries', () => {
    const st = excludedStatus({ ...rows[0]!, status: 'caution:leak' }, 'cough');
    expect(st).toBe('leak+excluded_by_user:cough');
    expect(usableForSummary({ status: st })).toBe(false);
    expect(statusClass(st)).toBe('excluded');
    expect([statusClass('ok'), statusClass('caution:leak'), statusClass('no_fowler+leak')]).toEqual(['ok', 'caution', 'flagged']);
  });
});

describe('settings form', () => {
  it('offers every setting of every group', () => {
    const keys = new Set(fieldSpecs().map((s) => `${s.group}.${s.key}`));
    const d = defaultSettings();
    for (const g of SETTING_GROUPS) for (const k of Object.keys(d[g])) expect(keys.has(`${g}.${k}`), `${g}.${k}`).toBe(true);
  });

  it('writes only the changed keys, and the CLI reading them back gets the same settings and `given` set', () => {
    let s = defaultSettings();
    expect(changedKeys(s).size).toBe(0);
    s = withSetting(s, 'analysis', 'apparatus_ml', 12);
    s = withSetting(s, 'ingest', 'delimiter', parseField(fieldSpecs().find((f) => f.key === 'delimiter')!, 'tab'));
    s = withSetting(s, 'analysis', 'paco2_mmhg', 41);
    const file = parseSettingsFile(JSON.stringify(changedSettingsFile(s)), 'x.json');
    const back = defaultSettings();
    const given = new Set<string>();
    applySettings(back, file, given);
    expect(back).toEqual(s);
    expect([...given].sort()).toEqual([...changedKeys(s)].sort());
    expect(s.ingest.delimiter).toBe('\t');
  });

  it('parses form text: empty is auto for nullable keys, refused otherwise', () => {
    const spec = (k: string) => fieldSpecs().find((f) => f.key === k)!;
    expect(parseField(spec('paco2_mmhg'), '')).toBeNull();
    expect(parseField(spec('paco2_mmhg'), '40,5')).toBe(40.5);
    expect(parseField(spec('apparatus_ml'), '')).toBeUndefined();
    expect(parseField(spec('apparatus_ml'), 'abc')).toBeUndefined();
    expect(parseField(spec('bohr_inspired_term'), false)).toBe(false);
  });
});

describe('blood-gas constants in the sidebar', () => {
  it('offers every key of GasOptions the settings file takes, with the defaults of GAS_DEFAULTS', () => {
    expect(gasFieldSpecs().map((s) => s.key).sort()).toEqual(Object.keys(GAS_DEFAULTS).concat('cardiac_output_l_min').sort());
    expect(gasFieldSpecs().find((s) => s.key === 'end_capillary_saturation')!.options.sort()).toEqual(['odc', 'one']);
    expect(gasFieldId('window_s')).toBe('gas-window');
  });

  it('reads field texts with the settings file\'s checks: empty = default, a bad value is named and left out', () => {
    const r = gasSettingsFromTexts({ rq: '1,0', band_level: '0.95', end_capillary_saturation: 'one', window_s: '', analyser_sd_mmhg: '-1', co2_slope_k: 'x' });
    expect(r.gas).toEqual({ rq: 1, band_level: 0.95, end_capillary_saturation: 'one' });
    expect(r.invalid.sort()).toEqual(['analyser_sd_mmhg', 'co2_slope_k']);
    expect(r.problem).toMatch(/^blood-gas setting co2_slope_k: /);
    expect(gasSettingsFromTexts({ band_level: '0.5' }).problem).toMatch(/band_level/);
  });

  it('the exported settings file carries them as `gas`, and loading it gives them back', () => {
    const s = withSetting(defaultSettings(), 'analysis', 'apparatus_ml', 12);
    const text = settingsFileText(s, { rq: 1, band_level: 0.95 });
    expect(JSON.parse(text)).toEqual({ analysis: { apparatus_ml: 12 }, gas: { rq: 1, band_level: 0.95 } });
    expect(settingsFromFile(text, 'x.json').gas).toEqual({ rq: 1, band_level: 0.95 });
    expect(JSON.parse(settingsFileText(s))).toEqual({ analysis: { apparatus_ml: 12 } });
  });
});

describe('the PaCO2 line of the breath view', () => {
  // The line must be the PaCO2 the breath's Enghoff values use: with temp_c and the default paco2_temperature
  // 'corrected', 40 mmHg at 37 °C is 40 x 10^(0.019 x (33 - 37)) = 33.58 mmHg at 33 °C (Nunn et al. 1965; derived
  // here), and the measured 40 with paco2_temperature 'measured'.
  const row = { ...({} as BreathRow), t_start_s: 100 } as BreathRow;
  const sample = { line: 2, time_s: 50, paco2_mmhg: 40, temp_c: 33, pao2_mmhg: NaN, sao2_pct: NaN, svo2_pct: NaN, pvco2_mmhg: NaN, pvo2_mmhg: NaN, hb_g_dl: NaN, fio2_pct: NaN };
  it('follows the temperature rule of the gas settings', async () => {
    const { paco2ForBreath } = await import('../../web/gas');
    expectClose(paco2ForBreath(row, [sample], defaultSettings())!.mmhg, 40 * Math.pow(10, 0.019 * (33 - 37)), { abs: 1e-9 });
    expectClose(paco2ForBreath(row, [sample], defaultSettings(), 'measured')!.mmhg, 40, { abs: 1e-9 });
  });
});
