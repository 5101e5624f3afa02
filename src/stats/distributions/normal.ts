/**
 * The standard normal distribution: density, both tails, and both quantiles, with full relative accuracy in the
 * far tails (down to about 1e-307, below which doubles lose precision).
 *
 * Methods:
 * - Tails: the rational Chebyshev approximations of Cody (1969), "Rational Chebyshev approximations for the
 *   error function", Mathematics of Computation 23(107):631–637, with the coefficients of his ANORM routine in
 *   Cody (1993), "Algorithm 715: SPECFUN — a portable FORTRAN package of special function routines and test
 *   drivers", ACM Transactions on Mathematical Software 19(1):22–32. The factor exp(−x²/2) is split as
 *   exp(−s²/2)·exp(−(x − s)(x + s)/2) with s = x rounded down to 1/16, so that the rounding of x² does not
 *   become a relative error of e^{x²/2}·ε in the far tail.
 * - Quantiles: Wichura (1988), "Algorithm AS 241: The percentage points of the normal distribution", Applied
 *   Statistics 37(3):477–484 (PPND16, relative accuracy about 1e-16).
 */

const INV_SQRT_2PI = 0.398942280401432677939946;

// Cody (1993) ANORM coefficients: |x| ≤ 0.66291.
const A = [2.2352520354606839287, 161.02823106855587881, 1067.6894854603709582, 18154.981253343561249, 0.065682337918207449113];
const B = [47.20258190468824187, 976.09855173777669322, 10260.932208618978205, 45507.789335026729956];
// 0.66291 < |x| ≤ √32.
const C = [
  0.39894151208813466764, 8.8831497943883759412, 93.506656132177855979, 597.27027639480026226,
  2494.5375852903726711, 6848.1904505362823326, 11602.651437647350124, 9842.7148383839780218,
  1.0765576773720192317e-8,
];
const D = [
  22.266688044328115691, 235.38790178262499861, 1519.377599407554805, 6485.558298266760755,
  18615.571640885098091, 34900.952721145977266, 38912.003286093271411, 19685.429676859990727,
];
// |x| > √32.
const P = [
  0.21589853405795699, 0.1274011611602473639, 0.022235277870649807, 0.001421619193227893466,
  2.9112874951168792e-5, 0.02307344176494017303,
];
const Q = [1.28426009614491121, 0.468238212480865118, 0.0659881378689285515, 0.00378239633202758244, 7.29751555083966205e-5];

const SQRT_32 = 5.656854249492380195206754896838;

/** exp(−y²/2) for y ≥ 0 without the relative error e^{y²/2}·ε that the rounding of y·y would cause. */
function expMinusHalfSquare(y: number): number {
  const s = Math.floor(y * 16) / 16;
  const rest = (y - s) * (y + s); // y² = s² + rest, s² exact
  return Math.exp(-0.5 * s * s) * Math.exp(-0.5 * rest);
}

/** P(Z > y) for y > 0.66291 (Cody 1993, ANORM, middle and outer ranges). */
function upperTailBeyondCentre(y: number): number {
  let ratio: number;
  if (y <= SQRT_32) {
    let numerator = C[8] * y;
    let denominator = y;
    for (let i = 0; i < 7; i++) {
      numerator = (numerator + C[i]) * y;
      denominator = (denominator + D[i]) * y;
    }
    ratio = (numerator + C[7]) / (denominator + D[7]);
  } else {
    const w = 1 / (y * y);
    let numerator = P[5] * w;
    let denominator = w;
    for (let i = 0; i < 4; i++) {
      numerator = (numerator + P[i]) * w;
      denominator = (denominator + Q[i]) * w;
    }
    ratio = (INV_SQRT_2PI - (w * (numerator + P[4])) / (denominator + Q[4])) / y;
  }
  return expMinusHalfSquare(y) * ratio;
}

/** P(Z ≤ x) − ½ for |x| ≤ 0.66291 (Cody 1993, ANORM, central range). */
function centralOffset(x: number): number {
  const w = x * x;
  let numerator = A[4] * w;
  let denominator = w;
  for (let i = 0; i < 3; i++) {
    numerator = (numerator + A[i]) * w;
    denominator = (denominator + B[i]) * w;
  }
  return (x * (numerator + A[3])) / (denominator + B[3]);
}

