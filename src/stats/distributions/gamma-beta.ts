/**
 * Logarithms of the gamma and beta functions, written so that they keep their relative accuracy for the
 * large arguments a correlation test meets (df up to several million): the Stirling series is split into its
 * closed-form part and a small remainder, so that the huge terms of lnΓ(a) and lnΓ(a + b) cancel
 * analytically instead of numerically.
 *
 * Methods:
 * - Stirling's series remainder with Bernoulli-number coefficients (Abramowitz & Stegun 1964, Handbook of
 *   Mathematical Functions, formula 6.1.40).
 * - lnΓ(2 + z) by its Taylor series with coefficients (ζ(k) − 1)/k (Abramowitz & Stegun 1964, formula 6.1.33),
 *   which keeps the relative accuracy near the zeros of lnΓ at 1 and 2.
 * - ln B(a, b) with the Stirling remainders combined before adding, as in Didonato & Morris (1992),
 *   "Algorithm 708: Significant digit computation of the incomplete beta function ratios",
 *   ACM Transactions on Mathematical Software 18(3):360–373.
 */

/** ½·ln(2π). */
export const LN_SQRT_2PI = 0.9189385332046727417803297;
const EULER_GAMMA = 0.5772156649015328606065121;

/**
 * ζ(k) − 1 for k = 2 … 30 (computed with mpmath 1.2.1 at 40 digits: `mpmath.zeta(k) - 1`).
 * Used in lnΓ(2 + z) = (1 − γ)z + Σ_{k ≥ 2} (−1)^k (ζ(k) − 1) z^k / k.
 */
const ZETA_MINUS_ONE = [
  0.6449340668482264364724, 0.2020569031595942853997, 0.082323233711138191516, 0.03692775514336992633137,
  0.01734306198444913971452, 0.008349277381922826839798, 0.004077356197944339378685,
  0.002008392826082214417853, 0.000994575127818085337146, 0.0004941886041194645587023,
  0.000246086553308048298638, 0.0001227133475784891467518, 0.00006124813505870482925855,
  0.00003058823630702049355173, 0.00001528225940865187173257, 0.0000076371976378997622736,
  0.000003817293264999839856462, 0.000001908212716553938925657, 9.53962033872796113152e-7,
  4.769329867878064631167e-7, 2.384505027277329900036e-7, 1.192199259653110730678e-7,
  5.960818905125947961244e-8, 2.980350351465228018606e-8, 1.490155482836504123466e-8,
  7.450711789835429491981e-9, 3.725334024788457054819e-9, 1.862659723513049006404e-9,
  9.313274324196681828718e-10,
];

/** Series coefficients (−1)^k (ζ(k) − 1)/k, k = 2 … 30, precomputed once. */
const LN_GAMMA_2_SERIES: Float64Array = (() => {
  const c = new Float64Array(ZETA_MINUS_ONE.length);
  for (let i = 0; i < c.length; i++) {
    const k = i + 2;
    c[i] = ((k % 2 === 0 ? 1 : -1) * ZETA_MINUS_ONE[i]) / k;
  }
  return c;
})();

/** lnΓ(2 + z) for |z| ≤ 0.5, relative accuracy a few ulp (the series' terms shrink like (z/2)^k). */
function lnGammaTwoPlus(z: number): number {
  let sum = 0;
  for (let i = LN_GAMMA_2_SERIES.length - 1; i >= 0; i--) sum = sum * z + LN_GAMMA_2_SERIES[i];
  return z * (1 - EULER_GAMMA + z * sum);
}

/**
 * The remainder of Stirling's series, δ(x) = lnΓ(x) − [(x − ½)ln x − x + ½ln(2π)], for x ≥ 10
 * (Abramowitz & Stegun 1964, 6.1.40: Σ B₂ₖ / (2k(2k − 1)x^{2k−1})). At x = 10 the first omitted term is below
 * 1e-19 in absolute value.
 */
export function stirlingRemainder(x: number): number {
  if (x >= 1e8) return 1 / (12 * x);
  const w = 1 / (x * x);
  // B2/2, B4/12, B6/30, B8/56, B10/90, B12/132, B14/182, B16/240
  return (
    (1 / 12 +
      w *
        (-1 / 360 +
          w *
            (1 / 1260 +
              w * (-1 / 1680 + w * (1 / 1188 + w * (-691 / 360360 + w * (1 / 156 + w * (-3617 / 122400)))))))) /
    x
  );
}

