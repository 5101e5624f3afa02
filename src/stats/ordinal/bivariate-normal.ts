/**
 * The standard bivariate normal distribution with correlation rho: density, both orthants and rectangle
 * probabilities, to about 1e-15 absolute for every rho in [-1, 1] and every limit, infinite ones included.
 *
 * Method: Genz (2004), "Numerical computation of rectangular bivariate and trivariate normal and t
 * probabilities", Statistics and Computing 14:251–260, section 2.2, which refines Drezner & Wesolowsky (1990),
 * "On the computation of the bivariate normal integral", Journal of Statistical Computation and Simulation
 * 35:101–107. For |rho| < 0.925 the orthant is Φ(−h)Φ(−k) plus Plackett's (1954) integral over θ in
 * [0, asin rho] (Gauss–Legendre with 6, 12 or 20 points for |rho| below 0.3, below 0.75, and above); for
 * |rho| ≥ 0.925 the integral is taken over √(1 − r²) instead, after subtracting the first terms of its series
 * about |rho| = 1, which keeps full accuracy up to |rho| = 1 (where the closed forms Φ(−max(h, k)) and
 * max(0, Φ(−h) − Φ(k)) take over).
 *
 * Rectangles are differenced in whichever reflection of the plane ((x, y) → (−x, y) with rho → −rho, and so on)
 * puts the rectangle towards the lower-left, so that a small cell in the upper tail is a difference of small
 * numbers, not of numbers near 1.
 */
import { normalPdf, normalSf } from '../distributions';

const TWO_PI = 6.283185307179586;

// Gauss–Legendre nodes (negative half) and weights for 6, 12 and 20 points (computed with mpmath 1.2.1, 30 digits).
const GL_NODES: readonly (readonly number[])[] = [
  [-0.93246951420315203, -0.66120938646626451, -0.23861918608319691],
  [
    -0.98156063424671925, -0.90411725637047486, -0.76990267419430469, -0.58731795428661745, -0.36783149899818019,
    -0.12523340851146892,
  ],
  [
    -0.99312859918509492, -0.96397192727791379, -0.91223442825132591, -0.83911697182221882, -0.74633190646015079,
    -0.63605368072651503, -0.5108670019508271, -0.37370608871541956, -0.22778585114164508, -0.076526521133497334,
  ],
];
const GL_WEIGHTS: readonly (readonly number[])[] = [
  [0.17132449237917035, 0.36076157304813861, 0.46791393457269105],
  [
    0.047175336386511827, 0.10693932599531843, 0.16007832854334623, 0.20316742672306592, 0.23349253653835481,
    0.24914704581340279,
  ],
  [
    0.017614007139152118, 0.040601429800386941, 0.062672048334109064, 0.083276741576704749, 0.10193011981724044,
    0.11819453196151842, 0.13168863844917663, 0.14209610931838205, 0.14917298647260375, 0.15275338713072585,
  ],
];

/**
 * P(lo < Z < hi) for a standard normal Z, differenced in the tail where both terms are small (so a narrow
 * interval far out keeps its relative accuracy). 0 when hi ≤ lo; infinite limits allowed.
 * @example normalInterval(-1.959963984540054, 1.959963984540054) // 0.95
 */
export function normalInterval(lo: number, hi: number): number {
  if (!(hi > lo)) return 0;
  if (lo >= 0) return normalSf(lo) - normalSf(hi);
  if (hi <= 0) return normalSf(-hi) - normalSf(-lo);
  return 1 - normalSf(-lo) - normalSf(hi);
}

/**
 * Density of the standard bivariate normal with correlation rho at (h, k):
 * exp(−(h² − 2 rho h k + k²) / (2(1 − rho²))) / (2π √(1 − rho²)). 0 at an infinite coordinate; NaN for |rho| ≥ 1.
 * @example bivariateNormalPdf(0, 0, 0) // 0.15915494309189535
 */
export function bivariateNormalPdf(h: number, k: number, rho: number): number {
  if (!(Math.abs(rho) < 1)) return NaN;
  if (h === Infinity || h === -Infinity || k === Infinity || k === -Infinity) return 0;
  const oneMinus = (1 - rho) * (1 + rho);
  // h² − 2ρhk + k² = (h − ρk)² + (1 − ρ²)k²: the density is φ(k)·φ((h − ρk)/√(1 − ρ²))/√(1 − ρ²), each factor
  // accurate in the tails.
  const s = Math.sqrt(oneMinus);
  return (normalPdf(k) * normalPdf((h - rho * k) / s)) / s;
}

/**
 * Upper orthant P(X > h, Y > k) of the standard bivariate normal with correlation rho (Genz 2004, section 2.2).
 * Infinite limits are allowed; NaN for NaN input or |rho| > 1. Accurate to about 1e-16 absolute; relatively
 * too for rho ≥ 0, while for rho < 0 a tiny orthant (below about 1e-20) is a difference of larger terms.
 * @example bivariateNormalUpper(0, 0, 0.5) // 0.33333333333333337
 */
