/**
 * The n - 2 non-zero eigenvalues of M A M, the matrix whose eigenvalues are the weights of the Durbin-Watson
 * statistic for the line y = a + b x (A the first-difference matrix, tridiagonal with 1, 2, ..., 2, 1 on the
 * diagonal and -1 beside it; M the projection onto the residual space of [1, x]), in O(n^2) time instead of the
 * O(n^3) of a general eigensolver.
 *
 * A's eigenvectors are the DCT-II vectors v_k(t) = sqrt(2/n) cos(pi k (t - 1/2) / n) with eigenvalues
 * l_k = 2 - 2 cos(pi k / n) (Durbin & Watson 1950, Biometrika 37:409-428, sec. 4). Because A1 = 0, M A M is A
 * compressed to the hyperplane orthogonal to u = the centred x, normalised, within the span of v_1..v_(n-1); the
 * eigenvalues of such a compression are the roots of the secular equation
 *   f(m) = sum_k a_k^2 / (l_k - m) = 0,   a_k = v_k . u,
 * one between each two consecutive poles (Golub 1973, "Some modified matrix eigenvalue problems", SIAM Review
 * 15:318-334). A pole whose a_k is negligible is itself an eigenvalue (deflation). Each root is found by the
 * two-pole rational iteration of Bunch, Nielsen & Sorensen (1978, "Rank-one modification of the symmetric
 * eigenproblem", Numerische Mathematik 31:31-48) inside its bracket, with bisection as the safeguard.
 */

/** The eigenvalues of A, l_0 = 0 < l_1 < ... < l_(n-1) < 4. */
export function differenceEigenvalues(n: number): Float64Array {
  const l = new Float64Array(n);
  // 2 - 2 cos(t) = 4 sin^2(t/2): no cancellation for the small ones.
  for (let k = 0; k < n; k++) {
    const s = Math.sin((Math.PI * k) / (2 * n));
    l[k] = 4 * s * s;
  }
  return l;
}

/** a_k = v_k . u for k = 1..n-1 (index k), by the three-term cosine recurrence per k (O(n^2), no cos per term). */
function dctCoefficients(u: ArrayLike<number>): Float64Array {
  const n = u.length;
  const a = new Float64Array(n);
  const scale = Math.sqrt(2 / n);
  for (let k = 1; k < n; k++) {
    const theta = (Math.PI * k) / n;
    const two = 2 * Math.cos(theta);
    // cos(theta (t + 1/2)) for t = 0, 1, ...: c_{t+1} = two c_t - c_{t-1}, started exactly.
    let prev = Math.cos(-theta / 2);
    let cur = Math.cos(theta / 2);
    let sum = cur * u[0];
    for (let t = 1; t < n; t++) {
      const next = two * cur - prev;
      prev = cur;
      cur = next;
      sum += cur * u[t];
    }
    a[k] = scale * sum;
  }
  return a;
}

/**
 * The n - 2 eigenvalues of M A M other than the two zeros, ascending.
 * @param u the centred x divided by its norm (sum u = 0, sum u^2 = 1)
 */
export function residualSpaceSpectrum(u: ArrayLike<number>): Float64Array {
  const n = u.length;
  const l = differenceEigenvalues(n);
  const a = dctCoefficients(u);
  let total = 0;
  for (let k = 1; k < n; k++) total += a[k] * a[k];
  // Poles that carry weight; the others are eigenvalues of M A M as they stand.
  const poles: number[] = [];
  const weight: number[] = [];
  const out: number[] = [];
  for (let k = 1; k < n; k++) {
    const w = a[k] * a[k];
    if (w > 1e-28 * total) {
      poles.push(l[k]);
      weight.push(w);
    } else out.push(l[k]);
  }
  const m = poles.length;
  for (let i = 0; i + 1 < m; i++) out.push(rootBetween(poles, weight, i));
  out.sort((p, q) => p - q);
  return Float64Array.from(out);
}

/** The root of sum weight_k / (poles_k - x) strictly between poles i and i + 1. */
function rootBetween(poles: number[], weight: number[], i: number): number {
  const m = poles.length;
  const left = poles[i];
  const gap = poles[i + 1] - left;
  // Work in delta = x - left: poles_k - x = (poles_k - left) - delta keeps the digits near the left pole.
  const off = new Float64Array(m);
  for (let k = 0; k < m; k++) off[k] = poles[k] - left;
  let lo = 0;
  let hi = gap;
  let delta = gap / 2;
  for (let it = 0; it < 100; it++) {
    // psi: poles at or left of i (negative part), phi: the others; their derivatives.
    let psi = 0, dpsi = 0, phi = 0, dphi = 0;
    for (let k = 0; k < m; k++) {
      const d = off[k] - delta;
      const q = weight[k] / d;
      if (k <= i) {
        psi += q;
        dpsi += q / d;
      } else {
        phi += q;
        dphi += q / d;
      }
    }
    const f = psi + phi;
    if (f < 0) lo = delta;
    else hi = delta;
    if (f === 0 || hi - lo <= 4 * Number.EPSILON * (left + delta)) break;
    // Model psi ~ A/(0 - delta) + s1 and phi ~ B/(gap - delta) + s2 with matching value and slope, then solve the
    // model exactly: A/(-delta') + B/(gap - delta') + C = 0 (a quadratic in delta').
    const dl = -delta; // off[i] - delta
    const dr = gap - delta; // off[i + 1] - delta
    const A = dpsi * dl * dl;
    const B = dphi * dr * dr;
    const C = psi - A / dl + phi - B / dr;
    let next = NaN;
    // -A/e + B/(gap - e) + C = 0  =>  C e^2 - (C gap + B + A) e ... solve C e (gap - e) - A (gap - e) + B e = 0.
    const qa = -C;
    const qb = C * gap + A + B;
    const qc = -A * gap;
    if (qa === 0) next = -qc / qb;
    else {
      const disc = qb * qb - 4 * qa * qc;
      if (disc >= 0) {
        const sq = Math.sqrt(disc);
        const r1 = (-qb + sq) / (2 * qa);
        const r2 = (-qb - sq) / (2 * qa);
        next = r1 > lo && r1 < hi ? r1 : r2;
      }
    }
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - delta) <= 2 * Number.EPSILON * (left + next)) {
      delta = next;
      break;
    }
    delta = next;
  }
  return left + delta;
}
