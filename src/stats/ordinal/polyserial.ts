/**
 * The polyserial correlation: the correlation between a continuous column x and the normal variable that, cut
 * at thresholds, gives the ordered categorical column y (Olsson, Drasgow & Dorans 1982, "The polyserial
 * correlation coefficient", Psychometrika 47:337–347; with two categories, the biserial correlation).
 *
 * The model: z = (x − x̄)/s_x is standard normal (s_x with divisor n − 1), and given z the latent variable is
 * normal with mean rho·z and variance 1 − rho², so
 *   P(y = k | z) = Φ((τ_k − rho z)/√(1 − rho²)) − Φ((τ_{k−1} − rho z)/√(1 − rho²)),  τ_0 = −∞, τ_s = +∞,
 * and the log-likelihood is Σ [log φ(z_i) + log P(y_i | z_i)]. The first sum is −(n/2)·log(2π) − (n − 1)/2
 * exactly, since Σ z² = n − 1.
 *
 * Estimators (Olsson, Drasgow & Dorans 1982):
 * - 'two-step': τ_k = Φ⁻¹(cumulative proportion of y), then rho alone by maximum likelihood (Newton on the
 *   score, started from their ad hoc estimate r_xy·s_y/Σ φ(τ_k), y scored 1..s);
 * - 'ml': rho and the thresholds jointly (Newton on the analytic gradient and Hessian), started from the
 *   two-step estimate. x stays standardised by its sample mean and standard deviation: the mean and variance
 *   of x are not re-estimated with rho, so the information matrix (and the standard error) is that of rho and
 *   the thresholds given them.
 *
 * Cost: each evaluation is one pass over the rows (two normal tails and two densities a row), with the
 * derivatives summed per category; a fit takes about five to ten passes. The only row-sized arrays are z
 * (8 bytes a row) and y's category codes (1 byte a row).
 */
import { normalPdf } from '../distributions';
import { StatsInputError } from '../types';
import { normalInterval } from './bivariate-normal';
import { readCategories } from './categories';
import { fitNote, likelihoodRatio, OrdinalFit, OrdinalOptions, readEstimator, RHO_BOUND, withNote } from './fit';
import { inverseInformationFirst, maximiseNewton, maximiseOnInterval, Objective1D, ObjectiveN } from './maximise';
import { increasing, marginalThresholds } from './polychoric';

const LOG_2PI = 1.8378770664093453;

/** Per-category sums of the score and information terms of one evaluation. */
interface CategorySums {
  value: number;
  /** ∂/∂rho, ∂/∂τ_lower, ∂/∂τ_upper of log P, summed over the rows of each category. */
  gR: Float64Array;
  gLo: Float64Array;
  gHi: Float64Array;
  /** Second derivatives of log P: rho-rho, rho-lower, rho-upper, lower-lower, upper-upper, lower-upper. */
  hRR: Float64Array;
  hRLo: Float64Array;
  hRHi: Float64Array;
  hLoLo: Float64Array;
  hHiHi: Float64Array;
  hLoHi: Float64Array;
}

/**
 * One pass over the rows: Σ log P(y_i | z_i) and, when `withThresholds`, every first and second derivative,
 * else those in rho only. With u = (τ − rho z)/s, s = √(1 − rho²):
 * ∂u/∂rho = (rho τ − z)/s³ =: w, ∂u/∂τ = 1/s, ∂w/∂rho = τ/s³ + 3 rho (rho τ − z)/s⁵, φ′(u) = −u φ(u).
 */
