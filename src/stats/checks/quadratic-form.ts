import { integrate } from '../internal/quadrature';

/** The two tail probabilities of a quadratic form in standard normals at 0. */
export interface QuadraticFormTails {
  /** P(sum w_j z_j^2 < 0). */
  below: number;
  /** P(sum w_j z_j^2 > 0). */
  above: number;
}

/**
 * Distribution of Q = sum_j w_j z_j^2 (z_j independent standard normal) at 0, accurate in relative terms in both
 * tails, down to the smallest positive double.
 *
 * Method: numerical inversion of the moment generating function M(s) = prod (1 - 2 w_j s)^(-1/2) along a vertical
 * line through the saddle point (Rice 1980, "Distribution of quadratic forms in normal random variables:
 * evaluation by numerical integration", SIAM Journal on Scientific and Statistical Computing 1:438-448; the
 * inversion integral itself is Gil-Pelaez's, 1951, Biometrika 38:481-482):
 *   P(Q < 0) = (1 / 2 pi i) integral over c - i inf .. c + i inf of M(s) / (-s) ds,  c < 0 in the strip where M exists,
 *   P(Q > 0) = (1 / 2 pi i) integral over the same line of M(s) / s ds,             c > 0.
 * With c at the minimum of log M(s) - log|s| on the real line (the saddle point) the integrand keeps one sign near
 * the real axis and its size is that of the answer, so the integral has no cancellation and a relative tolerance
 * on it is a relative tolerance on the probability: exp(K(c)) is factored out, where K = log M. The substitution
 * y = |c| tan(phi) maps the line to phi in (0, pi/2) and removes the 1/s factor's peak:
 *   P(Q < 0) = exp(K(c)) / pi * integral_0^(pi/2) rho (cos theta - tan phi sin theta) d phi,
 *   P(Q > 0) = exp(K(c)) / pi * integral_0^(pi/2) rho (cos theta + tan phi sin theta) d phi,
 * with rho exp(i theta) = M(c + i y) / M(c) = prod (1 - 2 w_j (c + i y))^(-1/2) / (1 - 2 w_j c)^(-1/2).
 * The smaller tail is computed so; the other is 1 minus it (at least 1/2, so no digits are lost). Replaces Imhof's
 * (1961) inversion at 0, which gives each tail as 1/2 minus an integral and so loses every digit below about 1e-12.
 *
 * @param weights the w_j (any scale; zeros are allowed and ignored)
 * @example quadraticFormTails([1, -1]).below // 0.5 (a symmetric form)
 */
export function quadraticFormTails(weights: ArrayLike<number>): QuadraticFormTails {
  let big = 0;
  for (let j = 0; j < weights.length; j++) big = Math.max(big, Math.abs(weights[j]));
  if (!(big > 0)) return { below: 0, above: 0 };
  const w: number[] = [];
  let sum = 0;
  let lo = 0;
  let hi = 0;
  for (let j = 0; j < weights.length; j++) {
    if (weights[j] === 0) continue;
    const v = weights[j] / big;
    w.push(v);
    sum += v;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === 0) return { below: 0, above: 1 }; // every weight positive: Q > 0 surely
  if (hi === 0) return { below: 1, above: 0 };
  // The tail on the far side of the mean is the smaller one (the mean sum w_j is E Q).
  if (sum >= 0) {
    const below = tail(w, 'below', 1 / (2 * lo));
    return { below, above: 1 - below };
  }
  const above = tail(w, 'above', 1 / (2 * hi));
  return { below: 1 - above, above };
}

/** K(s) = log M(s) for real s in the strip, and its first two derivatives. */
function cumulants(w: number[], s: number): { k: number; k1: number; k2: number } {
  let k = 0;
  let k1 = 0;
  let k2 = 0;
  for (let j = 0; j < w.length; j++) {
    const r = 1 - 2 * w[j] * s;
    k -= 0.5 * Math.log(r);
    const q = w[j] / r;
    k1 += q;
    k2 += 2 * q * q;
  }
  return { k, k1, k2 };
}

/**
 * One tail by the saddle-point line integral. `edge` is the end of the strip on that side: 1/(2 w_min) < 0 for the
 * lower tail, 1/(2 w_max) > 0 for the upper.
 */
function tail(w: number[], side: 'below' | 'above', edge: number): number {
  // The saddle point minimises h(s) = K(s) - log|s| over (edge, 0) or (0, edge): h is convex there and h' runs from
  // -inf to +inf (or the reverse), so safeguarded Newton on h' = K' - 1/s with a bracket finds it.
  let a = side === 'below' ? edge : 0;
  let b = side === 'below' ? 0 : edge;
  let c = (a + b) / 2;
  for (let it = 0; it < 200; it++) {
    const { k1, k2 } = cumulants(w, c);
    const g = k1 - 1 / c; // h'(c), increasing in c
    if (g > 0) b = c;
    else a = c;
    const step = g / (k2 + 1 / (c * c));
    let next = c - step;
    if (!(next > a && next < b)) next = (a + b) / 2;
    if (Math.abs(next - c) <= 1e-14 * Math.abs(c) || b - a <= 1e-15 * Math.abs(c)) {
      c = next;
      break;
    }
    c = next;
  }
  const kc = cumulants(w, c).k;
  const ac = Math.abs(c);
  const sign = side === 'below' ? -1 : 1;
  const r = w.map((v) => 1 - 2 * v * c);
  const f = (phi: number): number => {
    const t = Math.tan(phi);
    const y = ac * t;
    let logRho = 0;
    let theta = 0;
    for (let j = 0; j < w.length; j++) {
      const q = (-2 * w[j] * y) / r[j];
      logRho -= 0.25 * Math.log1p(q * q);
      theta -= 0.5 * Math.atan(q);
    }
    return Math.exp(logRho) * (Math.cos(theta) + sign * t * Math.sin(theta));
  };
  const integral = integrate(f, 0, Math.PI / 2, { absTol: 0, relTol: 1e-12, maxPieces: 4000 });
  const p = Math.exp(kc) * (integral / Math.PI);
  return p < 0 ? 0 : p > 1 ? 1 : p;
}
