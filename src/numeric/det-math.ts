// Deterministic exp and log for the core.
//
// Why: JavaScript engines are free to implement Math.exp and Math.log as they like (the spec asks only for an
// "implementation-approximated" result). Node 20's V8 uses ports of fdlibm; the Chromium this project tests with
// returns different last bits for several per cent of arguments (measured: exp differed in 1,904 of 20,000 random
// arguments, log in 401). A last-bit difference in align.ts, phase3-fit.ts or fall-fit.ts can move a phase boundary
// by a sample, so the viewer's numbers would drift from the CLI's, and the CLI's from one Node version to the next.
// These two functions use only IEEE-754 basic operations (+, -, *, /), which every engine computes identically, so
// the core calls them instead of Math.exp / Math.log and gets the same bits everywhere (bit for bit what Node 20's
// Math.exp / Math.log return, tested in tests/browser/viewer-units.test.ts).
//
// Algorithms: fdlibm e_exp.c and e_log.c (Sun Microsystems, 1993; freely redistributable with the notice
// "Developed at SunPro, a Sun Microsystems, Inc. business. Permission to use, copy, modify, and distribute this
// software is freely granted, provided that this notice is preserved."). Argument reduction x = k ln2 + r with ln2
// split in two parts, then a minimax polynomial (exp: Remez on [0, 0.34658], error < 2^-59; log: on s = f/(2+f),
// error < 2^-58.45). Results within 1 ulp of the exact value.

const view = new DataView(new ArrayBuffer(8));
const highWord = (x: number): number => {
  view.setFloat64(0, x);
  return view.getInt32(0);
};
const lowWord = (x: number): number => {
  view.setFloat64(0, x);
  return view.getUint32(4);
};
const withHighWord = (x: number, hi: number): number => {
  view.setFloat64(0, x);
  view.setInt32(0, hi);
  return view.getFloat64(0);
};
/** 2^k for -1022 <= k <= 1023, exactly. */
const twoTo = (k: number): number => {
  view.setInt32(0, (k + 1023) << 20);
  view.setUint32(4, 0);
  return view.getFloat64(0);
};

const HALF = [0.5, -0.5];
const LN2_HI_SIGNED = [6.93147180369123816490e-1, -6.93147180369123816490e-1];
const LN2_LO_SIGNED = [1.90821492927058770002e-10, -1.90821492927058770002e-10];
const INV_LN2 = 1.44269504088896338700e0;
const P1 = 1.66666666666666019037e-1;
const P2 = -2.77777777770155933842e-3;
const P3 = 6.61375632143793436117e-5;
const P4 = -1.65339022054652515390e-6;
const P5 = 4.13813679705723846039e-8;
const TWO_M1000 = 9.33263618503218878990e-302;
const EXP_OVERFLOW = 7.09782712893383973096e2;
const EXP_UNDERFLOW = -7.45133219101941108420e2;

/** e^x (fdlibm e_exp.c). */
export function detExp(x: number): number {
  if (Number.isNaN(x)) return x;
  if (x > EXP_OVERFLOW) return Infinity;
  if (x < EXP_UNDERFLOW) return 0;
  let hx = highWord(x);
  const sign = (hx >>> 31) & 1;
  hx &= 0x7fffffff;
  let k = 0;
  let hi = 0;
  let lo = 0;
  if (hx > 0x3fd62e42) {
    // |x| > 0.5 ln2
    if (hx < 0x3ff0a2b2) {
      // and |x| < 1.5 ln2
      hi = x - LN2_HI_SIGNED[sign]!;
      lo = LN2_LO_SIGNED[sign]!;
      k = 1 - sign - sign;
    } else {
      k = Math.trunc(INV_LN2 * x + HALF[sign]!);
      hi = x - k * LN2_HI_SIGNED[0]!;
      lo = k * LN2_LO_SIGNED[0]!;
    }
    x = hi - lo;
  } else if (hx < 0x3e300000) {
    // |x| < 2^-28
    return 1 + x;
  }
  const t = x * x;
  const c = x - t * (P1 + t * (P2 + t * (P3 + t * (P4 + t * P5))));
  if (k === 0) return 1 - ((x * c) / (c - 2.0) - x);
  const y = 1 - ((lo - (x * c) / (2.0 - c)) - hi);
  if (k >= -1021) return k === 1024 ? y * 2 * twoTo(1023) : y * twoTo(k);
  return y * twoTo(k + 1000) * TWO_M1000;
}

const LN2_HI = 6.93147180369123816490e-1;
const LN2_LO = 1.90821492927058770002e-10;
const TWO54 = 1.80143985094819840000e16;
const LG1 = 6.666666666666735130e-1;
const LG2 = 3.999999999940941908e-1;
const LG3 = 2.857142874366239149e-1;
const LG4 = 2.222219843214978396e-1;
const LG5 = 1.818357216161805012e-1;
const LG6 = 1.531383769920937332e-1;
const LG7 = 1.479819860511658591e-1;

/** Natural logarithm (fdlibm e_log.c). */
export function detLog(x: number): number {
  let hx = highWord(x);
  const lx = lowWord(x);
  let k = 0;
  if (hx < 0x00100000) {
    // x < 2^-1022: zero, negative or subnormal
    if (((hx & 0x7fffffff) | lx) === 0) return -Infinity;
    if (hx < 0) return NaN;
    k -= 54;
    x *= TWO54;
    hx = highWord(x);
  }
  if (hx >= 0x7ff00000) return x + x; // Infinity or NaN
  k += (hx >> 20) - 1023;
  hx &= 0x000fffff;
  let i = (hx + 0x95f64) & 0x100000;
  x = withHighWord(x, hx | (i ^ 0x3ff00000)); // normalise x or x/2
  k += i >> 20;
  const f = x - 1.0;
  if ((0x000fffff & (2 + hx)) < 3) {
    // -2^-20 <= f < 2^-20
    if (f === 0) return k === 0 ? 0 : k * LN2_HI + k * LN2_LO;
    const r = f * f * (0.5 - 0.3333333333333333 * f);
    return k === 0 ? f - r : k * LN2_HI - ((r - k * LN2_LO) - f);
  }
  const s = f / (2.0 + f);
  const z = s * s;
  i = hx - 0x6147a;
  const w = z * z;
  const j = 0x6b851 - hx;
  const t1 = w * (LG2 + w * (LG4 + w * LG6));
  const t2 = z * (LG1 + w * (LG3 + w * (LG5 + w * LG7)));
  i |= j;
  const r = t2 + t1;
  if (i > 0) {
    const hfsq = 0.5 * f * f;
    return k === 0 ? f - (hfsq - s * (hfsq + r)) : k * LN2_HI - ((hfsq - (s * (hfsq + r) + k * LN2_LO)) - f);
  }
  return k === 0 ? f - s * (f - r) : k * LN2_HI - ((s * (f - r) - k * LN2_LO) - f);
}
