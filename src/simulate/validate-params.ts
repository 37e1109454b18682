import { EVENT_KIND_OF, type SimParams } from './params';

/** Smallest tidal volume that still has phases I-III (see checkCurveGeometry), mL. */
export function minimumTidalVolume(p: SimParams): number {
  return (p.vd_aw_ml + 6 * p.sigma_ml + (p.front_shape === 'skewed' ? 4 * p.front_tail_ml : 0)) / (1 - p.leak_fraction);
}

/** Throws unless the named parameter is a finite number within lo..hi (lo excluded when loOpen). */
function checkNumber(p: SimParams, name: keyof SimParams, lo: number, hi: number, loOpen = false): void {
  const v = p[name] as unknown;
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new TypeError(`simulate: ${name} must be a number (got ${String(v)})`);
  if ((loOpen ? v <= lo : v < lo) || v > hi) {
    throw new RangeError(`simulate: ${name} must be ${loOpen ? '>' : '>='} ${lo} and <= ${hi} (got ${v})`);
  }
}

/** Throws unless the named parameter is one of the allowed values. */
function checkOneOf(p: SimParams, name: keyof SimParams, allowed: readonly unknown[]): void {
  if (!allowed.includes(p[name])) {
    throw new RangeError(`simulate: ${name} must be one of ${allowed.map((a) => JSON.stringify(a)).join(', ')} (got ${JSON.stringify(p[name])})`);
  }
}

/** Recording length, patient size and the ventilation pattern. */
function checkVentilation(p: SimParams): void {
  checkNumber(p, 'minutes', 0, 7 * 24 * 60, true);
  checkNumber(p, 'weight_kg', 0.3, 300, true);
  checkOneOf(p, 'mode', ['volume_control', 'pressure_control', 'spontaneous']);
  checkNumber(p, 'vt_ml', 2, 3000, true);
  checkNumber(p, 'rr_bpm', 2, 150);
  checkNumber(p, 'ie_ratio', 0.2, 6);
  checkNumber(p, 'pause_fraction', 0, 0.6);
  checkNumber(p, 'rc_s', 0.02, 5);
  checkNumber(p, 'flow_edge_ms', 1, 300);
  checkNumber(p, 'vt_cv', 0, 0.5);
  checkNumber(p, 'rr_cv', 0, 0.5);
}

/** Shape of the expired CO2 curve, gas exchange and lung mechanics. */
function checkCurveAndGasExchange(p: SimParams): void {
  checkNumber(p, 'vd_aw_ml', 0.5, 1000);
  checkNumber(p, 'sigma_ml', 0.05, 200, true);
  checkOneOf(p, 'front_shape', ['symmetric', 'skewed']);
  checkNumber(p, 'front_tail_ml', 0, 200);
  checkNumber(p, 'slope3_mmhg_per_l', -200, 3000);
  checkNumber(p, 'alv_dead_space_fraction', 0, 0.9);
  checkNumber(p, 'alv_mixing_tau_s', 0, 600);
  checkNumber(p, 'vco2_ml_min', 1, 2000);
  checkNumber(p, 'q_l_min', 0.05, 40);
  checkNumber(p, 'shunt_fraction', 0, 0.9);
  checkNumber(p, 'co2_slope_ml_dl_mmhg', 0.1, 5);
  checkNumber(p, 'co2_store_ml_per_mmhg', 0.5, 10000);
  checkNumber(p, 'pi_co2_mmhg', 0, 30);
  checkNumber(p, 'peep_cmh2o', 0, 40);
  checkNumber(p, 'compliance_ml_per_cmh2o', 0.1, 500);
}

/** Each compartment of the 'compartments' lung model, and that the shares add up. */
function checkCompartments(p: SimParams): void {
  const list = p.compartments as unknown;
  if (!Array.isArray(list) || list.length < 1 || list.length > 6) {
    throw new RangeError(`simulate: compartments must be a list of 1 to 6 {vent_share, perf_share, tau_s} (got ${JSON.stringify(list)})`);
  }
  let vent = 0;
  let perf = 0;
  list.forEach((c: unknown, i: number) => {
    const x = c as Record<string, unknown>;
    const ok = (v: unknown, lo: number, hi: number, loOpen: boolean) =>
      typeof v === 'number' && Number.isFinite(v) && (loOpen ? v > lo : v >= lo) && v <= hi;
    if (!(x && ok(x.vent_share, 0, 1, true) && ok(x.perf_share, 0, 1, false) && ok(x.tau_s, 0.02, 20, false))) {
      throw new RangeError(
        `simulate: compartment ${i + 1} ${JSON.stringify(c)}: need vent_share > 0 and <= 1, perf_share 0-1, tau_s 0.02-20 s`,
      );
    }
    vent += x.vent_share as number;
    perf += x.perf_share as number;
  });
  if (Math.abs(vent - 1) > 1e-6) throw new RangeError(`simulate: the compartments' vent_share must add up to 1 (got ${vent})`);
  if (Math.abs(perf - 1) > 1e-6) throw new RangeError(`simulate: the compartments' perf_share must add up to 1 (got ${perf})`);
}

