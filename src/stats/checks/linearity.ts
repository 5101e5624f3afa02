import { borrowF64, giveBack } from '../internal/scratch';
import { powerOfTwoScale } from '../correlation/comoments';
import { fSf } from '../distributions';
import { StatsInputError } from '../types';
import { distinctUpToThree } from '../correlation/distinct';

/** The F test for adding x^2 to a straight-line fit. */
export interface CurvatureTest {
  n: number;
  /** F = (RSS_line - RSS_quadratic) / (RSS_quadratic / (n - 3)); Infinity when a parabola fits exactly. */
  statistic: number;
  df1: 1;
  df2: number;
  pValue: number;
  /** Which way the points bend away from the line: "up" (convex, U-like) or "down" (concave). */
  bend: 'up' | 'down';
  /** The parabola fitted to the line's residuals, in the units of x and of the residuals: residual ~ constant +
   *  linear (x - centre) + square (x - centre)^2. With the line's slope b, the least-squares quadratic in x has
   *  slope b + linear + 2 square (x - centre), so it turns at x = centre - (b + linear) / (2 square). */
  quadratic: { centre: number; linear: number; square: number };
}

/** out[i] = v[i] / s (out may be v); returns the sum of out (in row order). */
function divideInto(out: Float64Array, v: ArrayLike<number>, s: number): number {
  let sum = 0;
  for (let i = 0; i < out.length; i++) {
    const a = v[i] / s;
    out[i] = a;
    sum += a;
  }
  return sum;
}

/** Subtracts `mean` from v in place; returns the dot product of c with the result (in row order). */
function centreThenDot(v: Float64Array, mean: number, c: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) {
    const a = v[i] - mean;
    v[i] = a;
    s += c[i] * a;
  }
  return s;
}

/** Subtracts k c from v in place; returns the dot product of the result with w (w = v: its sum of squares). */
function subtractThenDot(v: Float64Array, k: number, c: Float64Array, w: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) {
    const a = v[i] - k * c[i];
    v[i] = a;
    s += a * w[i];
  }
  return s;
}

/**
 * Is the straight line the right shape? The partial F test for adding x^2 to the least-squares line
 * y = a + b x (one numerator df, n - 3 denominator df). With one predictor this is Ramsey's RESET with the squared
 * fitted values (Ramsey 1969, "Tests for specification errors in classical linear least-squares regression
 * analysis", J. R. Stat. Soc. B 31:350-371): a + b x and (a + b x)^2 span the same space as 1, x, x^2 whenever
 * b != 0, so the two F statistics coincide.
 *
 * Computed without forming the quadratic's normal equations: x is centred and scaled by a power of two, its square
 * is made orthogonal to 1 and x by Gram-Schmidt applied twice (Kahan's "twice is enough"; Parlett 1980, The Symmetric Eigenvalue Problem), and the
 * straight-line residuals are regressed on what is left. That keeps the test exact-to-rounding even for x with a
 * large offset, where x and x^2 are nearly collinear. O(n).
 *
 * @param x the predictor
 * @param residuals the straight-line residuals y - (a + b x), e.g. fitLine(x, y).residuals
 * @throws StatsInputError for fewer than 4 points, fewer than 3 distinct x values, or x values too close together
 *   to separate a curve from a line.
 */
export function curvatureTest(x: ArrayLike<number>, residuals: ArrayLike<number>): CurvatureTest {
  const n = x.length;
  if (residuals.length !== n) throw new StatsInputError('unequal-length', 'x and the residuals must have the same length');
  if (n < 4) throw new StatsInputError('too-few', 'testing for a curve needs at least 4 points');
  if (distinctUpToThree(x) < 3) {
    throw new StatsInputError('constant', 'x takes only two values, so curvature cannot be tested');
  }
  // The passes below are the plain sequence (centre x, scale by a power of two, centre again, square, take the
  // square's mean and spread, Gram-Schmidt twice; scale, centre and project the residuals) with neighbouring
  // passes fused: each value goes through the same operations in the same order, so the sums are the same bit
  // for bit, in 12 passes over the rows instead of 27.
  let mean = 0;
  let eMax = 0;
  for (let i = 0; i < n; i++) {
    mean += x[i];
    const a = Math.abs(residuals[i]);
    if (a > eMax) eMax = a;
  }
  mean /= n;
  const c = borrowF64(n); // c, q and e are work arrays, given back to the scratch pool below
  let cMax = 0;
  for (let i = 0; i < n; i++) {
    const v = x[i] - mean;
    c[i] = v;
    const a = Math.abs(v);
    if (a > cMax) cMax = a;
  }
  const sc = powerOfTwoScale([cMax]);
  const cMean = divideInto(c, c, sc) / n;
  const q = borrowF64(n);
  let cc = 0;
  let qMean = 0;
  for (let i = 0; i < n; i++) {
    const v = c[i] - cMean;
    c[i] = v;
    cc += v * v;
    const w = v * v;
    q[i] = w;
    qMean += w;
  }
  qMean /= n;
  // The square's spread about its mean, and the first Gram-Schmidt step, whose mean is that same qMean.
  let qq0 = 0;
  let k1 = 0;
  for (let i = 0; i < n; i++) {
    const d = q[i] - qMean;
    qq0 += d * d;
    q[i] = d;
    k1 += c[i] * d;
  }
  k1 /= cc;
  let mean2 = 0;
  for (let i = 0; i < n; i++) {
    const v = q[i] - k1 * c[i];
    q[i] = v;
    mean2 += v;
  }
  mean2 /= n;
  const k2 = centreThenDot(q, mean2, c) / cc;
  const qq = subtractThenDot(q, k2, c, q);
  // The part of x^2 that a line cannot reproduce is lost in rounding: as good as two distinct values.
  if (!(qq > 1e-14 * qq0)) {
    giveBack(c, q);
    throw new StatsInputError('constant', 'the x values are too close together to tell a curve from a line');
  }
  const se = powerOfTwoScale([eMax]);
  const e = borrowF64(n);
  const eMean = divideInto(e, residuals, se) / n;
  // Least-squares residuals are orthogonal to 1 and x; this removes what rounding in the line fit left behind.
  const ke = centreThenDot(e, eMean, c) / cc;
  const eq = subtractThenDot(e, ke, c, q);
  const beta = eq / qq;
  // q = u^2 - (qMean + mean2) - (k1 + k2) u in the centred, scaled u = (x - centre) / sc, and the residuals / se
  // are eMean + ke u + beta q + what the parabola leaves: back in x's and the residuals' units below.
  const k = k1 + k2;
  const centre = mean + sc * cMean;
  const reduction = beta * beta * qq;
  // Residuals of the quadratic fit, summed directly rather than as RSS_line - reduction, which would cancel when
  // a parabola fits almost exactly.
  let rssQuadratic = 0;
  for (let i = 0; i < n; i++) {
    const r = e[i] - beta * q[i];
    rssQuadratic += r * r;
  }
  giveBack(c, q, e);
  const df2 = n - 3;
  // A parabola through every point leaves only rounding (relative 1e-24 and below): F is infinite, not 1e30.
  const exactParabola = rssQuadratic <= 1e-24 * reduction;
  const statistic = exactParabola ? Infinity : reduction / (rssQuadratic / df2);
  return {
    n,
    statistic,
    df1: 1,
    df2,
    pValue: statistic === Infinity ? 0 : fSf(statistic, 1, df2),
    bend: beta >= 0 ? 'up' : 'down',
    quadratic: { centre, linear: (se * (ke - beta * k)) / sc, square: (se * beta) / (sc * sc) },
  };
}
