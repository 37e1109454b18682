// Bounded, deterministic Levenberg-Marquardt least squares for small models (a handful of parameters).
//
// Method: Levenberg K 1944, "A method for the solution of certain non-linear problems in least squares", Q Appl Math
// 2:164-168; Marquardt DW 1963, "An algorithm for least-squares estimation of nonlinear parameters", J Soc Ind Appl
// Math 11:431-441 (the damping scaled by the diagonal of J^T J, lambda divided by 10 after a successful step and
// multiplied by 10 after a failed one). Bounds: each trial point is clipped into the box [lower, upper] (a projected
// step; common practice, no source). The damped normal equations are solved by a Cholesky factorisation.
//
// Deterministic: only +, -, *, / and Math.sqrt (correctly rounded in every engine) are used here; the model supplies
// its own values and derivatives (and uses detExp / detLog for exp and log), so results are the same bits everywhere.
// Checked against NIST StRD certified values (tests/published/nist-strd-nonlinear.test.ts).

/** Model value at x for parameters p; writes the partial derivatives d f / d p_j into grad (length p.length). */
export type LmModel = (x: number, p: Float64Array, grad: Float64Array) => number;

export interface LmOptions {
  /** box bounds on the parameters (default unbounded) */
  lower?: ArrayLike<number>;
  upper?: ArrayLike<number>;
  /** iteration limit (one iteration = one trial step); default 100 */
  max_iterations?: number;
  /** relative tolerance on the sum of squares and on the parameter step; default 1e-10 */
  tolerance?: number;
}

export interface LmResult {
  params: Float64Array;
  /** residual sum of squares at params */
  sse: number;
  iterations: number;
  /** false: iteration limit reached, or a value or derivative was not finite */
  converged: boolean;
}

/** Sum of squares, J^T J (upper triangle, row-major p x p) and J^T r at one parameter vector. */
interface Normal {
  sse: number;
  jtj: Float64Array;
  jtr: Float64Array;
}

function evaluate(model: LmModel, x: ArrayLike<number>, y: ArrayLike<number>, p: Float64Array, grad: Float64Array, out: Normal): boolean {
  const np = p.length;
  out.jtj.fill(0);
  out.jtr.fill(0);
  let sse = 0;
  for (let i = 0; i < x.length; i++) {
    const r = y[i]! - model(x[i]!, p, grad);
    sse += r * r;
    for (let j = 0; j < np; j++) {
      const gj = grad[j]!;
      out.jtr[j] += gj * r;
      for (let k = j; k < np; k++) out.jtj[j * np + k] += gj * grad[k]!;
    }
  }
  out.sse = sse;
  return Number.isFinite(sse) && out.jtr.every(Number.isFinite) && out.jtj.every(Number.isFinite);
}

/**
 * Solves (J^T J + lambda diag(J^T J)) delta = J^T r by Cholesky (upper triangle of jtj given); false when the matrix
 * is not positive definite. `work` holds p x p numbers.
 */
function solveDamped(jtj: Float64Array, jtr: Float64Array, lambda: number, delta: Float64Array, work: Float64Array): boolean {
  const np = jtr.length;
  // L (lower, row-major) of M = L L^T, M_jk = jtj[min, max] (+ damping on the diagonal)
  for (let j = 0; j < np; j++) {
    for (let k = 0; k <= j; k++) {
      let s = jtj[k * np + j]!;
      if (k === j) s += lambda * Math.max(jtj[j * np + j]!, 1e-300);
      for (let m = 0; m < k; m++) s -= work[j * np + m]! * work[k * np + m]!;
      if (k === j) {
        if (!(s > 0)) return false;
        work[j * np + j] = Math.sqrt(s);
      } else work[j * np + k] = s / work[k * np + k]!;
    }
  }
  for (let j = 0; j < np; j++) {
    let s = jtr[j]!;
    for (let m = 0; m < j; m++) s -= work[j * np + m]! * delta[m]!;
    delta[j] = s / work[j * np + j]!;
  }
  for (let j = np - 1; j >= 0; j--) {
    let s = delta[j]!;
    for (let m = j + 1; m < np; m++) s -= work[m * np + j]! * delta[m]!;
    delta[j] = s / work[j * np + j]!;
  }
  return true;
}

function clip(v: number, j: number, lower: ArrayLike<number> | undefined, upper: ArrayLike<number> | undefined): number {
  const lo = lower ? lower[j]! : -Infinity;
  const hi = upper ? upper[j]! : Infinity;
  return v < lo ? lo : v > hi ? hi : v;
}

function normal(np: number): Normal {
  return { sse: NaN, jtj: new Float64Array(np * np), jtr: new Float64Array(np) };
}

/**
 * Least-squares fit of model(x_i, p) to y_i from `start` (clipped into the bounds). Converged when a successful
 * step lowers the sum of squares by less than tolerance x (sum of squares) or moves every parameter by less than
 * tolerance x (|p_j| + tolerance), or when no step lowers it any more (lambda above 1e16: a minimum to rounding).
 */
export function levenbergMarquardt(
  model: LmModel,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  start: ArrayLike<number>,
  options: LmOptions = {},
): LmResult {
  const np = start.length;
  const { lower, upper } = options;
  const maxIterations = options.max_iterations ?? 100;
  const tol = options.tolerance ?? 1e-10;
  const p = new Float64Array(np);
  for (let j = 0; j < np; j++) p[j] = clip(start[j]!, j, lower, upper);
  const trial = new Float64Array(np);
  const delta = new Float64Array(np);
  const grad = new Float64Array(np);
  const work = new Float64Array(np * np);
  let here = normal(np);
  let next = normal(np);
  if (!evaluate(model, x, y, p, grad, here)) return { params: p, sse: here.sse, iterations: 0, converged: false };
  let lambda = 1e-3;
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    if (!solveDamped(here.jtj, here.jtr, lambda, delta, work)) {
      lambda *= 10;
      if (lambda > 1e16) return { params: p, sse: here.sse, iterations: iteration, converged: true };
      continue;
    }
    let small = true;
    for (let j = 0; j < np; j++) {
      trial[j] = clip(p[j]! + delta[j]!, j, lower, upper);
      if (Math.abs(trial[j]! - p[j]!) > tol * (Math.abs(p[j]!) + tol)) small = false;
    }
    if (evaluate(model, x, y, trial, grad, next) && next.sse <= here.sse) {
      const gain = here.sse - next.sse;
      p.set(trial);
      [here, next] = [next, here];
      if (small || gain <= tol * here.sse) return { params: p, sse: here.sse, iterations: iteration, converged: true };
      lambda = Math.max(lambda / 10, 1e-12);
    } else {
      lambda *= 10;
      if (lambda > 1e16) return { params: p, sse: here.sse, iterations: iteration, converged: true };
    }
  }
  return { params: p, sse: here.sse, iterations: maxIterations, converged: false };
}
