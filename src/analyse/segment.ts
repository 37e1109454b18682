// Streaming breath segmentation from flow (positive = expiration).
//
// A phase starts at the zero crossing of flow that precedes |flow| exceeding a threshold (hysteresis), so slow
// zero-flow periods (inspiratory pause, end-expiratory rest) and small oscillations do not toggle the phase.
// A phase whose volume is below a minimum (fraction of the typical tidal volume) or whose duration is below
// min_phase_s is treated as a ripple: it is merged back into the surrounding phase (cardiogenic oscillations,
// valve chatter, double-triggering). Common practice, no source.
// A breath runs from one accepted inspiration start to the next and contains one expiration start.

/**
 * Onset time of a phase between the last "quiet" sample a (|flow| below the noise band eps, or still on the other
 * side) and the next sample b. A smooth crossing is interpolated linearly (clamped to one sample before a). An
 * abrupt one (b jumps to more than 4 times max(|f_a|, eps) and past the phase threshold, as at the onset of a
 * ventilator's square inspiration or after a pause) cannot be located inside the interval: its unbiased estimate
 * is the midpoint, and the flow is taken as already at b's value from there on (common practice, no source:
 * sampling of a step).
 */
export function phaseOnset(ta: number, fa: number, tb: number, fb: number, eps: number, thr: number): { t: number; abrupt: boolean } {
  const abrupt = Math.abs(fb) > 4 * Math.max(Math.abs(fa), eps) && Math.abs(fb) > thr;
  if (abrupt) return { t: 0.5 * (ta + tb), abrupt };
  const dt = tb - ta;
  const x = fb !== fa ? ta + (-fa / (fb - fa)) * dt : ta;
  return { t: Math.min(tb, Math.max(ta - dt, x)), abrupt };
}

export interface BreathBounds {
  /** absolute sample index of the first sample at/after each boundary */
  i_insp: number;
  i_exp: number;
  i_end: number;
  /** interpolated zero-crossing times, s */
  t_insp_s: number;
  t_exp_s: number;
  t_end_s: number;
  vt_insp_ml: number;
  vt_exp_ml: number;
  insp_abrupt: boolean;
  exp_abrupt: boolean;
}

interface Boundary {
  kind: 'insp' | 'exp';
  i: number;
  t: number;
  /** cumulative volume at the boundary, mL (positive = expired) */
  c: number;
  abrupt: boolean;
}

export interface SegmenterOptions {
  threshold_lps: number;
  min_phase_s: number;
  /** minimum volume of a phase, mL (ripple floor); the analyser updates it with setMinVolume as breaths arrive */
  min_volume_ml: number;
}

export interface Segmenter {
  /** feed samples with absolute indices start..start+n-1; returns breaths completed by these samples */
  push(t: ArrayLike<number>, flow: ArrayLike<number>, start: number, n: number): BreathBounds[];
  /** one sample; returns the breaths it completed (usually none; the array is reused when empty) */
  pushOne(t: number, flow: number, index: number): BreathBounds[];
  /** earliest absolute sample index still needed (start of the oldest unfinished breath) */
  oldestNeeded(): number;
  /** start time of the breath in progress (NaN if none) — for reporting a breath cut by a gap */
  pendingStart(): { t_s: number; i: number } | null;
  /** new ripple floor, mL */
  setMinVolume(ml: number): void;
}

/** Candidate onset in one direction: last quiet sample (a) and the sample after it (b). */
interface Candidate {
  ta: number;
  fa: number;
  tb: number;
  fb: number;
  ib: number;
  cb: number;
  waiting: boolean;
}

const newCandidate = (): Candidate => ({ ta: NaN, fa: 0, tb: NaN, fb: 0, ib: -1, cb: 0, waiting: false });

export function createSegmenter(opts: SegmenterOptions): Segmenter {
  return new StreamSegmenter(opts);
}

class StreamSegmenter implements Segmenter {
  private readonly bounds: Boundary[] = [];
  private phase: 'none' | 'insp' | 'exp' = 'none';
  private prevT = NaN;
  private prevF = NaN;
  private prevI = -1;
  /** cumulative expired volume, mL */
  private cum = 0;
  /** candidate onsets towards expiration (up) and inspiration (down) */
  private readonly up: Candidate = newCandidate();
  private readonly down: Candidate = newCandidate();
  private readonly scratch: BreathBounds[] = [];
  private tentative = false;
  private readonly thr: number;
  private readonly minPhaseS: number;
  private minVolumeMl: number;

  constructor(opts: SegmenterOptions) {
    this.thr = opts.threshold_lps;
    this.minPhaseS = opts.min_phase_s;
    this.minVolumeMl = opts.min_volume_ml;
  }

  setMinVolume(ml: number): void {
    this.minVolumeMl = ml;
  }

  private addBoundary(b: Boundary, out: BreathBounds[]): void {
    const bounds = this.bounds;
    const last = bounds[bounds.length - 1];
    if (last) {
      const dur = b.t - last.t;
      const vol = Math.abs(b.c - last.c);
      const tooSmall = dur < this.minPhaseS || vol < this.minVolumeMl;
      if (tooSmall && bounds.length >= 2) {
        // ripple: drop the short phase and keep the one before it going
        bounds.pop();
        return;
      }
      if (tooSmall && bounds.length === 1) {
        // a short phase at the very start: restart from this boundary
        bounds.pop();
      }
    }
    bounds.push(b);
    this.emit(out);
  }

