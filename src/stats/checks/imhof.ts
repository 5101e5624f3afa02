import { integrate } from '../internal/quadrature';

/** The two tail probabilities of a quadratic form in standard normals at 0. */
export interface QuadraticFormTails {
  /** P(sum w_j z_j^2 < 0). */
  below: number;
  /** P(sum w_j z_j^2 > 0). */
  above: number;
}

/**
 * Distribution of Q = sum_j w_j z_j^2 (z_j independent standard normal) at 0, by Imhof's inversion formula
 * (Imhof 1961, "Computing the distribution of quadratic forms in normal variables", Biometrika 48:419-426, eq. 3.2):
 *   P(Q > 0) = 1/2 + (1/pi) integral_0^inf sin(theta(u)) / (u rho(u)) du,
 *   theta(u) = (1/2) sum atan(w_j u),  rho(u) = prod (1 + w_j^2 u^2)^(1/4).
 * At 0 the integrand does not oscillate (theta tends to a constant), so after the substitution u = s/(1 - s) an
 * adaptive Gauss-Kronrod rule on [0, 1) reaches about 1e-12 absolute accuracy. Both tails are returned, each as
 * 1/2 -/+ the integral, so neither is formed as 1 minus the other.
 * @param weights the w_j (any scale; zeros are allowed and ignored)
 * @example quadraticFormTails([1, -1]).below // 0.5 (a symmetric form)
 */
export function quadraticFormTails(weights: ArrayLike<number>): QuadraticFormTails {
  let big = 0;
  for (let j = 0; j < weights.length; j++) big = Math.max(big, Math.abs(weights[j]));
  if (!(big > 0)) return { below: 0, above: 0 };
  const w: number[] = [];
  for (let j = 0; j < weights.length; j++) if (weights[j] !== 0) w.push(weights[j] / big);
  const integrand = (u: number): number => {
    let theta = 0;
    let logRho = 0;
    for (const wj of w) {
      const a = wj * u;
      theta += Math.atan(a);
      logRho += Math.log1p(a * a);
    }
    return Math.sin(0.5 * theta) / (u * Math.exp(0.25 * logRho));
  };
  const mapped = (s: number): number => {
    const u = s / (1 - s);
    return integrand(u) / ((1 - s) * (1 - s));
  };
  const value = integrate(mapped, 0, 1, { absTol: 1e-13, relTol: 0, maxPieces: 4000 });
  const i = value / Math.PI;
  const clip = (p: number): number => Math.min(1, Math.max(0, p));
  return { below: clip(0.5 - i), above: clip(0.5 + i) };
}
