/**
 * The Bayes factor for a correlation against none, and the posterior of rho, from r and n.
 *
 * Model (Ly, Verhagen & Wagenmakers 2016, "Harold Jeffreys's default Bayes factor hypothesis tests: explanation,
 * extension, and application in psychology", Journal of Mathematical Psychology 72:19-32):
 * - likelihood: the exact sampling density of r for n rows of a bivariate normal with correlation rho (Jeffreys
 *   1961, Theory of Probability, 3rd ed., sec. 5.5), here in Hotelling's (1953) form, as a function of rho:
 *     L(rho) proportional to (1 - rho^2)^((n-1)/2) (1 - rho r)^-(n - 3/2) 2F1(1/2, 1/2; n - 1/2; (1 + rho r)/2);
 * - prior on rho under H1: the stretched beta of width kappa, (rho + 1)/2 ~ Beta(1/kappa, 1/kappa) (kappa = 1 is
 *   uniform on (-1, 1));
 * - BF10 = integral L(rho) prior(rho) d rho / L(0); the posterior is L(rho) prior(rho) / (that integral).
 * Computed by adaptive quadrature in zeta = atanh(rho), where the integrand is close to a normal curve of width
 * 1/sqrt(n) at every n, factored around its mode so that BF10 may be astronomically large or small without
 * overflow (log BF10 is kept).
 */
import { goldenSectionMinimum } from '../internal/golden-section';
import { integrate } from '../internal/quadrature';
import { hypergeometricHalves, logCosh } from '../distributions/r-distribution';
import { lnBeta } from '../distributions';
import { StatsInputError } from '../types';

export interface BayesResult {
  r: number;
  n: number;
  /** The prior width kappa. */
  priorWidth: number;
  /** Prior odds of a correlation against none. */
  priorOdds: number;
  /** log(BF10), natural log. */
  logBf10: number;
  /** BF10 and BF01 = 1/BF10 (Infinity or 0 beyond the range of doubles: use logBf10). */
  bf10: number;
  bf01: number;
  /** Posterior probability that rho != 0, at the prior odds. */
  posteriorProbability: number;
  /** Posterior median of rho under H1, and the central credible interval at `level`. */
  median: number;
  lower: number;
  upper: number;
  level: number;
  /** Posterior mean of rho under H1. */
  mean: number;
}

export interface BayesOptions {
  /** kappa > 0, default 1 (uniform prior on rho). */
  priorWidth?: number;
  /** Prior odds of H1 against H0, default 1. */
  priorOdds?: number;
  /** Level of the central credible interval, default 0.95. */
  level?: number;
}

/**
 * Bayes factor and posterior for a correlation r from n rows (see the module note).
 * @throws StatsInputError when |r| >= 1, n < 3 or not whole, kappa <= 0, or the prior odds are not positive.
 * @example bayesCorrelation(0.3, 48).bf10
 */
