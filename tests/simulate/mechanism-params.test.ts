// Parameter checks of the 'compartments' lung model and the sidestream sample flow: one clear message per mistake.
import { describe, expect, it } from 'vitest';
import { scenarioParams, validateParams, type SimParams } from '../../src/simulate/index';

const congested = (o: Partial<SimParams>) => () => scenarioParams('adult-mech-congested', o);

describe('compartment model and sample flow parameters', () => {
  it('the default single model takes no compartments', () => {
    expect(() => scenarioParams('adult-healthy', { compartments: [{ vent_share: 1, perf_share: 1, tau_s: 0.5 }] })).toThrow(
      /compartments are used only with lung_model 'compartments'/,
    );
    expect(() => scenarioParams('adult-healthy', { lung_model: 'lobes' as never })).toThrow(/lung_model must be one of "single", "compartments"/);
  });
  it('shares must add up to 1 and each compartment must be in range', () => {
    expect(congested({ compartments: [{ vent_share: 0.5, perf_share: 1, tau_s: 0.5 }] })).toThrow(/vent_share must add up to 1 \(got 0.5\)/);
    expect(congested({ compartments: [{ vent_share: 1, perf_share: 0.7, tau_s: 0.5 }] })).toThrow(/perf_share must add up to 1 \(got 0.7\)/);
    expect(congested({ compartments: [{ vent_share: 0, perf_share: 1, tau_s: 0.5 }, { vent_share: 1, perf_share: 0, tau_s: 0.5 }] })).toThrow(
      /compartment 1 .*need vent_share > 0/,
    );
    expect(congested({ compartments: [{ vent_share: 1, perf_share: 1, tau_s: 0 }] })).toThrow(/tau_s 0.02-20 s/);
    expect(congested({ compartments: [] })).toThrow(/compartments must be a list of 1 to 6/);
  });
  it('the slope and the alveolar dead space are results of the compartments, not inputs', () => {
    expect(congested({ slope3_mmhg_per_l: 8 })).toThrow(/slope3_mmhg_per_l is a result of the compartments; set it to 0 \(got 8\)/);
    expect(congested({ alv_dead_space_fraction: 0.1 })).toThrow(/alv_dead_space_fraction is a result of the compartments/);
    expect(congested({ events: [{ t_s: 10, param: 'alv_dead_space_fraction', to: 0, ramp_s: 0 }] })).toThrow(
      /events may not change alv_dead_space_fraction/,
    );
  });
  it('zone-1 inputs and the sample flow have ranges', () => {
    expect(congested({ zone1_lung_height_cm: 16, zone1_pa_level_cm: 20 })).toThrow(/zone1_pa_level_cm must be >= 0 and <= 16 \(got 20\)/);
    expect(congested({ zone1_pvr_mmhg_min_per_l: -1 })).toThrow(/zone1_pvr_mmhg_min_per_l must be >= 0/);
    expect(() => scenarioParams('adult-healthy', { sample_flow_ml_min: 900 })).toThrow(/sample_flow_ml_min must be >= 0 and <= 500 \(got 900\)/);
  });
  it('an embolism needs the compartment model, an existing compartment with blood flow to lose, and a share 0-1', () => {
    expect(() => scenarioParams('adult-healthy', { embolism_compartment: 1 })).toThrow(/need lung_model 'compartments'/);
    expect(() => scenarioParams('adult-healthy', { events: [{ t_s: 1, param: 'embolism_fraction', to: 1, ramp_s: 0 }] })).toThrow(
      /need lung_model 'compartments'/,
    );
    expect(() => scenarioParams('adult-mech-embolism', { embolism_compartment: 4 })).toThrow(/embolism_compartment must be >= 0 and <= 3 \(got 4\)/);
    expect(() => scenarioParams('adult-mech-embolism', { embolism_compartment: 1.5 })).toThrow(/whole compartment number/);
    expect(() =>
      scenarioParams('adult-mech-embolism', { events: [{ t_s: 1, param: 'embolism_fraction', to: 1.5, ramp_s: 0 }] }),
    ).toThrow(/must go to a value 0-1 \(got 1.5\)/);
    expect(() =>
      scenarioParams('adult-mech-healthy', { compartments: [{ vent_share: 1, perf_share: 1, tau_s: 0.5 }], embolism_compartment: 1 }),
    ).toThrow(/must have blood flow to lose and another perfused compartment to take it \(perf_share 1\)/);
    expect(() => scenarioParams('adult-mech-healthy', { embolism_fraction: 0.5 })).toThrow(/needs an embolism_compartment/);
  });
  it('every new scenario is valid as given', () => {
    for (const name of ['adult-mech-healthy', 'adult-mech-congested', 'infant-mech-cyanotic-shunt', 'adult-mech-low-output', 'adult-mech-embolism', 'infant-sidestream-sample-flow']) {
      expect(() => validateParams(scenarioParams(name))).not.toThrow();
    }
  });
});