  private emit(out: BreathBounds[]): void {
    const bounds = this.bounds;
    // need insp, exp, insp, exp with the last two accepted (the final 'exp' proves the preceding inspiration was real)
    while (bounds.length >= 4) {
      let k = 0;
      while (k < bounds.length && bounds[k]!.kind !== 'insp') k++;
      if (k > 0) {
        bounds.splice(0, k);
        continue;
      }
      const a = bounds[0]!;
      const e = bounds[1]!;
      const b = bounds[2]!;
      if (e.kind !== 'exp' || b.kind !== 'insp' || bounds[3]!.kind !== 'exp') {
        bounds.shift();
        continue;
      }
      out.push({
        i_insp: a.i,
        i_exp: e.i,
        i_end: b.i,
        t_insp_s: a.t,
        t_exp_s: e.t,
        t_end_s: b.t,
        vt_insp_ml: e.c > a.c ? 0 : a.c - e.c,
        vt_exp_ml: b.c - e.c,
        insp_abrupt: a.abrupt,
        exp_abrupt: e.abrupt,
      });
      bounds.splice(0, 2);
    }
  }

  /** the sample after a candidate's quiet sample (b) */
  private takeNext(c: Candidate, ti: number, fi: number, idx: number): void {
    c.tb = ti;
    c.fb = fi;
    c.ib = idx;
    c.cb = this.cum;
    c.waiting = false;
  }

  /** a new last quiet sample (a); its successor is taken at the next sample */
  private takeQuiet(c: Candidate, ti: number, fi: number): void {
    c.ta = ti;
    c.fa = fi;
    c.waiting = true;
  }

  private onset(c: Candidate, kind: 'insp' | 'exp'): Boundary {
    const z = phaseOnset(c.ta, c.fa, c.tb, c.fb, this.thr * 0.3, this.thr);
    const cAt = c.cb - (z.abrupt ? 1000 : 500) * c.fb * (c.tb - z.t);
    return { kind, i: c.ib, t: z.t, c: cAt, abrupt: z.abrupt };
  }

  private step(ti: number, fi: number, idx: number, out: BreathBounds[]): void {
    const thr = this.thr;
    const eps = 0.3 * thr;
    const up = this.up;
    const down = this.down;
    const bounds = this.bounds;
    if (this.prevI >= 0) this.cum += 500 * (fi + this.prevF) * (ti - this.prevT); // mL
    if (up.waiting) this.takeNext(up, ti, fi, idx);
    if (down.waiting) this.takeNext(down, ti, fi, idx);
    if (fi < eps) this.takeQuiet(up, ti, fi);
    if (fi > -eps) this.takeQuiet(down, ti, fi);
    // a new phase stays tentative until it has moved min_volume; if flow swings back across zero before that, its
    // onset was a ripple (e.g. a cardiogenic dip before the real inspiration): withdraw it and wait for the next onset
    const last = bounds[bounds.length - 1];
    if (this.tentative && last) {
      const vol = Math.abs(this.cum - last.c);
      if (vol >= this.minVolumeMl) this.tentative = false;
      else if ((last.kind === 'insp' && fi > eps) || (last.kind === 'exp' && fi < -eps)) {
        bounds.pop();
        this.tentative = false;
        this.phase = last.kind === 'insp' ? 'exp' : 'insp';
        if (!bounds.length) this.phase = 'none';
      }
    }
    if (fi > thr && this.phase !== 'exp' && up.ib >= 0 && !up.waiting) {
      this.phase = 'exp';
      this.addBoundary(this.onset(up, 'exp'), out);
      this.tentative = true;
      if (bounds.length && bounds[bounds.length - 1]!.kind === 'insp') this.phase = 'insp';
    } else if (fi < -thr && this.phase !== 'insp' && down.ib >= 0 && !down.waiting) {
      this.phase = 'insp';
      this.addBoundary(this.onset(down, 'insp'), out);
      this.tentative = true;
      if (bounds.length && bounds[bounds.length - 1]!.kind === 'exp') this.phase = 'exp';
    }
    this.prevT = ti;
    this.prevF = fi;
    this.prevI = idx;
  }

  push(t: ArrayLike<number>, flow: ArrayLike<number>, start: number, n: number): BreathBounds[] {
    const out: BreathBounds[] = [];
    for (let k = 0; k < n; k++) this.step(t[k]!, flow[k]!, start + k, out);
    return out;
  }

  pushOne(ti: number, fi: number, idx: number): BreathBounds[] {
    const scratch = this.scratch;
    this.step(ti, fi, idx, scratch);
    if (scratch.length === 0) return scratch;
    return scratch.splice(0, scratch.length);
  }

  oldestNeeded(): number {
    return this.bounds.length ? this.bounds[0]!.i : this.prevI;
  }

  pendingStart(): { t_s: number; i: number } | null {
    const first = this.bounds.find((b) => b.kind === 'insp');
    return first ? { t_s: first.t, i: first.i } : null;
  }
}