export function bayesCorrelation(r: number, n: number, opts: BayesOptions = {}): BayesResult {
  const kappa = opts.priorWidth ?? 1;
  const odds = opts.priorOdds ?? 1;
  const level = opts.level ?? 0.95;
  if (!(Math.abs(r) < 1)) throw new StatsInputError('out-of-range', `r must lie strictly between -1 and 1 (got ${r})`);
  if (!(Number.isInteger(n) && n >= 3)) throw new StatsInputError('out-of-range', `n must be a whole number of at least 3 (got ${n})`);
  if (!(kappa > 0 && Number.isFinite(kappa))) throw new StatsInputError('out-of-range', `the prior width must be a positive number, e.g. 1 (got ${kappa})`);
  if (!(odds > 0 && Number.isFinite(odds))) throw new StatsInputError('out-of-range', `the prior odds must be a positive number, e.g. 1 (got ${odds})`);
  if (!(level > 0 && level < 1)) throw new StatsInputError('out-of-range', `level must be between 0 and 1 (got ${level})`);
  const a = 1 / kappa;
  const z = Math.atanh(r);
  const c = n - 0.5;
  const logF0 = Math.log(hypergeometricHalves(c, 0.5));
  // Prior in zeta: 2^(1 - 2a) / B(a, a) sech(zeta)^(2a).
  const logPriorConst = (1 - 2 * a) * Math.LN2 - lnBeta(a, a);
  const logIntegrand = (zeta: number): number => {
    const rho = Math.tanh(zeta);
    const logLr = -0.5 * logCosh(zeta) - (n - 1.5) * (logCosh(z - zeta) - logCosh(z)) + Math.log(hypergeometricHalves(c, (1 + rho * r) / 2)) - logF0;
    return logLr + logPriorConst - 2 * a * logCosh(zeta);
  };
  // The mode: golden sections on a bracket around z and 0 (the log integrand is unimodal: a log-concave prior
  // times a likelihood whose log is concave in zeta near its peak).
  const width = 1 / Math.sqrt(Math.max(1, n - 1.5));
  // Its maximum, as the minimum of its negative.
  const mode = goldenSectionMinimum((v) => -logIntegrand(v), Math.min(z, 0) - 20 * width - 2, Math.max(z, 0) + 20 * width + 2, (p, q) => q - p <= 1e-12);
  const peak = logIntegrand(mode);
  // The integrand falls at least like exp(-(n - 3/2 + 2a)|zeta - mode|) far from the mode and like a normal curve
  // of width ~1/sqrt(n) near it: this window leaves out less than e^-60 of the mass.
  const reach = 12 * width + 60 / (n - 1.5 + 2 * a);
  const from = mode - reach;
  const to = mode + reach;
  const f = (t: number): number => Math.exp(logIntegrand(t) - peak);
  const tol = { absTol: 0, relTol: 1e-12, maxPieces: 2000 };
  const left = integrate(f, from, mode, tol);
  const right = integrate(f, mode, to, tol);
  const total = left + right;
  const logBf10 = peak + Math.log(total);
  const bf10 = Math.exp(logBf10);
  // Quantiles by Newton's method on the posterior CDF in zeta (its derivative is the density), each step adding the
  // integral from the last point, inside a bracket that bisection falls back on.
  const quantile = (p: number): number => {
    let a0 = from;
    let b0 = to;
    let t = mode;
    let at = left / total; // the CDF at t
    for (let it = 0; it < 60; it++) {
      const gap = at - p;
      if (gap < 0) a0 = t;
      else b0 = t;
      if (Math.abs(gap) <= 1e-13) break;
      let next = t - gap / (f(t) / total);
      if (!(next > a0 && next < b0)) next = (a0 + b0) / 2;
      const step = next > t ? integrate(f, t, next, tol) : -integrate(f, next, t, tol);
      at += step / total;
      if (Math.abs(next - t) <= 1e-14 * Math.max(1, Math.abs(t))) {
        t = next;
        break;
      }
      t = next;
    }
    return Math.tanh(t);
  };
  const mean = (integrate((t) => Math.tanh(t) * f(t), from, mode, tol) + integrate((t) => Math.tanh(t) * f(t), mode, to, tol)) / total;
  const tailP = (1 - level) / 2;
  // P(H1 | data) = BF10 odds / (1 + BF10 odds), in logs so that huge or tiny BF10 stay exact.
  const logPost = logBf10 + Math.log(odds);
  const posteriorProbability = logPost > 0 ? 1 / (1 + Math.exp(-logPost)) : Math.exp(logPost) / (1 + Math.exp(logPost));
  return {
    r, n, priorWidth: kappa, priorOdds: odds, logBf10, bf10, bf01: Math.exp(-logBf10), posteriorProbability,
    median: quantile(0.5), lower: quantile(tailP), upper: quantile(1 - tailP), level, mean,
  };
}