/** The embolised compartment exists and is not the only perfused one; the blocked share and its events are 0-1. */
function checkEmbolism(p: SimParams): void {
  checkNumber(p, 'embolism_compartment', 0, p.compartments.length);
  if (!Number.isInteger(p.embolism_compartment)) {
    throw new RangeError(`simulate: embolism_compartment must be a whole compartment number (got ${p.embolism_compartment})`);
  }
  checkNumber(p, 'embolism_fraction', 0, 1);
  const events = (Array.isArray(p.events) ? p.events : []).filter((e) => e && e.param === 'embolism_fraction');
  const bad = events.find((e) => !(e.to >= 0 && e.to <= 1));
  if (bad) throw new RangeError(`simulate: an embolism_fraction event must go to a value 0-1 (got ${bad.to})`);
  if (p.embolism_compartment === 0) {
    if (p.embolism_fraction !== 0 || events.length > 0) throw new RangeError('simulate: embolism_fraction needs an embolism_compartment (1 or more)');
    return;
  }
  const target = p.compartments[p.embolism_compartment - 1]!;
  if (!(target.perf_share > 0) || !(target.perf_share < 1)) {
    throw new RangeError(
      `simulate: the embolised compartment ${p.embolism_compartment} must have blood flow to lose and another perfused compartment to take it (perf_share ${target.perf_share})`,
    );
  }
}

/** The lung model and what it needs: compartments and the zone-1 rule, and the inputs it replaces set to 0. */
function checkLungModel(p: SimParams): void {
  checkOneOf(p, 'lung_model', ['single', 'compartments']);
  if (p.lung_model === 'single') {
    if (!Array.isArray(p.compartments) || p.compartments.length > 0) {
      throw new RangeError("simulate: compartments are used only with lung_model 'compartments'; leave the list empty");
    }
    const embolismEvent = Array.isArray(p.events) && p.events.some((e) => e && e.param === 'embolism_fraction');
    if (p.embolism_compartment !== 0 || p.embolism_fraction !== 0 || embolismEvent) {
      throw new RangeError("simulate: embolism_compartment and embolism_fraction (and their events) need lung_model 'compartments'");
    }
    return;
  }
  checkCompartments(p);
  checkEmbolism(p);
  checkNumber(p, 'zone1_lung_height_cm', 0, 40);
  if (p.zone1_lung_height_cm > 0) checkNumber(p, 'zone1_pa_level_cm', 0, p.zone1_lung_height_cm);
  checkNumber(p, 'zone1_pla_mmhg', 0, 40);
  checkNumber(p, 'zone1_pvr_mmhg_min_per_l', 0, 20);
  checkNumber(p, 'zone1_palv_cmh2o', 0, 50);
  for (const name of ['alv_dead_space_fraction', 'slope3_mmhg_per_l'] as const) {
    if (p[name] !== 0) {
      throw new RangeError(`simulate: with lung_model 'compartments' ${name} is a result of the compartments; set it to 0 (got ${p[name]})`);
    }
    if (Array.isArray(p.events) && p.events.some((e) => e && e.param === name)) {
      throw new RangeError(`simulate: with lung_model 'compartments' events may not change ${name} (it is a result of the compartments)`);
    }
  }
}

/** The sensors and their artefacts (delay, response, noise, offset, leak, clipping, cardiogenic oscillations). */
function checkSensors(p: SimParams): void {
  checkOneOf(p, 'sensor', ['mainstream', 'sidestream']);
  checkNumber(p, 'delay_s', 0, 10);
  checkNumber(p, 'rise_ms', 0, 2000);
  checkNumber(p, 'co2_noise_mmhg', 0, 20);
  checkNumber(p, 'flow_noise_lps', 0, 5);
  checkNumber(p, 'flow_offset_lps', -5, 5);
  checkNumber(p, 'leak_fraction', 0, 0.8);
  checkNumber(p, 'sample_flow_ml_min', 0, 500);
  checkNumber(p, 'co2_clip_mmhg', 0, 200);
  checkNumber(p, 'cardio_flow_lps', 0, 2);
  checkNumber(p, 'cardio_co2_mmhg', 0, 20);
  checkNumber(p, 'hr_bpm', 20, 250);
}

