// Built-in scenarios: names, validation messages and physiologically plausible true values.
// Plausibility ranges: PaCO2/PETCO2 35-45 mmHg normal, P(a-ET)CO2 2-5 mmHg in healthy anaesthetised adults
// `[published: Satoh et al. 2015 Anesthesiol Res Pract 710537]`, VD/VT ~0.2-0.35 healthy `[common practice]`
// These are sanity bounds for invented patients, not checks of a formula.
import { describe, expect, it } from 'vitest';
import { listScenarios, scenarioParams, simulateRecording, summariseBreaths } from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';

const REQUIRED = [
  'adult-healthy', 'adult-congested-region', 'infant-cardiac-shunt', 'child-sidestream', 'adult-perfusion-fall',
  'adult-stable-long', 'adult-dead-space-rise', 'adult-tidal-volume-change',
];

describe('scenario catalogue', () => {
  it('lists the required scenarios with descriptions', () => {
    const names = listScenarios().map((s) => s.name);
    for (const r of REQUIRED) expect(names).toContain(r);
    for (const s of listScenarios()) expect(s.description.length).toBeGreaterThan(20);
  });
  it('unknown names and bad overrides throw one clear message', () => {
    expect(() => scenarioParams('adult-unknown')).toThrow(/unknown scenario "adult-unknown"; valid scenarios: adult-healthy, /);
    expect(() => scenarioParams('adult-healthy', { rr_bpm: -3 })).toThrow(/rr_bpm must be >= 2/);
    expect(() => scenarioParams('adult-healthy', { delimiter: ',', decimal: ',' })).toThrow(/decimal "," needs delimiter/);
    expect(() => scenarioParams('adult-healthy', { rate_hz: 100, co2_rate_hz: 30 })).toThrow(/co2_rate_hz must divide rate_hz/);
    expect(() => scenarioParams('adult-healthy', { vt_ml: 200 })).toThrow(/phase III exists/);
  });
  it('overrides are applied and the stored defaults are not mutated', () => {
    const a = scenarioParams('adult-healthy', { minutes: 7 });
    a.events.push({ t_s: 1, param: 'vt_ml', to: 300, ramp_s: 0 });
    expect(a.minutes).toBe(7);
    expect(scenarioParams('adult-healthy').events).toEqual([]);
  });
});

describe('scenario physiology (steady 2 min, true values)', () => {
  const at = (name: string) => simulateRecording(scenarioParams(name, { minutes: 2 }), 1).truth.summary;
  it('healthy adult: normal PaCO2, small P(a-ET)CO2, VD/VT around 0.3', () => {
    const s = at('adult-healthy');
    expect(s.paco2_mmhg).toBeGreaterThan(35);
    expect(s.paco2_mmhg).toBeLessThan(45);
    expect(s.paco2_mmhg! - s.petco2_mmhg!).toBeGreaterThan(1);
    expect(s.paco2_mmhg! - s.petco2_mmhg!).toBeLessThan(5);
    expect(s.vdvt_bohr).toBeGreaterThan(0.25);
    expect(s.vdvt_enghoff).toBeLessThan(0.45);
  });
  it('congested region: alveolar dead space makes Enghoff VD/VT much larger than Bohr, gradient > 8 mmHg', () => {
    const s = at('adult-congested-region');
    expect(s.vdvt_enghoff! - s.vdvt_bohr!).toBeGreaterThan(0.15);
    expect(s.paco2_mmhg! - s.petco2_mmhg!).toBeGreaterThan(8);
  });
  it('infant with shunt: VT 25-40 mL, VDaw 8-12 mL, fast rate, PaCO2 above end-capillary by the shunt effect', () => {
    const p = scenarioParams('infant-cardiac-shunt');
    const s = at('infant-cardiac-shunt');
    expect(s.vt_insp_ml).toBeGreaterThanOrEqual(25);
    expect(s.vt_insp_ml).toBeLessThanOrEqual(40);
    expect(p.vd_aw_ml).toBeGreaterThanOrEqual(8);
    expect(p.vd_aw_ml).toBeLessThanOrEqual(12);
    expect(s.rr_bpm).toBeGreaterThan(30);
    expect(p.mode).toBe('pressure_control');
    expect(s.paco2_mmhg! - s.pa_perfused_mmhg!).toBeGreaterThan(2);
    expect(s.paco2_mmhg! - s.petco2_mmhg!).toBeGreaterThan(6);
  });
  it('child on sidestream: delay ~1.5 s and rise ~150 ms', () => {
    const p = scenarioParams('child-sidestream');
    expect(p.sensor).toBe('sidestream');
    expect(p.delay_s).toBe(1.5);
    expect(p.rise_ms).toBe(150);
  });
});

describe('events in long scenarios', () => {
  it('fall in pulmonary blood flow: VTCO2 and PETCO2 drop > 10 % with unchanged VT and RR; truth records it', () => {
    const { truth } = simulateRecording(scenarioParams('adult-perfusion-fall', { minutes: 16 }), 2);
    expect(truth.events).toHaveLength(1);
    expect(truth.events[0]).toMatchObject({ t_s: 720, kind: 'perfusion', param: 'q_l_min', from: 5, to: 1.5 });
    const before = summariseBreaths(truth.breaths.filter((b) => b.t_end_s < 720 && b.t_start_s > 420));
    const after = summariseBreaths(truth.breaths.filter((b) => b.t_start_s > 760 && b.t_start_s < 940));
    expect(after.vtco2_ml! / before.vtco2_ml!).toBeLessThan(0.9);
    expect(after.petco2_mmhg! / before.petco2_mmhg!).toBeLessThan(0.9);
    expect(Math.abs(after.vt_insp_ml! / before.vt_insp_ml! - 1)).toBeLessThan(0.02);
    expect(Math.abs(after.rr_bpm! / before.rr_bpm! - 1)).toBeLessThan(0.02);
  });
  it('dead-space rise and tidal-volume change are recorded with their kinds and act on the breaths', () => {
    const ds = simulateRecording(scenarioParams('adult-dead-space-rise', { minutes: 13 }), 2).truth;
    expect(ds.events[0]).toMatchObject({ t_s: 600, kind: 'dead_space' });
    expectClose(ds.breaths.at(-1)!.alv_dead_space_fraction, 0.3, { abs: 1e-12 });
    const vt = simulateRecording(scenarioParams('adult-tidal-volume-change', { minutes: 12 }), 2).truth;
    expect(vt.events[0]).toMatchObject({ t_s: 600, kind: 'ventilation', from: 500, to: 400 });
    const late = summariseBreaths(vt.breaths.filter((b) => b.t_start_s > 610));
    expect(late.vt_insp_ml).toBeGreaterThan(390);
    expect(late.vt_insp_ml).toBeLessThan(410);
  });
});
