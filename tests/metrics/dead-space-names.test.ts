// Every dead-space quantity has a name of its own in every output: alveolar dead space by Bohr (Bohr − airway, in
// breaths.csv) and by Enghoff (physiological − airway, in gas.csv) are different quantities (Fletcher R, Jonson B,
// Cumming G, Brew J 1981, "The concept of deadspace with special reference to the single breath test for carbon
// dioxide", Br J Anaesth 53:77-88), so no column name may stand for both.
import { describe, expect, it } from 'vitest';
import { BREATH_COLUMNS, GAS_METRICS } from '../../src/metrics/registry';

describe('dead-space column names', () => {
  const gasKeys: string[] = GAS_METRICS.map((m) => m.key);
  const breathKeys: string[] = [...BREATH_COLUMNS];
  it('no alveolar dead-space column name is shared by breaths.csv and gas.csv', () => {
    const shared = breathKeys.filter((k) => k.startsWith('vd_alv') && gasKeys.includes(k));
    expect(shared).toEqual([]);
  });
  it('each alveolar dead-space column names its method', () => {
    for (const k of [...breathKeys, ...gasKeys].filter((x) => x.startsWith('vd_alv'))) expect(k).toMatch(/^vd_alv_(bohr|enghoff)_/);
  });
});
