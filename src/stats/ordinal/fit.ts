/**
 * What the ordinal coefficients (polychoric, polyserial) return, the options they take, and the pieces both
 * share: the bound on |rho|, the likelihood-ratio test of rho = 0 and the interval.
 */
import { chiSquareSf, normalQuantile } from '../distributions';
import { Interval, StatsInputError } from '../types';

/** How rho is estimated. */
export type OrdinalEstimator = 'two-step' | 'ml';

export const ORDINAL_ESTIMATORS: readonly OrdinalEstimator[] = ['two-step', 'ml'];

export interface OrdinalOptions {
  /**
   * 'two-step' (the default): thresholds from the marginal proportions, then rho alone by maximum likelihood;
   * 'ml': thresholds and rho jointly by maximum likelihood.
   */
  estimator?: OrdinalEstimator;
}

/**
 * The largest |rho| the estimators consider. When the likelihood still rises there (perfect association: a
 * table with only diagonal cells, a 2 × 2 table with one empty cell, categories of y cut exactly from x), its
 * supremum is at |rho| = 1 and no finite maximum exists. rho is then reported at the bound, with its
 * log-likelihood and G² there (a slight understatement of the limit), no standard error (NaN, so no interval)
 * and a note saying so: a number a reader can take as "as good as perfect", rather than NaN for the estimate.
 */
export const RHO_BOUND = 0.9999;

/** The fit of a polychoric or polyserial correlation. */
export interface OrdinalFit {
  /** The estimated correlation of the underlying normal variables, in [−RHO_BOUND, RHO_BOUND]. */
  rho: number;
  /**
   * Its standard error from the observed information: for 'two-step' the one-parameter information with the
   * thresholds held fixed (it does not count their sampling error), for 'ml' the rho element of the inverse of
   * the full information matrix. NaN when rho sits at the bound.
   */
  se: number;
  estimator: OrdinalEstimator;
  /** Thresholds of x on the normal scale (polychoric only), one fewer than its categories. */
  thresholdsX?: number[];
  /** Thresholds of y on the normal scale, one fewer than its categories. */
  thresholdsY: number[];
  /** The categories of x, ascending (polychoric only). */
  categoriesX?: number[];
  /** The categories of y, ascending. */
  categoriesY: number[];
  /**
   * The log-likelihood at the estimate: Σ n_ij log p_ij for polychoric (without the multinomial coefficient);
   * Σ [log φ(z_i) + log P(y_i | z_i)] for polyserial, z the standardised x (without the Jacobian 1/s_x).
   */
  logLik: number;
  n: number;
  /**
   * Likelihood-ratio statistic of rho = 0, G² = 2(logLik − logLik at rho = 0). For 'ml' the thresholds are
   * re-fitted under rho = 0, where their maximum-likelihood values are the marginal ones; for 'two-step' they
   * are the marginal ones anyway. So both use the same null likelihood.
   */
  lrStatistic: number;
  /** Two-sided p-value of G² against chi-square with 1 df. */
  pValue: number;
  /** sign(rho)·√G², standard normal under rho = 0: its tails give one-sided p-values. */
  signedZ: number;
  /** Newton iterations of the final maximisation (for 'ml', the joint one after the two-step start). */
  iterations: number;
  converged: boolean;
  /** Why se is NaN or the estimate is doubtful, when it is. */
  note?: string;
}

/** Checks the options and returns the estimator asked for. */
export function readEstimator(opts: OrdinalOptions | undefined, fn: string): OrdinalEstimator {
  const estimator = opts?.estimator ?? 'two-step';
  if (!ORDINAL_ESTIMATORS.includes(estimator)) {
    throw new StatsInputError('bad-option', `${fn}: the estimator must be "two-step" or "ml" (got "${String(estimator)}")`);
  }
  return estimator;
}

/** The likelihood-ratio fields of a fit: G², its p-value and the signed root. */
export function likelihoodRatio(rho: number, logLik: number, logLikNull: number): Pick<OrdinalFit, 'lrStatistic' | 'pValue' | 'signedZ'> {
  const g2 = Math.max(0, 2 * (logLik - logLikNull));
  const root = Math.sqrt(g2);
  return { lrStatistic: g2, pValue: chiSquareSf(g2, 1), signedZ: rho < 0 ? -root : root };
}

/** The note of a fit whose maximum sat at the bound or did not converge; undefined otherwise. */
export function fitNote(atBound: boolean, converged: boolean, iterations: number): string | undefined {
  if (atBound) {
    return (
      `the likelihood keeps rising towards rho = ±1 (the categories agree almost perfectly): rho is reported at ` +
      `the bound ±${RHO_BOUND} and has no standard error`
    );
  }
  if (!converged) return `the maximisation stopped after ${iterations} steps without converging: rho is the best value found`;
  return undefined;
}

/** `{ note }` when there is one, else nothing (so a clean fit has no note key at all). */
export function withNote(note: string | undefined): { note?: string } {
  return note === undefined ? {} : { note };
}

/**
 * Two-sided Wald interval for a polychoric or polyserial rho, made on Fisher's z scale (Fisher 1915, Biometrika
 * 10:507–521): tanh(atanh(rho) ± q·se/(1 − rho²)), q the normal quantile for `level`; the delta method carries se
 * to the z scale, and the tanh keeps the bounds inside (−1, 1). NaN bounds with a note when se is not finite.
 * @example ordinalInterval(0.5, 0.05, 0.95) // { lower: 0.3957856714181196, upper: 0.591500158474476, ... }
 */
export function ordinalInterval(rho: number, se: number, level: number): Interval {
  const method = 'Wald on Fisher z, SE(z) = SE(rho)/(1 - rho^2)';
  if (!(level > 0 && level < 1)) throw new StatsInputError('bad-option', `the confidence level must lie between 0 and 1 (got ${level})`);
  if (!Number.isFinite(se) || !(Math.abs(rho) < 1)) {
    return { lower: NaN, upper: NaN, level, method, note: 'no standard error, so no interval: rho is at its bound' };
  }
  const q = normalQuantile(0.5 + level / 2);
  const z = Math.atanh(rho);
  const seZ = se / ((1 - rho) * (1 + rho));
  return { lower: Math.tanh(z - q * seZ), upper: Math.tanh(z + q * seZ), level, method };
}
