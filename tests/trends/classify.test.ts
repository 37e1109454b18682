// The rule table of src/trends/RULES.md on made-up change patterns (our rules; no outside values).
import { describe, expect, it } from 'vitest';
import type { GasComparison } from '../../src/trends/blood-gas';
import { classifyPattern, signalDelta, type ChangePattern } from '../../src/trends/classify';
import { trendSettings } from '../../src/trends/settings';

const o = trendSettings();

/** a pattern from relative changes (%) of V'CO2, PETCO2, V'E and absolute changes of the others */
function pattern(p: { vco2?: number; pet?: number; ve?: number; vdvt?: number; fi?: number; ok?: number; delay?: number }): ChangePattern {
  const rel = (base: number, pct = 0) => signalDelta(base, base * (1 + pct / 100));
  const abs = (base: number, d = 0) => signalDelta(base, base + d);
  return {
    vco2_ml_min: rel(200, p.vco2),
    petco2_mmhg: rel(36, p.pet),
    ve_l_min: rel(7, p.ve),
    vdvt_bohr: abs(0.3, p.vdvt),
    fico2_mmhg: abs(0, p.fi),
    ok_share: abs(1, p.ok),
    delay_s: abs(0.1, p.delay),
  };
}
const gas = (share: number): GasComparison => ({
  before: { time_s: 300, paco2_mmhg: 40 },
  after: { time_s: 900, paco2_mmhg: 40 - 7 * share },
  petco2_before_mmhg: 36,
  petco2_after_mmhg: 29,
  arterial_share: share,
});

describe('classifyPattern', () => {
  it('R1 rebreathing: inspired PCO2 up 4 mmHg (wins over a fall in ok share)', () => {
    const c = classifyPattern(pattern({ fi: 4, ok: -1 }), null, o);
    expect(c.kind).toBe('rebreathing');
    expect(c.signal).toBe('fico2_mmhg');
    expect(c.confidence).toBe(1);
  });
  it('R2 sensor: ok share 1 -> 0.3, or the delay jumps 0.5 s', () => {
    expect(classifyPattern(pattern({ ok: -0.7, pet: -60 }), null, o).kind).toBe('sensor');
    const d = classifyPattern(pattern({ delay: 0.5 }), null, o);
    expect(d.kind).toBe('sensor');
    expect(d.signal).toBe('delay_s');
  });
  it('R3 ventilation: V\'E -20 % with PETCO2 +7 % (or steady); same-way PETCO2 is unclassified', () => {
    const c = classifyPattern(pattern({ ve: -20, pet: 7, vco2: -23, vdvt: 0.08 }), null, o);
    expect(c.kind).toBe('ventilation');
    expect(c.signal).toBe('ve_l_min');
    expect(c.confidence).toBeGreaterThan(0.9);
    expect(classifyPattern(pattern({ ve: 15, pet: 1 }), null, o).kind).toBe('ventilation');
    expect(classifyPattern(pattern({ ve: 15, pet: 10, vco2: 25 }), null, o).kind).toBe('unclassified');
  });
  it('R4 dead space from expired gas: Bohr VD/VT +0.08 with steady ventilation', () => {
    const c = classifyPattern(pattern({ vdvt: 0.08, pet: -5, vco2: -6 }), null, o);
    expect(c.kind).toBe('dead_space');
    expect(c.signal).toBe('vdvt_bohr');
  });
  it('R5 with a blood gas: arterial follows end-tidal -> perfusion; arterial holds -> dead_space', () => {
    const p = pattern({ vco2: -22, pet: -21, ve: 0.5 });
    const perf = classifyPattern(p, gas(1.05), o);
    expect(perf.kind).toBe('perfusion');
    expect(perf.signal).toBe('vco2_ml_min');
    expect(perf.confidence).toBeGreaterThan(0.9);
    const ds = classifyPattern(p, gas(-0.4), o);
    expect(ds.kind).toBe('dead_space');
    expect(ds.signal).toBe('petco2_mmhg');
    // near the split the confidence drops to about 0.5
    expect(classifyPattern(p, gas(0.52), o).confidence).toBeLessThan(0.55);
  });
  it('R5 without a blood gas: unclassified by default, perfusion (confidence <= 0.5) when asked', () => {
    const p = pattern({ vco2: -22, pet: -21 });
    const c = classifyPattern(p, null, o);
    expect(c.kind).toBe('unclassified');
    expect(c.note).toMatch(/look alike/);
    const forced = classifyPattern(p, null, trendSettings({ fall_without_gas: 'perfusion' }));
    expect(forced.kind).toBe('perfusion');
    expect(forced.confidence).toBeLessThanOrEqual(0.5);
  });
  it('R6: PETCO2 falls alone (V\'CO2 and ventilation steady) -> unclassified', () => {
    expect(classifyPattern(pattern({ pet: -15 }), null, o).kind).toBe('unclassified');
  });
  it('V\'CO2 and PETCO2 moving opposite ways with steady ventilation -> unclassified', () => {
    expect(classifyPattern(pattern({ vco2: 20, pet: -15 }), null, o).kind).toBe('unclassified');
  });
  it('missing values never match a rule by accident', () => {
    const p = pattern({});
    for (const k of Object.keys(p) as (keyof ChangePattern)[]) p[k] = signalDelta(NaN, NaN);
    expect(classifyPattern(p, null, o).kind).toBe('unclassified');
  });
});
