import { chiSquareSf, normalSf } from '../distributions';
import { StatsInputError } from '../types';
import { shapeMoments, ShapeMoments } from './moments';

/** A z test on one shape moment. */
export interface ShapeZTest {
  n: number;
  /** The moment tested: sample skewness g1, or excess kurtosis g2 = b2 - 3. */
  moment: number;
  /** Approximately standard normal under normality. */
  z: number;
  /** Two-sided p-value. */
  pValue: number;
}

/** The D'Agostino-Pearson omnibus test. */
export interface OmnibusResult {
  n: number;
  /** K^2 = z_skew^2 + z_kurt^2, approximately chi-square with 2 df under normality. */
  statistic: number;
  pValue: number;
  skewness: ShapeZTest;
  kurtosis: ShapeZTest;
}

/** Smallest n for the skewness transformation (its W^2 needs n >= 8) and for the kurtosis one. */
export const SKEWNESS_TEST_MIN_N = 8;
export const KURTOSIS_TEST_MIN_N = 5;

/**
 * D'Agostino's normalizing transformation of sample skewness (D'Agostino 1970, "Transformation to normality of
 * the null distribution of g1", Biometrika 57:679-681; as given by D'Agostino, Belanger & D'Agostino 1990,
 * The American Statistician 44:316-321, eqs. for Z(sqrt b1)): Johnson S_U approximation with
 * Y = sqrt(b1) sqrt((n+1)(n+3)/(6(n-2))), Z = delta asinh(Y/alpha).
 *
 * A symmetric sample (skewness exactly 0) gives Z = 0. (scipy's skewtest substitutes Y = 1 when Y is exactly 0
 * and so reports z = 1.0108 for the symmetric sample 1..8; the transformation itself gives 0.)
 */
export function skewnessZ(skewness: number, n: number): number {
  if (!(n >= SKEWNESS_TEST_MIN_N)) throw new StatsInputError('too-few', 'the skewness test needs at least 8 values');
  const y = skewness * Math.sqrt(((n + 1) * (n + 3)) / (6 * (n - 2)));
  const beta2 = (3 * (n * n + 27 * n - 70) * (n + 1) * (n + 3)) / ((n - 2) * (n + 5) * (n + 7) * (n + 9));
  const w2 = -1 + Math.sqrt(2 * (beta2 - 1));
  const delta = 1 / Math.sqrt(0.5 * Math.log(w2));
  const alpha = Math.sqrt(2 / (w2 - 1));
  return delta * Math.asinh(y / alpha);
}

/**
 * Anscombe & Glynn's normalizing transformation of sample kurtosis b2 (Anscombe & Glynn 1983, "Distribution of
 * the kurtosis statistic b2 for normal samples", Biometrika 70:227-234; as given by D'Agostino, Belanger &
 * D'Agostino 1990, eqs. 1-5). NaN in the degenerate case 1 + x sqrt(2/(A - 4)) = 0.
 * @param excessKurtosis g2 = b2 - 3
 */
export function kurtosisZ(excessKurtosis: number, n: number): number {
  if (!(n >= KURTOSIS_TEST_MIN_N)) throw new StatsInputError('too-few', 'the kurtosis test needs at least 5 values');
  const b2 = excessKurtosis + 3;
  const mean = (3 * (n - 1)) / (n + 1);
  const variance = (24 * n * (n - 2) * (n - 3)) / ((n + 1) * (n + 1) * (n + 3) * (n + 5)); // eq. 1
  const x = (b2 - mean) / Math.sqrt(variance); // eq. 4 (standardized b2)
  const sqrtBeta1 = // eq. 2: third standardized moment of b2
    ((6 * (n * n - 5 * n + 2)) / ((n + 7) * (n + 9))) * Math.sqrt((6 * (n + 3) * (n + 5)) / (n * (n - 2) * (n - 3)));
  const A = 6 + (8 / sqrtBeta1) * (2 / sqrtBeta1 + Math.sqrt(1 + 4 / (sqrtBeta1 * sqrtBeta1))); // eq. 3
  const term1 = 1 - 2 / (9 * A);
  const denom = 1 + x * Math.sqrt(2 / (A - 4));
  if (denom === 0) return NaN;
  const term2 = Math.sign(denom) * Math.cbrt((1 - 2 / A) / Math.abs(denom));
  return (term1 - term2) / Math.sqrt(2 / (9 * A)); // eq. 5
}

/** Two-sided normal p-value from the survival function. */
function twoSided(z: number): number {
  return Math.min(1, 2 * normalSf(Math.abs(z)));
}

/**
 * The skewness test of normality (D'Agostino 1970), two-sided.
 * @throws StatsInputError for fewer than 8 values or a constant column.
 */
export function skewnessTest(values: ArrayLike<number>): ShapeZTest {
  const m = shapeMoments(values);
  const z = skewnessZ(m.skewness, m.n);
  return { n: m.n, moment: m.skewness, z, pValue: twoSided(z) };
}

/**
 * The kurtosis test of normality (Anscombe & Glynn 1983), two-sided. Intended for n >= 20.
 * @throws StatsInputError for fewer than 5 values or a constant column.
 */
export function kurtosisTest(values: ArrayLike<number>): ShapeZTest {
  const m = shapeMoments(values);
  const z = kurtosisZ(m.excessKurtosis, m.n);
  return { n: m.n, moment: m.excessKurtosis, z, pValue: twoSided(z) };
}

/**
 * D'Agostino-Pearson omnibus K^2 test of normality (D'Agostino & Pearson 1973, Biometrika 60:613-622; D'Agostino,
 * Belanger & D'Agostino 1990, The American Statistician 44:316-321): K^2 = Z(sqrt b1)^2 + Z(b2)^2 against
 * chi-square with 2 df. O(n), so it serves samples beyond Shapiro-Wilk's range of 5000.
 * @throws StatsInputError for fewer than 8 values or a constant column.
 * @example dagostinoPearson(column).pValue
 */
export function dagostinoPearson(values: ArrayLike<number>, moments?: ShapeMoments): OmnibusResult {
  const m = moments ?? shapeMoments(values);
  const zs = skewnessZ(m.skewness, m.n);
  const zk = kurtosisZ(m.excessKurtosis, m.n);
  const k2 = zs * zs + zk * zk;
  return {
    n: m.n,
    statistic: k2,
    pValue: chiSquareSf(k2, 2),
    skewness: { n: m.n, moment: m.skewness, z: zs, pValue: twoSided(zs) },
    kurtosis: { n: m.n, moment: m.excessKurtosis, z: zk, pValue: twoSided(zk) },
  };
}
