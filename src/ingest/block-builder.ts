// Collects samples into SampleBlocks of about 64k samples. Samples whose CO2 is not known yet (waiting for
// the next CO2 sample to interpolate) form a "pending" tail that is never emitted until resolved.
import type { SampleBlock } from '../types';

export const BLOCK_SAMPLES = 65_536;

export class BlockBuilder {
  t: Float64Array;
  flow: Float64Array;
  co2: Float64Array;
  line: Int32Array;
  n = 0;
  /** index of the first sample whose CO2 is pending, or -1 */
  pendingStart = -1;
  private out: SampleBlock[] = [];
  private cap: number;

  constructor(cap = BLOCK_SAMPLES) {
    this.cap = cap;
    this.t = new Float64Array(cap);
    this.flow = new Float64Array(cap);
    this.co2 = new Float64Array(cap);
    this.line = new Int32Array(cap);
  }

  /** Append a sample; returns its index in the current buffer. */
  add(t: number, flow: number, co2: number, line: number): number {
    if (this.n === this.cap) this.flush(false);
    const i = this.n++;
    this.t[i] = t;
    this.flow[i] = flow;
    this.co2[i] = co2;
    this.line[i] = line;
    return i;
  }

  /** Append a sample whose CO2 will be set by resolvePending. */
  addPending(t: number, flow: number, line: number): void {
    const i = this.add(t, flow, NaN, line);
    if (this.pendingStart < 0) this.pendingStart = i;
  }

  get hasPending(): boolean {
    return this.pendingStart >= 0;
  }

  /** Set the CO2 of every pending sample from its time; returns how many got NaN. */
  resolvePending(co2At: (t: number) => number): number {
    let nan = 0;
    if (this.pendingStart < 0) return 0;
    for (let i = this.pendingStart; i < this.n; i++) {
      const v = co2At(this.t[i]!);
      this.co2[i] = v;
      if (Number.isNaN(v)) nan++;
    }
    this.pendingStart = -1;
    return nan;
  }

  /** Hand over the finished blocks (and forget them). */
  take(): SampleBlock[] {
    const out = this.out;
    this.out = [];
    return out;
  }

  /** Move everything that is not pending into a block; `all` also flushes a pending tail (call after resolving). */
  flush(all: boolean): void {
    const end = all || this.pendingStart < 0 ? this.n : this.pendingStart;
    if (end === 0) {
      if (this.n === this.cap) this.grow();
      return;
    }
    if (end === this.n && this.n === this.cap) {
      this.out.push({ t_s: this.t, flow_lps: this.flow, co2_mmhg: this.co2, n: end, line: this.line });
      this.t = new Float64Array(this.cap);
      this.flow = new Float64Array(this.cap);
      this.co2 = new Float64Array(this.cap);
      this.line = new Int32Array(this.cap);
      this.n = 0;
      return;
    }
    this.out.push({
      t_s: this.t.slice(0, end), flow_lps: this.flow.slice(0, end), co2_mmhg: this.co2.slice(0, end), n: end, line: this.line.slice(0, end),
    });
    this.t.copyWithin(0, end, this.n);
    this.flow.copyWithin(0, end, this.n);
    this.co2.copyWithin(0, end, this.n);
    this.line.copyWithin(0, end, this.n);
    this.n -= end;
    if (this.pendingStart >= 0) this.pendingStart -= end;
  }

  private grow(): void {
    const cap = this.cap * 2;
    const grow64 = (a: Float64Array) => { const b = new Float64Array(cap); b.set(a); return b; };
    this.t = grow64(this.t);
    this.flow = grow64(this.flow);
    this.co2 = grow64(this.co2);
    const l = new Int32Array(cap);
    l.set(this.line);
    this.line = l;
    this.cap = cap;
  }
}
