/**
 * The two maximisers behind the ordinal coefficients, both Newton's method on analytic derivatives:
 * - one parameter (rho with the thresholds held, the two-step estimators): Newton steps kept inside a bracket
 *   that every evaluation narrows by the sign of the slope, with bisection when a step would leave it: the
 *   safeguarded Newton root search of Press, Teukolsky, Vetterling & Flannery (2007), Numerical Recipes, 3rd ed.,
 *   Cambridge University Press, section 9.4 ("rtsafe"), applied to the score;
 * - all parameters (the maximum-likelihood estimators): Newton steps on the full Hessian, damped towards the
 *   gradient (Levenberg 1944, Quarterly of Applied Mathematics 2:164–168) when the Hessian is not negative
 *   definite, halved until the log-likelihood does not fall and the thresholds stay ordered.
 * Both near the maximum converge quadratically, so they stop on a step below 1e-12 (one) or 1e-11 (all), after
 * which one more step would change nothing a double can show. Parameter 0 may be held at a bound (|rho| ≤ cap)
 * when the likelihood keeps rising beyond it.
 */

/** Log-likelihood and its first two derivatives at a point of one parameter. */
export interface Objective1D {
  value: number;
  d1: number;
  d2: number;
}

export interface Maximum1D extends Objective1D {
  x: number;
  iterations: number;
  converged: boolean;
  /** −1 or +1 when the maximum sits at the lower or upper bound (the slope still points outward), else 0. */
  atBound: -1 | 0 | 1;
}

/**
 * Maximises f over [lower, upper] from `start` (inside), f returning its value and first two derivatives.
 * A value of −Infinity (a row or cell the model gives probability 0) counts as lying beyond the maximum.
 */
export function maximiseOnInterval(
  f: (x: number) => Objective1D,
  start: number,
  lower: number,
  upper: number,
  tol = 1e-12,
  maxIterations = 100,
): Maximum1D {
  let lo = lower;
  let hi = upper;
  let triedLower = false;
  let triedUpper = false;
  let atLower: Objective1D | null = null;
  let atUpper: Objective1D | null = null;
  // A likelihood flat to rounding towards a bound (a cell whose probability is already ~0 there) may end a little
  // inside it: when the bound was evaluated and is no worse, the maximum is the bound.
  const finish = (x: number, e: Objective1D, iterations: number, converged: boolean): Maximum1D => {
    const slack = 1e-12 * (1 + Math.abs(e.value));
    if (atUpper && x !== upper && atUpper.value >= e.value - slack && x > 0) {
      return { x: upper, ...atUpper, iterations, converged, atBound: 1 };
    }
    if (atLower && x !== lower && atLower.value >= e.value - slack && x < 0) {
      return { x: lower, ...atLower, iterations, converged, atBound: -1 };
    }
    return { x, ...e, iterations, converged, atBound: x === upper ? 1 : x === lower ? -1 : 0 };
  };
  let x = Math.min(Math.max(start, lower), upper);
  let e = f(x);
  let previous = x;
  const evaluate = (at: number): Objective1D => {
    const v = f(at);
    if (at === upper) atUpper = v;
    if (at === lower) atLower = v;
    return v;
  };
  for (let it = 1; it <= maxIterations; it++) {
    const finite = Number.isFinite(e.value) && Number.isFinite(e.d1);
    if (!finite) {
      // Impossible data under this x: the maximum lies back towards where we came from.
      // (At the start there is nowhere we came from: go towards 0, where every cell has some probability.)
      const from = x === previous ? 0 : previous;
      if (x > from) hi = x;
      else lo = x;
      const next = (from + x) / 2;
      x = next;
      e = evaluate(x);
      continue;
    }
    if (x === upper && e.d1 >= 0) return { x, ...e, iterations: it, converged: true, atBound: 1 };
    if (x === lower && e.d1 <= 0) return { x, ...e, iterations: it, converged: true, atBound: -1 };
    if (e.d1 > 0) lo = x;
    else if (e.d1 < 0) hi = x;
    else return finish(x, e, it, true);
    let next = e.d2 < 0 ? x - e.d1 / e.d2 : NaN;
    const newton = next > lo && next < hi;
    if (!newton) {
      if (e.d1 > 0 && hi === upper && !triedUpper) {
        next = upper;
        triedUpper = true;
      } else if (e.d1 < 0 && lo === lower && !triedLower) {
        next = lower;
        triedLower = true;
      } else {
        next = e.d1 > 0 ? (x + hi) / 2 : (x + lo) / 2;
      }
    }
    const small = Math.abs(next - x) <= tol * Math.max(1, Math.abs(x)) || hi - lo <= tol;
    previous = x;
    x = next;
    e = evaluate(x);
    if (small && Number.isFinite(e.value)) return finish(x, e, it + 1, true);
  }
  return finish(x, e, maxIterations, false);
}

/** Log-likelihood, gradient and Hessian (p × p, row-major) at a point of p parameters. */
export interface ObjectiveN {
  value: number;
  gradient: Float64Array;
  hessian: Float64Array;
}

export interface MaximumN extends ObjectiveN {
  x: Float64Array;
  iterations: number;
  converged: boolean;
  /**
   * Whether parameter 0 ended at its bound ±cap (an interior maximum exactly there is taken to be the bound:
   * the likelihood rises, or is flat to rounding, beyond it).
   */
  heldAtBound: boolean;
}