/** Sampling rates and the export format of the CSV, each option on its own. */
function checkExportOptions(p: SimParams): void {
  checkNumber(p, 'rate_hz', 5, 2000);
  checkNumber(p, 'internal_min_hz', 10, 20000);
  checkNumber(p, 'pb_mmhg', 300, 900);
  checkOneOf(p, 'flow_unit', ['L/s', 'L/min', 'mL/s']);
  checkOneOf(p, 'co2_unit', ['mmHg', 'kPa', '%']);
  checkOneOf(p, 'co2_percent', ['ambient', 'dry']);
  checkOneOf(p, 'expiration_sign', ['positive', 'negative']);
  checkOneOf(p, 'delimiter', [',', ';', '\t']);
  checkOneOf(p, 'decimal', ['.', ',']);
  checkOneOf(p, 'time_format', ['s', 'ms', 'iso', 'clock', 'none']);
  checkOneOf(p, 'header_style', ['plain', 'units']);
  checkOneOf(p, 'line_ending', ['\n', '\r\n']);
  checkNumber(p, 'preamble_lines', 0, 100);
  checkNumber(p, 'damaged_line_fraction', 0, 0.2);
}

/** Export options that depend on each other: decimal mark and delimiter, start time, CO2 rate, extra columns. */
function checkExportCombinations(p: SimParams): void {
  if (p.delimiter === ',' && p.decimal === ',') throw new RangeError('simulate: decimal "," needs delimiter ";" or tab, not ","');
  if (!Number.isFinite(Date.parse(p.start_iso))) throw new RangeError(`simulate: start_iso is not an ISO 8601 date-time (got ${p.start_iso})`);
  if (p.co2_rate_hz !== null) {
    checkNumber(p, 'co2_rate_hz', 1, p.rate_hz);
    const ratio = p.rate_hz / p.co2_rate_hz;
    if (Math.abs(ratio - Math.round(ratio)) > 1e-9) {
      throw new RangeError(`simulate: co2_rate_hz must divide rate_hz (got ${p.co2_rate_hz} Hz beside ${p.rate_hz} Hz)`);
    }
  }
  if (!Array.isArray(p.extra_columns) || p.extra_columns.some((c) => c !== 'pressure' && c !== 'volume')) {
    throw new RangeError(`simulate: extra_columns must be a list of "pressure" and/or "volume" (got ${JSON.stringify(p.extra_columns)})`);
  }
}

/** Each gap: a start, a positive duration and a kind; omitted rows need a time column. */
function checkGaps(p: SimParams): void {
  if (!Array.isArray(p.gaps)) throw new TypeError('simulate: gaps must be a list of {t_s, duration_s, kind}');
  for (const g of p.gaps) {
    if (!(g && Number.isFinite(g.t_s) && g.t_s >= 0 && Number.isFinite(g.duration_s) && g.duration_s > 0 && (g.kind === 'rows' || g.kind === 'blank'))) {
      throw new RangeError(`simulate: bad gap ${JSON.stringify(g)}: need t_s >= 0, duration_s > 0, kind "rows" or "blank"`);
    }
    if (g.kind === 'rows' && p.time_format === 'none') {
      throw new RangeError('simulate: gaps of kind "rows" need a time column (time_format is "none"); use kind "blank"');
    }
  }
}

/** Each event: a start, a target value, a ramp and a parameter that events may change. */
function checkEvents(p: SimParams): void {
  if (!Array.isArray(p.events)) throw new TypeError('simulate: events must be a list of {t_s, param, to, ramp_s}');
  for (const e of p.events) {
    if (!(e && Number.isFinite(e.t_s) && e.t_s >= 0 && Number.isFinite(e.to) && Number.isFinite(e.ramp_s) && e.ramp_s >= 0)) {
      throw new RangeError(`simulate: bad event ${JSON.stringify(e)}: need t_s >= 0, to, ramp_s >= 0`);
    }
    if (!(e.param in EVENT_KIND_OF)) {
      throw new RangeError(`simulate: event param must be one of ${Object.keys(EVENT_KIND_OF).join(', ')} (got ${JSON.stringify(e.param)})`);
    }
  }
}

/** Geometry of the expired curve: the front must fit inside the breath. */
function checkCurveGeometry(p: SimParams): void {
  if (p.vd_aw_ml < 3 * p.sigma_ml) {
    throw new RangeError(`simulate: sigma_ml (${p.sigma_ml}) must be at most vd_aw_ml / 3 (${(p.vd_aw_ml / 3).toFixed(3)}) so phase I exists`);
  }
  const minVt = minimumTidalVolume(p);
  if (p.vt_ml < minVt) {
    throw new RangeError(`simulate: vt_ml (${p.vt_ml}) must exceed (vd_aw_ml + 6 sigma_ml) / (1 - leak) = ${minVt.toFixed(1)} mL so phase III exists`);
  }
}

/**
 * Checks a parameter set and throws a RangeError/TypeError with one clear line naming the field, its value and the
 * allowed range. Misuse throws; the simulator has no data problems to collect. Checks run in a fixed order, so the
 * first problem found is the one reported.
 */
export function validateParams(p: SimParams): void {
  checkVentilation(p);
  checkCurveAndGasExchange(p);
  checkLungModel(p);
  checkSensors(p);
  checkExportOptions(p);
  checkExportCombinations(p);
  checkGaps(p);
  checkEvents(p);
  checkCurveGeometry(p);
}