/** sin(πx), exact at the integers and accurate for large |x| (the argument is reduced before multiplying by π). */
function sinPi(x: number): number {
  const r = x - 2 * Math.round(x / 2); // in [−1, 1], exact
  if (r === 0 || r === 1 || r === -1) return 0;
  return Math.sin(Math.PI * r);
}

/**
 * Natural logarithm of |Γ(x)|. Relative accuracy about 1e-15, also near the zeros at x = 1 and x = 2.
 * Returns +Infinity at the poles (0, −1, −2, …) and NaN for NaN or −Infinity.
 * @example lnGamma(0.5) // 0.5723649429247001 = ln √π
 */
export function lnGamma(x: number): number {
  if (Number.isNaN(x) || x === -Infinity) return NaN;
  if (x === Infinity) return Infinity;
  if (x <= 0) {
    if (Number.isInteger(x)) return Infinity;
    // Reflection: Γ(x)Γ(1 − x) = π / sin(πx).
    return Math.log(Math.PI / Math.abs(sinPi(x))) - lnGamma(1 - x);
  }
  if (x < 0.5) return lnGammaTwoPlus(x) - Math.log1p(x) - Math.log(x); // Γ(x) = Γ(2 + x)/((1 + x)x)
  if (x < 1.5) return lnGammaTwoPlus(x - 1) - Math.log1p(x - 1); // x − 1 is exact here
  if (x <= 2.5) return lnGammaTwoPlus(x - 2);
  if (x < 10) {
    // Γ(x) = (x − 1)(x − 2)…(x − n) Γ(x − n) with x − n in [1.5, 2.5); every x − k is exact.
    let product = 1;
    let y = x;
    while (y > 2.5) {
      y -= 1;
      product *= y;
    }
    return lnGammaTwoPlus(y - 2) + Math.log(product);
  }
  return (x - 0.5) * Math.log(x) - x + LN_SQRT_2PI + stirlingRemainder(x);
}

/**
 * Natural logarithm of the beta function B(a, b) = Γ(a)Γ(b)/Γ(a + b) for a, b > 0, without the cancellation of
 * lnΓ(a) + lnΓ(b) − lnΓ(a + b) when an argument is large (Didonato & Morris 1992, ACM TOMS 18:360–373).
 * Returns NaN for NaN or negative arguments and +Infinity when an argument is 0.
 * @example lnBeta(0.5, 0.5) // 1.1447298858494002 = ln π
 */
export function lnBeta(a: number, b: number): number {
  if (Number.isNaN(a) || Number.isNaN(b) || a < 0 || b < 0) return NaN;
  const p = Math.min(a, b);
  const q = Math.max(a, b);
  if (p === 0) return Infinity;
  if (q === Infinity) return -Infinity;
  const sum = p + q;
  if (p >= 10) {
    const correction = stirlingRemainder(p) + stirlingRemainder(q) - stirlingRemainder(sum);
    return (
      -0.5 * Math.log(q) + LN_SQRT_2PI + correction + (p - 0.5) * Math.log(p / sum) + q * Math.log1p(-p / sum)
    );
  }
  if (q >= 10) {
    const correction = stirlingRemainder(q) - stirlingRemainder(sum);
    return lnGamma(p) + correction + p - p * Math.log(sum) + (q - 0.5) * Math.log1p(-p / sum);
  }
  return lnGamma(p) + lnGamma(q) - lnGamma(sum);
}

/** 1/(2k + 1), k = 1 … 17. */
const ATANH_SERIES: Float64Array = (() => {
  const c = new Float64Array(17);
  for (let i = 0; i < c.length; i++) c[i] = 1 / (2 * i + 3);
  return c;
})();

/**
 * log(1 + x) − x for x > −1, accurate also where the two terms nearly cancel (small |x|): with t = x/(2 + x),
 * log(1 + x) = 2·atanh(t) and the series of atanh is summed after the cancelling term is taken out analytically.
 */
export function log1pMinusX(x: number): number {
  if (x < -0.5 || x > 0.5) return Math.log1p(x) - x;
  const t = x / (2 + x); // |t| ≤ 1/3, so t² ≤ 1/9 and 17 terms reach 1e-17
  const t2 = t * t;
  // x − log1p(x) = 2t²/(1 − t) − 2t³ Σ_{k ≥ 1} t^{2k−2}/(2k + 1)
  let series = 0;
  for (let i = ATANH_SERIES.length - 1; i >= 0; i--) series = series * t2 + ATANH_SERIES[i];
  return -((2 * t2) / (1 - t) - 2 * t * t2 * series);
}