/**
 * Maximises f from x0 by damped Newton steps. `feasible` rejects points outside the model (unordered
 * thresholds); parameter 0 is kept in [−cap, cap] and held there when the gradient points outward.
 */
export function maximiseNewton(
  f: (x: Float64Array) => ObjectiveN,
  x0: ArrayLike<number>,
  feasible: (x: Float64Array) => boolean,
  cap: number,
  tol = 1e-11,
  maxIterations = 200,
): MaximumN {
  const p = x0.length;
  let x: Float64Array = Float64Array.from(x0);
  x[0] = Math.min(Math.max(x[0], -cap), cap);
  let e = f(x);
  for (let it = 1; it <= maxIterations; it++) {
    const held = Math.abs(x[0]) === cap && e.gradient[0] * x[0] > 0;
    const free: number[] = [];
    for (let i = held ? 1 : 0; i < p; i++) free.push(i);
    const d = dampedNewtonStep(e, free);
    if (!d) return { x, ...e, iterations: it, converged: isStationary(e, free), heldAtBound: Math.abs(x[0]) === cap };
    let step = 1;
    let accepted: { x: Float64Array; e: ObjectiveN } | null = null;
    // Rounding of a log-likelihood of size L is about 1e-16·L: a step may lose that much and still be taken.
    const slack = 1e-13 * (1 + Math.abs(e.value));
    while (step > 1e-12) {
      const trial = Float64Array.from(x);
      for (let i = 0; i < p; i++) trial[i] += step * d[i];
      if (trial[0] > cap) trial[0] = cap;
      if (trial[0] < -cap) trial[0] = -cap;
      if (feasible(trial)) {
        const te = f(trial);
        if (Number.isFinite(te.value) && te.value >= e.value - slack) {
          accepted = { x: trial, e: te };
          break;
        }
      }
      step /= 2;
    }
    if (!accepted) return { x, ...e, iterations: it, converged: isStationary(e, free), heldAtBound: Math.abs(x[0]) === cap };
    let moved = 0;
    for (let i = 0; i < p; i++) moved = Math.max(moved, Math.abs(accepted.x[i] - x[i]));
    x = accepted.x;
    e = accepted.e;
    if (moved <= tol) return { x, ...e, iterations: it, converged: true, heldAtBound: Math.abs(x[0]) === cap };
  }
  return { x, ...e, iterations: maxIterations, converged: false, heldAtBound: Math.abs(x[0]) === cap };
}

function isStationary(e: ObjectiveN, free: number[]): boolean {
  let g = 0;
  for (const i of free) g = Math.max(g, Math.abs(e.gradient[i]));
  return g <= 1e-8 * (1 + Math.abs(e.value));
}

/**
 * The Newton step d solving (−H + λI)·d = g on the free parameters (0 elsewhere), with λ = 0 when −H is
 * positive definite and otherwise raised tenfold, from 1e-8 of its largest diagonal element, until it is.
 */
function dampedNewtonStep(e: ObjectiveN, free: number[]): Float64Array | null {
  const p = e.gradient.length;
  const m = free.length;
  const a = new Float64Array(m * m);
  const g = new Float64Array(m);
  let scale = 0;
  for (let r = 0; r < m; r++) {
    g[r] = e.gradient[free[r]];
    for (let c = 0; c < m; c++) a[r * m + c] = -e.hessian[free[r] * p + free[c]];
    scale = Math.max(scale, Math.abs(a[r * m + r]));
  }
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  for (let lambda = 0; lambda <= 1e10 * scale; lambda = lambda === 0 ? 1e-8 * scale : lambda * 10) {
    const damped = Float64Array.from(a);
    for (let r = 0; r < m; r++) damped[r * m + r] += lambda;
    const solved = choleskySolve(damped, g, m);
    if (solved) {
      const d = new Float64Array(p);
      for (let r = 0; r < m; r++) d[free[r]] = solved[r];
      return d;
    }
  }
  return null;
}

/** Solves A·x = b for a symmetric positive definite m × m matrix A (row-major); null when A is not. */
export function choleskySolve(a: Float64Array, b: Float64Array, m: number): Float64Array | null {
  const l = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    let diag = a[j * m + j];
    for (let k = 0; k < j; k++) diag -= l[j * m + k] * l[j * m + k];
    if (!(diag > 0)) return null;
    const ljj = Math.sqrt(diag);
    l[j * m + j] = ljj;
    for (let i = j + 1; i < m; i++) {
      let v = a[i * m + j];
      for (let k = 0; k < j; k++) v -= l[i * m + k] * l[j * m + k];
      l[i * m + j] = v / ljj;
    }
  }
  const y = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let v = b[i];
    for (let k = 0; k < i; k++) v -= l[i * m + k] * y[k];
    y[i] = v / l[i * m + i];
  }
  const x = new Float64Array(m);
  for (let i = m - 1; i >= 0; i--) {
    let v = y[i];
    for (let k = i + 1; k < m; k++) v -= l[k * m + i] * x[k];
    x[i] = v / l[i * m + i];
  }
  return x;
}

/**
 * The first diagonal element of (−H)⁻¹, the variance of parameter 0 from the observed information; NaN when −H
 * is not positive definite.
 */
export function inverseInformationFirst(hessian: Float64Array, p: number): number {
  const a = new Float64Array(p * p);
  for (let i = 0; i < p * p; i++) a[i] = -hessian[i];
  const unit = new Float64Array(p);
  unit[0] = 1;
  const v = choleskySolve(a, unit, p);
  return v ? v[0] : NaN;
}