/**
 * Upper tail P(Z > x) of the standard normal, computed directly (never as 1 − cdf), relative accuracy about
 * 1e-15 down to 1e-307. NaN in, NaN out.
 * @example normalSf(1.95996398454005) // 0.025
 */
export function normalSf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const y = Math.abs(x);
  if (y <= 0.66291) return 0.5 - centralOffset(x);
  if (y === Infinity) return x > 0 ? 0 : 1;
  const tail = upperTailBeyondCentre(y);
  return x > 0 ? tail : 1 - tail;
}

/**
 * Lower tail P(Z ≤ x) of the standard normal (the mirror image of normalSf, so equally accurate for x ≪ 0).
 * @example normalCdf(-1.95996398454005) // 0.025
 */
export function normalCdf(x: number): number {
  return normalSf(-x);
}

/**
 * Density of the standard normal, e^{−x²/2}/√(2π), accurate in the far tails.
 * @example normalPdf(0) // 0.3989422804014327
 */
export function normalPdf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  return INV_SQRT_2PI * expMinusHalfSquare(Math.abs(x));
}

// Wichura (1988) AS 241, PPND16 coefficients.
const CENTRAL_NUM = [
  3.387132872796366608, 133.14166789178437745, 1971.5909503065514427, 13731.693765509461125,
  45921.953931549871457, 67265.770927008700853, 33430.575583588128105, 2509.0809287301226727,
];
const CENTRAL_DEN = [
  1, 42.313330701600911252, 687.1870074920579083, 5394.1960214247511077, 21213.794301586595867,
  39307.89580009271061, 28729.085735721942674, 5226.495278852854561,
];
const NEAR_NUM = [
  1.42343711074968357734, 4.6303378461565452959, 5.7694972214606914055, 3.64784832476320460504,
  1.27045825245236838258, 0.24178072517745061177, 0.0227238449892691845833, 7.7454501427834140764e-4,
];
const NEAR_DEN = [
  1, 2.05319162663775882187, 1.6763848301838038494, 0.68976733498510000455, 0.14810397642748007459,
  0.0151986665636164571966, 5.475938084995344946e-4, 1.05075007164441684324e-9,
];
const FAR_NUM = [
  6.6579046435011037772, 5.4637849111641143699, 1.7848265399172913358, 0.29656057182850489123,
  0.026532189526576123093, 0.0012426609473880784386, 2.71155556874348757815e-5, 2.01033439929228813265e-7,
];
const FAR_DEN = [
  1, 0.59983220655588793769, 0.13692988092273580531, 0.0148753612908506148525, 7.868691311456132591e-4,
  1.8463183175100546818e-5, 1.4215117583164458887e-7, 2.04426310338993978564e-15,
];

function polynomial(coefficients: readonly number[], x: number): number {
  let value = 0;
  for (let i = coefficients.length - 1; i >= 0; i--) value = value * x + coefficients[i];
  return value;
}

/**
 * Lower-tail quantile of the standard normal: the z with P(Z ≤ z) = p (Wichura 1988, AS 241).
 * Returns −Infinity for p = 0, +Infinity for p = 1 and NaN outside [0, 1].
 * @example normalQuantile(0.975) // 1.95996398454005
 */
export function normalQuantile(p: number): number {
  if (Number.isNaN(p) || p < 0 || p > 1) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  const q = p - 0.5;
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (q * polynomial(CENTRAL_NUM, r)) / polynomial(CENTRAL_DEN, r);
  }
  const tail = q < 0 ? p : 1 - p; // 1 − p is exact for p > ½
  let r = Math.sqrt(-Math.log(tail));
  let z: number;
  if (r <= 5) {
    r -= 1.6;
    z = polynomial(NEAR_NUM, r) / polynomial(NEAR_DEN, r);
  } else {
    r -= 5;
    z = polynomial(FAR_NUM, r) / polynomial(FAR_DEN, r);
  }
  return q < 0 ? -z : z;
}

/**
 * Upper-tail quantile of the standard normal: the z with P(Z > z) = p. By symmetry this is −normalQuantile(p),
 * so a tiny p (down to about 1e-300) loses nothing to 1 − p.
 * @example normalIsf(1e-10) // 6.361340902404056
 */
export function normalIsf(p: number): number {
  const z = normalQuantile(p);
  return z === 0 ? 0 : -z;
}
