/**
 * Least-squares residuals of columns on a set of predictor columns plus an intercept, by modified Gram-Schmidt
 * with one full re-orthogonalisation (Kahan's "twice is enough", in Parlett 1980, The Symmetric Eigenvalue
 * Problem, Prentice-Hall). Written here because simple-statistics fits one predictor only and jstat's matrix routines
 * solve the normal equations, which square the condition number.
 */
import { StatsInputError } from '../types';

/** Relative size below which a column is taken to add nothing to the ones before it. */
const REDUNDANT = 1e-10;

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function norm(a: Float64Array): number {
  // Scaled to avoid overflow and underflow of the squares.
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  if (m === 0 || !Number.isFinite(m)) return m;
  let s = 0;
  for (let i = 0; i < a.length; i++) {
    const v = a[i] / m;
    s += v * v;
  }
  return m * Math.sqrt(s);
}

/** v minus its mean, by the corrected two-pass algorithm (Chan, Golub & LeVeque 1983). */
export function centred(v: ArrayLike<number>): Float64Array {
  const n = v.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += v[i];
  mean /= n;
  const out = new Float64Array(n);
  let drift = 0;
  for (let i = 0; i < n; i++) {
    out[i] = v[i] - mean;
    drift += out[i];
  }
  drift /= n;
  for (let i = 0; i < n; i++) out[i] -= drift;
  return out;
}

/** Removes from v (in place) its projection on each orthonormal column, twice. */
function project(v: Float64Array, basis: Float64Array[]): void {
  for (let pass = 0; pass < 2; pass++) {
    for (const q of basis) {
      const c = dot(q, v);
      for (let i = 0; i < v.length; i++) v[i] -= c * q[i];
    }
  }
}

/**
 * An orthonormal basis for the centred predictor columns (the intercept is handled by centring).
 * @throws StatsInputError naming the first predictor that is constant or repeats the ones before it.
 */
export function orthonormalBasis(predictors: ArrayLike<number>[], names: (i: number) => string): Float64Array[] {
  const basis: Float64Array[] = [];
  predictors.forEach((p, i) => {
    const v = centred(p);
    const before = norm(v);
    project(v, basis);
    const after = norm(v);
    if (!(before > 0) || !(after > REDUNDANT * before)) {
      throw new StatsInputError(
        'constant',
        before > 0
          ? `${names(i)} adds nothing: it is a straight-line combination of the other controls`
          : `${names(i)} is constant on the rows used: it cannot be controlled for`,
      );
    }
    for (let k = 0; k < v.length; k++) v[k] /= after;
    basis.push(v);
  });
  return basis;
}

/** Residuals of the least-squares fit of `target` on an intercept and the span of `basis`. */
export function residualsOn(target: ArrayLike<number>, basis: Float64Array[]): Float64Array {
  const v = centred(target);
  project(v, basis);
  return v;
}

/** Euclidean norm without overflow (exported for relative-size checks by callers). */
export function euclideanNorm(v: Float64Array): number {
  return norm(v);
}