function pass(z: Float64Array, codes: Uint8Array, tau: ArrayLike<number>, rho: number, withThresholds: boolean): CategorySums {
  const cats = tau.length + 1;
  const sums: CategorySums = {
    value: 0,
    gR: new Float64Array(cats),
    gLo: new Float64Array(cats),
    gHi: new Float64Array(cats),
    hRR: new Float64Array(cats),
    hRLo: new Float64Array(cats),
    hRHi: new Float64Array(cats),
    hLoLo: new Float64Array(cats),
    hHiHi: new Float64Array(cats),
    hLoHi: new Float64Array(cats),
  };
  const s2 = (1 - rho) * (1 + rho);
  const s = Math.sqrt(s2);
  const s3 = s2 * s;
  const last = cats - 1;
  let value = 0;
  for (let i = 0; i < z.length; i++) {
    const k = codes[i];
    const zi = z[i];
    const hasLo = k > 0;
    const hasHi = k < last;
    const tLo = hasLo ? tau[k - 1] : -Infinity;
    const tHi = hasHi ? tau[k] : Infinity;
    const uLo = hasLo ? (tLo - rho * zi) / s : -Infinity;
    const uHi = hasHi ? (tHi - rho * zi) / s : Infinity;
    const p = normalInterval(uLo, uHi);
    if (!(p > 0)) {
      sums.value = -Infinity;
      return sums;
    }
    value += Math.log(p);
    const ip = 1 / p;
    let fLo = 0;
    let fHi = 0;
    let wLo = 0;
    let wHi = 0;
    let dR = 0;
    let dRR = 0;
    if (hasHi) {
      fHi = normalPdf(uHi);
      wHi = (rho * tHi - zi) / s3;
      dR += fHi * wHi;
      dRR += fHi * (-uHi * wHi * wHi + tHi / s3 + (3 * rho * wHi) / s2);
    }
    if (hasLo) {
      fLo = normalPdf(uLo);
      wLo = (rho * tLo - zi) / s3;
      dR -= fLo * wLo;
      dRR -= fLo * (-uLo * wLo * wLo + tLo / s3 + (3 * rho * wLo) / s2);
    }
    const gR = dR * ip;
    sums.gR[k] += gR;
    sums.hRR[k] += dRR * ip - gR * gR;
    if (!withThresholds) continue;
    if (hasHi) {
      const g = (fHi / s) * ip;
      sums.gHi[k] += g;
      sums.hHiHi[k] += ((-uHi * fHi) / s2) * ip - g * g;
      sums.hRHi[k] += fHi * (rho / s3 - (uHi * wHi) / s) * ip - gR * g;
    }
    if (hasLo) {
      const g = (-fLo / s) * ip;
      sums.gLo[k] += g;
      sums.hLoLo[k] += ((uLo * fLo) / s2) * ip - g * g;
      sums.hRLo[k] += -fLo * (rho / s3 - (uLo * wLo) / s) * ip - gR * g;
    }
    if (hasLo && hasHi) sums.hLoHi[k] += -((-fLo / s) * ip) * ((fHi / s) * ip);
  }
  sums.value = value;
  return sums;
}

/** The state shared by the evaluations of one fit. */
interface Data {
  z: Float64Array;
  codes: Uint8Array;
  /** Σ log φ(z_i). */
  constant: number;
}

function rhoObjective(d: Data, tau: readonly number[], rho: number): Objective1D {
  const sums = pass(d.z, d.codes, tau, rho, false);
  if (!Number.isFinite(sums.value)) return { value: -Infinity, d1: NaN, d2: NaN };
  let d1 = 0;
  let d2 = 0;
  for (let k = 0; k < sums.gR.length; k++) {
    d1 += sums.gR[k];
    d2 += sums.hRR[k];
  }
  return { value: d.constant + sums.value, d1, d2 };
}

/** Log-likelihood, gradient and Hessian in θ = (rho, τ_1..τ_{s−1}). */
function fullObjective(d: Data, theta: Float64Array): ObjectiveN {
  const np = theta.length;
  const cats = np;
  const gradient = new Float64Array(np);
  const hessian = new Float64Array(np * np);
  const sums = pass(d.z, d.codes, theta.subarray(1), theta[0], true);
  if (!Number.isFinite(sums.value)) return { value: -Infinity, gradient: gradient.fill(NaN), hessian };
  const add = (a: number, b: number, v: number) => {
    hessian[a * np + b] += v;
    if (a !== b) hessian[b * np + a] += v;
  };
  for (let k = 0; k < cats; k++) {
    gradient[0] += sums.gR[k];
    add(0, 0, sums.hRR[k]);
    // Category k lies between τ_k (θ index k) and τ_{k+1} (θ index k + 1).
    if (k > 0) {
      gradient[k] += sums.gLo[k];
      add(0, k, sums.hRLo[k]);
      add(k, k, sums.hLoLo[k]);
    }
    if (k < cats - 1) {
      gradient[k + 1] += sums.gHi[k];
      add(0, k + 1, sums.hRHi[k]);
      add(k + 1, k + 1, sums.hHiHi[k]);
    }
    if (k > 0 && k < cats - 1) add(k, k + 1, sums.hLoHi[k]);
  }
  return { value: d.constant + sums.value, gradient, hessian };
}

/** x standardised with its mean and standard deviation (divisor n − 1), both by two passes. */
function standardise(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const v = x[i];
    if (!Number.isFinite(v)) {
      throw new StatsInputError('bad-option', `polyserial needs a number in every row: x has ${String(v)} in row ${i + 1}`);
    }
    sum += v;
  }
  let mean = sum / n;
  let correction = 0;
  for (let i = 0; i < n; i++) correction += x[i] - mean;
  mean += correction / n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i] - mean;
    ss += d * d;
  }
  const sd = Math.sqrt(ss / (n - 1));
  if (!(sd > 0) || !Number.isFinite(sd)) throw new StatsInputError('constant', 'polyserial needs x to vary: every value of x is the same');
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) z[i] = (x[i] - mean) / sd;
  return z;
}