export function bivariateNormalUpper(h: number, k: number, rho: number): number {
  if (Number.isNaN(h) || Number.isNaN(k) || !(Math.abs(rho) <= 1)) return NaN;
  if (h === Infinity || k === Infinity) return 0;
  if (h === -Infinity) return normalSf(k);
  if (k === -Infinity) return normalSf(h);
  const absRho = Math.abs(rho);
  const set = absRho < 0.3 ? 0 : absRho < 0.75 ? 1 : 2;
  const nodes = GL_NODES[set];
  const weights = GL_WEIGHTS[set];
  let hk = h * k;
  if (absRho < 0.925) {
    // Plackett's integral over θ from 0 to asin(rho), Gauss–Legendre on both halves of [−1, 1].
    const hs = (h * h + k * k) / 2;
    const asr = Math.asin(rho);
    let sum = 0;
    for (let i = 0; i < nodes.length; i++) {
      let sn = Math.sin((asr * (nodes[i] + 1)) / 2);
      sum += weights[i] * Math.exp((sn * hk - hs) / (1 - sn * sn));
      sn = Math.sin((asr * (1 - nodes[i])) / 2);
      sum += weights[i] * Math.exp((sn * hk - hs) / (1 - sn * sn));
    }
    // For rho < 0 the two terms cancel in the tails: absolute accuracy holds, relative does not; never below 0.
    return Math.max(0, (sum * asr) / (2 * TWO_PI) + normalSf(h) * normalSf(k));
  }
  // |rho| ≥ 0.925: the integral over x = √(1 − r²) from 0 to √(1 − rho²), less the start of its series (Genz 2004).
  let kk = k;
  if (rho < 0) {
    kk = -k;
    hk = -hk;
  }
  let bvn = 0;
  if (absRho < 1) {
    const as = (1 - rho) * (1 + rho);
    let a = Math.sqrt(as);
    const bs = (h - kk) * (h - kk);
    const c = (4 - hk) / 8;
    const d = (12 - hk) / 16;
    bvn = a * Math.exp(-(bs / as + hk) / 2) * (1 - (c * (bs - as) * (1 - (d * bs) / 5)) / 3 + (c * d * as * as) / 5);
    if (hk > -160) {
      const b = Math.sqrt(bs);
      bvn -= Math.exp(-hk / 2) * Math.sqrt(TWO_PI) * normalSf(b / a) * b * (1 - (c * bs * (1 - (d * bs) / 5)) / 3);
    }
    a /= 2;
    for (let i = 0; i < nodes.length; i++) {
      let t = a * (nodes[i] + 1);
      let xs = t * t;
      let rs = Math.sqrt(1 - xs);
      bvn +=
        a *
        weights[i] *
        (Math.exp(-bs / (2 * xs) - hk / (1 + rs)) / rs - Math.exp(-(bs / xs + hk) / 2) * (1 + c * xs * (1 + d * xs)));
      t = a * (1 - nodes[i]);
      xs = t * t;
      rs = Math.sqrt(1 - xs);
      bvn +=
        a *
        weights[i] *
        Math.exp(-(bs / xs + hk) / 2) *
        (Math.exp((-hk * (1 - rs)) / (2 * (1 + rs))) / rs - (1 + c * xs * (1 + d * xs)));
    }
    bvn = -bvn / TWO_PI;
  }
  if (rho > 0) return Math.max(0, bvn + normalSf(Math.max(h, kk)));
  // rho < 0: P(X > h, −X' > k) with X' the reflected partner: the slab h < X < −k less the correction.
  return Math.max(0, -bvn + normalInterval(h, kk));
}

/**
 * Lower orthant P(X ≤ h, Y ≤ k), the bivariate normal distribution function (by symmetry, the upper orthant at
 * (−h, −k)).
 * @example bivariateNormalCdf(0, 0, -0.5) // 0.16666666666666666
 */
export function bivariateNormalCdf(h: number, k: number, rho: number): number {
  return bivariateNormalUpper(-h, -k, rho);
}

/**
 * P(x0 < X ≤ x1, y0 < Y ≤ y1) for the standard bivariate normal with correlation rho; limits may be infinite.
 * 0 for an empty rectangle. Differenced after reflecting the rectangle towards the lower-left (see the note at
 * the top), and never negative.
 * @example bivariateNormalRectangle(-Infinity, 0, 0, Infinity, 0.5) // 0.16666666666666666
 */
export function bivariateNormalRectangle(x0: number, x1: number, y0: number, y1: number, rho: number): number {
  if (!(x1 > x0) || !(y1 > y0)) return Number.isNaN(x0 + x1 + y0 + y1 + rho) ? NaN : 0;
  const wholeX = x0 === -Infinity && x1 === Infinity;
  const wholeY = y0 === -Infinity && y1 === Infinity;
  if (wholeX) return normalInterval(y0, y1);
  if (wholeY) return normalInterval(x0, x1);
  let r = rho;
  if (x0 + x1 > 0) {
    const t = x0;
    x0 = -x1;
    x1 = -t;
    r = -r;
  }
  if (y0 + y1 > 0) {
    const t = y0;
    y0 = -y1;
    y1 = -t;
    r = -r;
  }
  // Now x0 < x1 with x0 + x1 ≤ 0 (so x0 is finite only if x1 is), and the same for y.
  let p = bivariateNormalCdf(x1, y1, r);
  if (x0 !== -Infinity) p -= bivariateNormalCdf(x0, y1, r);
  if (y0 !== -Infinity) p -= bivariateNormalCdf(x1, y0, r);
  if (x0 !== -Infinity && y0 !== -Infinity) p += bivariateNormalCdf(x0, y0, r);
  return p > 0 ? p : 0;
}
