// Bounded, deterministic Levenberg-Marquardt least squares for small models (a handful of parameters).
//
// Method: Levenberg K 1944, "A method for the solution of certain non-linear problems in least squares", Q Appl Math
// 2:164-168; Marquardt DW 1963, "An algorithm for least-squares estimation of nonlinear parameters", J Soc Ind Appl
// Math 11:431-441 (the damping scaled by the diagonal of J^T J, lambda divided by 10 after a successful step and
// multiplied by 10 after a failed one). Bounds: each trial point is clipped into the box [lower, upper] (a projected
// step; common practice, no source). The damped normal equations are solved by a Cholesky factorisation.
//
// The problem hands the routine its normal equations at a parameter vector (sum of squares, J^T J, J^T r), so a model
// evaluated on every breath can accumulate them in one fused pass over its points; pointwiseProblem builds them for
// an ordinary model given point by point.
//
// Deterministic: only +, -, *, / and Math.sqrt (correctly rounded in every engine) are used here; the model supplies
// its own values and derivatives (and uses detExp / detLog for exp and log), so results are the same bits everywhere.
// Checked against NIST StRD certified values (tests/published/nist-strd-nonlinear.test.ts).

/** Normal equations at one parameter vector: sum of squared residuals r = y - f, J^T J (row-major p x p; its upper
 *  triangle is read) and J^T r, J_ij = d f_i / d p_j. */
export interface NormalEquations {
  sse: number;
  jtj: number[];
  jtr: number[];
}

/** A least-squares problem: fills `out` at parameters p (a value that is not finite marks p as unusable). */
export type LmProblem = (p: readonly number[], out: NormalEquations) => void;

/** Model value at x for parameters p; writes d f / d p_j into grad (length p.length). */
export type PointModel = (x: number, p: readonly number[], grad: number[]) => number;

/** The problem of fitting a point model to (x_i, y_i): its normal equations, accumulated point by point. */
export function pointwiseProblem(x: ArrayLike<number>, y: ArrayLike<number>, model: PointModel): LmProblem {
  return (p, out) => {
    const np = p.length;
    const grad = zeros(np);
    out.jtj.fill(0);
    out.jtr.fill(0);
    let sse = 0;
    for (let i = 0; i < x.length; i++) {
      const r = y[i]! - model(x[i]!, p, grad);
      sse += r * r;
      for (let j = 0; j < np; j++) {
        out.jtr[j] += grad[j]! * r;
        for (let k = j; k < np; k++) out.jtj[j * np + k] += grad[j]! * grad[k]!;
      }
    }
    out.sse = sse;
  };
}

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
  params: number[];
  /** residual sum of squares at params */
  sse: number;
  iterations: number;
  /** false: iteration limit reached, or a value or derivative was not finite */
  converged: boolean;
}

/** The problem at p; false when the sum of squares or a diagonal entry of J^T J is not finite (a value or
 *  derivative that is not finite shows there). */
function evaluate(problem: LmProblem, p: readonly number[], out: NormalEquations): boolean {
  problem(p, out);
  if (!Number.isFinite(out.sse)) return false;
  const np = p.length;
  for (let j = 0; j < np; j++) if (!Number.isFinite(out.jtj[j * np + j]!)) return false;
  return true;
}

/**
 * Solves (J^T J + lambda diag(J^T J)) delta = J^T r by Cholesky (upper triangle of jtj given); false when the matrix
 * is not positive definite. `work` holds p x p numbers.
 */
function solveDamped(jtj: readonly number[], jtr: readonly number[], lambda: number, delta: number[], work: number[]): boolean {
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

/** n zeros in a plain array (small vectors: a plain array is much cheaper to create than a typed one, and the fit
 *  runs on every breath). */
function zeros(n: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(0);
  return out;
}

function normal(np: number): NormalEquations {
  return { sse: NaN, jtj: zeros(np * np), jtr: zeros(np) };
}

/**
 * Least-squares solution of `problem` from `start` (clipped into the bounds). Converged when a successful step lowers the sum of squares by less than tolerance x (sum of squares) or moves every parameter by less than
 * tolerance x (|p_j| + tolerance), or when no step lowers it any more (lambda above 1e16: a minimum to rounding).
 */
export function levenbergMarquardt(
  problem: LmProblem,
  start: ArrayLike<number>,
  options: LmOptions = {},
): LmResult {
  const np = start.length;
  const { lower, upper } = options;
  const maxIterations = options.max_iterations ?? 100;
  const tol = options.tolerance ?? 1e-10;
  const p = zeros(np);
  for (let j = 0; j < np; j++) p[j] = clip(start[j]!, j, lower, upper);
  const trial = zeros(np);
  const delta = zeros(np);
  const work = zeros(np * np);
  let here = normal(np);
  let next = normal(np);
  if (!evaluate(problem, p, here)) return { params: p, sse: here.sse, iterations: 0, converged: false };
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
    if (evaluate(problem, trial, next) && next.sse <= here.sse) {
      const gain = here.sse - next.sse;
      for (let j = 0; j < np; j++) p[j] = trial[j]!;
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