/** The ad hoc estimate r_xy·s_y/Σ φ(τ_k) of Olsson, Drasgow & Dorans (1982), y scored 1..s, s_y with divisor n. */
function adHocEstimate(z: Float64Array, codes: Uint8Array, tau: readonly number[]): number {
  const n = z.length;
  let sy = 0;
  let syy = 0;
  let szy = 0;
  for (let i = 0; i < n; i++) {
    const c = codes[i];
    sy += c;
    syy += c * c;
    szy += z[i] * c;
  }
  const varY = syy / n - (sy / n) * (sy / n);
  // Σ z = 0 and Σ z² = n − 1, so r_zy = Σ z y / √((n − 1)·n·var_y).
  const r = szy / Math.sqrt((n - 1) * n * varY);
  let density = 0;
  for (const t of tau) density += normalPdf(t);
  const estimate = (r * Math.sqrt(varY)) / density;
  return Number.isFinite(estimate) ? Math.max(-0.95, Math.min(0.95, estimate)) : 0;
}

/**
 * Polyserial correlation between a continuous column x and an ordered categorical column y: the correlation
 * of x with the normal variable behind y (Olsson, Drasgow & Dorans 1982, Psychometrika 47:337–347). y's
 * categories are its distinct values in ascending order, 2 to 10 of them; with 2 this is the biserial
 * correlation.
 *
 * @param x continuous values, one per row
 * @param y ordered categories, paired with x row by row
 * @param opts.estimator 'two-step' (default: thresholds from y's proportions, then rho) or 'ml' (jointly)
 * @throws StatsInputError 'unequal-length' when x and y differ in length; 'too-few' for fewer than 3 rows;
 *   'constant' when x does not vary or y holds one value; 'bad-option' for a non-number, more than 10
 *   distinct values in y or an unknown estimator.
 * @example polyserial([0.2, 1.4, -0.3, 2.2, 0.9, -1.1, 1.8, 0.1], [1, 2, 1, 3, 2, 1, 3, 2]).rho // 0.9675135977636429
 */
export function polyserial(x: ArrayLike<number>, y: ArrayLike<number>, opts?: OrdinalOptions): OrdinalFit {
  const estimator = readEstimator(opts, 'polyserial');
  const n = x.length;
  if (y.length !== n) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  if (n < 3) throw new StatsInputError('too-few', 'polyserial needs at least 3 rows');
  const cy = readCategories(y, 'polyserial', 'y');
  const z = standardise(x);
  const data: Data = { z, codes: cy.codes, constant: -(n / 2) * LOG_2PI - (n - 1) / 2 };
  const tau = marginalThresholds(cy.counts, n);
  let logLikNull = data.constant;
  for (const count of cy.counts) logLikNull += count * Math.log(count / n);
  const two = maximiseOnInterval((rho) => rhoObjective(data, tau, rho), adHocEstimate(z, cy.codes, tau), -RHO_BOUND, RHO_BOUND);
  if (estimator === 'two-step') {
    const atBound = two.atBound !== 0;
    return {
      rho: two.x,
      se: atBound ? NaN : Math.sqrt(-1 / two.d2),
      estimator,
      thresholdsY: tau,
      categoriesY: cy.values,
      logLik: two.value,
      n,
      ...likelihoodRatio(two.x, two.value, logLikNull),
      iterations: two.iterations,
      converged: two.converged,
      ...withNote(fitNote(atBound, two.converged, two.iterations)),
    };
  }
  const np = tau.length + 1;
  const ml = maximiseNewton((theta) => fullObjective(data, theta), [two.x, ...tau], (theta) => increasing(theta, 1, np), RHO_BOUND);
  const rho = ml.x[0];
  return {
    rho,
    se: ml.heldAtBound ? NaN : Math.sqrt(inverseInformationFirst(ml.hessian, np)),
    estimator,
    thresholdsY: Array.from(ml.x.subarray(1)),
    categoriesY: cy.values,
    logLik: ml.value,
    n,
    ...likelihoodRatio(rho, ml.value, logLikNull),
    iterations: ml.iterations,
    converged: ml.converged,
    ...withNote(fitNote(ml.heldAtBound, ml.converged, ml.iterations)),
  };
}
