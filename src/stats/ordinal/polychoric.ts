/**
 * The polychoric correlation: the correlation of two standard normal variables that, cut at thresholds, give
 * the two ordered categorical columns observed. The 2 × 2 case is Pearson's (1900) tetrachoric correlation
 * ("Mathematical contributions to the theory of evolution. VII. On the correlation of characters not
 * quantitatively measurable", Philosophical Transactions of the Royal Society A 195:1–47); the estimators are
 * those of Olsson (1979), "Maximum likelihood estimation of the polychoric correlation coefficient",
 * Psychometrika 44:443–460.
 *
 * The model: cell (i, j) of the r × c table has probability
 *   p_ij = Φ₂(a_i, b_j) − Φ₂(a_{i−1}, b_j) − Φ₂(a_i, b_{j−1}) + Φ₂(a_{i−1}, b_{j−1})
 * with a_0 = b_0 = −∞, a_r = b_c = +∞ and Φ₂ the bivariate normal distribution function with correlation rho;
 * the log-likelihood is Σ n_ij log p_ij (without the multinomial constant). Empty cells add nothing.
 *
 * Estimators:
 * - 'two-step' (Olsson's two-step estimator): a_i = Φ⁻¹(cumulative row proportion), b_j likewise, then rho
 *   alone by maximising the likelihood (a safeguarded Newton search on the score);
 * - 'ml' (Olsson's maximum-likelihood estimator): rho and all thresholds jointly, by Newton's method on the
 *   analytic gradient and Hessian, started from the two-step estimate.
 * Derivatives use ∂Φ₂/∂rho = φ₂ (Plackett 1954, "A reduction formula for normal multivariate integrals",
 * Biometrika 41:351–360) and ∂Φ₂(h, k)/∂h = φ(h)·Φ((k − rho h)/√(1 − rho²)).
 *
 * The rows are read once into the table (O(n), no per-row objects); everything after works on the table, at
 * most 10 × 10 cells, whatever n.
 */
import { normalPdf, normalQuantile } from '../distributions';
import { StatsInputError } from '../types';
import { bivariateNormalPdf, bivariateNormalRectangle, normalInterval } from './bivariate-normal';
import { OrdinalColumn, readCategories } from './categories';
import {
  fitNote,
  likelihoodRatio,
  OrdinalEstimator,
  OrdinalFit,
  OrdinalOptions,
  readEstimator,
  RHO_BOUND,
  withNote,
} from './fit';

// The fit's type and interval travel with the coefficient, for callers that import only this module.
export { ordinalInterval } from './fit';
export type { OrdinalEstimator, OrdinalFit, OrdinalOptions } from './fit';
import { inverseInformationFirst, maximiseNewton, maximiseOnInterval, Objective1D, ObjectiveN } from './maximise';

/** A two-way table of counts, rows for x's categories and columns for y's. */
export interface ContingencyTable {
  rows: number;
  cols: number;
  /** Counts, row-major: counts[i * cols + j]. */
  counts: Float64Array;
  rowTotals: number[];
  colTotals: number[];
  n: number;
}

/** Counts the rows of two coded columns into their table, in one pass. */
export function crossTable(x: OrdinalColumn, y: OrdinalColumn): ContingencyTable {
  const rows = x.values.length;
  const cols = y.values.length;
  const counts = new Float64Array(rows * cols);
  const xc = x.codes;
  const yc = y.codes;
  for (let i = 0; i < xc.length; i++) counts[xc[i] * cols + yc[i]]++;
  return { rows, cols, counts, rowTotals: x.counts.slice(), colTotals: y.counts.slice(), n: xc.length };
}

/**
 * Thresholds from marginal counts: Φ⁻¹ of the cumulative proportions, one fewer than the categories. Above the
 * median the upper tail is inverted instead, so that n − cumulative (an exact integer) is what is rounded.
 */
export function marginalThresholds(counts: readonly number[], n: number): number[] {
  const t: number[] = [];
  let cumulative = 0;
  for (let k = 0; k < counts.length - 1; k++) {
    cumulative += counts[k];
    t.push(2 * cumulative <= n ? normalQuantile(cumulative / n) : -normalQuantile((n - cumulative) / n));
  }
  return t;
}

/** g in ∂φ₂/∂rho = φ₂·g: g = ∂log φ₂/∂rho = rho/(1 − rho²) + (hk(1 + rho²) − rho(h² + k²))/(1 − rho²)². */
function densityRhoFactor(h: number, k: number, rho: number, s2: number): number {
  return rho / s2 + (h * k * (1 + rho * rho) - rho * (h * h + k * k)) / (s2 * s2);
}

/** The log-likelihood of the table at rho with thresholds a (rows) and b (columns); −Infinity if a used cell has probability 0. */
export function tableLogLik(t: ContingencyTable, rho: number, a: readonly number[], b: readonly number[]): number {
  const A = [-Infinity, ...a, Infinity];
  const B = [-Infinity, ...b, Infinity];
  let value = 0;
  for (let i = 0; i < t.rows; i++) {
    for (let j = 0; j < t.cols; j++) {
      const w = t.counts[i * t.cols + j];
      if (w === 0) continue;
      const p = bivariateNormalRectangle(A[i], A[i + 1], B[j], B[j + 1], rho);
      if (!(p > 0)) return -Infinity;
      value += w * Math.log(p);
    }
  }
  return value;
}

/**
 * Log-likelihood and its derivatives in rho (thresholds held): Σ n p′/p and Σ n (p″/p − (p′/p)²), with
 * p′ = Σ ±φ₂ over the cell's corners (Olsson 1979).
 */
function tableRho(t: ContingencyTable, rho: number, a: readonly number[], b: readonly number[]): Objective1D {
  const A = [-Infinity, ...a, Infinity];
  const B = [-Infinity, ...b, Infinity];
  const s2 = (1 - rho) * (1 + rho);
  let value = 0;
  let d1 = 0;
  let d2 = 0;
  for (let i = 0; i < t.rows; i++) {
    for (let j = 0; j < t.cols; j++) {
      const w = t.counts[i * t.cols + j];
      if (w === 0) continue;
      const p = bivariateNormalRectangle(A[i], A[i + 1], B[j], B[j + 1], rho);
      if (!(p > 0)) return { value: -Infinity, d1: NaN, d2: NaN };
      let dp = 0;
      let ddp = 0;
      for (let ci = 0; ci < 2; ci++) {
        for (let cj = 0; cj < 2; cj++) {
          const h = A[i + ci];
          const k = B[j + cj];
          const f = bivariateNormalPdf(h, k, rho);
          if (f === 0) continue;
          const sign = ci === cj ? 1 : -1;
          dp += sign * f;
          ddp += sign * f * densityRhoFactor(h, k, rho, s2);
        }
      }
      value += w * Math.log(p);
      const q = dp / p;
      d1 += w * q;
      d2 += w * (ddp / p - q * q);
    }
  }
  return { value, d1, d2 };
}

/**
 * Log-likelihood, gradient and Hessian in θ = (rho, a_1..a_{r−1}, b_1..b_{c−1}) (the score of Olsson 1979 and its
 * derivatives: ∂²Φ₂/∂h² = −h·∂Φ₂/∂h − rho φ₂, ∂²Φ₂/∂h∂k = φ₂, ∂φ₂/∂h = φ₂·(rho k − h)/(1 − rho²)).
 */
function tableFull(t: ContingencyTable, theta: Float64Array): ObjectiveN {
  const r = t.rows;
  const c = t.cols;
  const np = r + c - 1;
  const rho = theta[0];
  const A = [-Infinity, ...theta.subarray(1, r), Infinity];
  const B = [-Infinity, ...theta.subarray(r, np), Infinity];
  const s2 = (1 - rho) * (1 + rho);
  const s = Math.sqrt(s2);
  const gradient = new Float64Array(np);
  const hessian = new Float64Array(np * np);
  // Corner densities φ₂(A_p, B_q) on the (r + 1) × (c + 1) grid (0 on its infinite edges).
  const dens = new Float64Array((r + 1) * (c + 1));
  for (let p = 0; p <= r; p++) for (let q = 0; q <= c; q++) dens[p * (c + 1) + q] = bivariateNormalPdf(A[p], B[q], rho);
  const phi = (p: number, q: number) => dens[p * (c + 1) + q];
  let value = 0;
  const idx = new Int32Array(5);
  const d = new Float64Array(5);
  const dd = new Float64Array(25);
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < c; j++) {
      const w = t.counts[i * c + j];
      if (w === 0) continue;
      const prob = bivariateNormalRectangle(A[i], A[i + 1], B[j], B[j + 1], rho);
      if (!(prob > 0)) return { value: -Infinity, gradient: gradient.fill(NaN), hessian };
      value += w * Math.log(prob);
      // Local parameters: 0 = rho, then the finite ones of A_{i+1} (+), A_i (−), B_{j+1} (+), B_j (−).
      let m = 1;
      idx[0] = 0;
      d.fill(0);
      dd.fill(0);
      let drho = 0;
      let drr = 0;
      for (let ci = 0; ci < 2; ci++) {
        for (let cj = 0; cj < 2; cj++) {
          const f = phi(i + ci, j + cj);
          if (f === 0) continue;
          const sign = ci === cj ? 1 : -1;
          drho += sign * f;
          drr += sign * f * densityRhoFactor(A[i + ci], B[j + cj], rho, s2);
        }
      }
      d[0] = drho;
      dd[0] = drr;
      const slotA = [-1, -1]; // local slots of A_i (ci = 0) and A_{i+1} (ci = 1)
      const slotB = [-1, -1];
      for (let ci = 1; ci >= 0; ci--) {
        const pRow = i + ci;
        if (pRow === 0 || pRow === r) continue;
        const sign = ci === 1 ? 1 : -1;
        const h = A[pRow];
        const slot = m++;
        slotA[ci] = slot;
        idx[slot] = pRow; // θ index of a_pRow is pRow
        // ∂p/∂A_p = ± φ(A_p)·P(B_j < Y ≤ B_{j+1} | X = A_p)
        const first = normalPdf(h) * normalInterval((B[j] - rho * h) / s, (B[j + 1] - rho * h) / s);
        d[slot] = sign * first;
        const fHi = phi(pRow, j + 1);
        const fLo = phi(pRow, j);
        dd[slot * 5 + slot] = sign * (-h * first - rho * (fHi - fLo));
        let cross = 0;
        if (fHi !== 0) cross += (fHi * (rho * B[j + 1] - h)) / s2;
        if (fLo !== 0) cross -= (fLo * (rho * B[j] - h)) / s2;
        dd[slot] = dd[slot * 5] = sign * cross;
      }
      for (let cj = 1; cj >= 0; cj--) {
        const qCol = j + cj;
        if (qCol === 0 || qCol === c) continue;
        const sign = cj === 1 ? 1 : -1;
        const k = B[qCol];
        const slot = m++;
        slotB[cj] = slot;
        idx[slot] = r - 1 + qCol; // θ index of b_qCol
        const first = normalPdf(k) * normalInterval((A[i] - rho * k) / s, (A[i + 1] - rho * k) / s);
        d[slot] = sign * first;
        const fHi = phi(i + 1, qCol);
        const fLo = phi(i, qCol);
        dd[slot * 5 + slot] = sign * (-k * first - rho * (fHi - fLo));
        let cross = 0;
        if (fHi !== 0) cross += (fHi * (rho * A[i + 1] - k)) / s2;
        if (fLo !== 0) cross -= (fLo * (rho * A[i] - k)) / s2;
        dd[slot] = dd[slot * 5] = sign * cross;
      }
      // ∂²p/∂A_p∂B_q = (corner sign)·φ₂(A_p, B_q).
      for (let ci = 0; ci < 2; ci++) {
        if (slotA[ci] < 0) continue;
        for (let cj = 0; cj < 2; cj++) {
          if (slotB[cj] < 0) continue;
          const v = (ci === cj ? 1 : -1) * phi(i + ci, j + cj);
          dd[slotA[ci] * 5 + slotB[cj]] = dd[slotB[cj] * 5 + slotA[ci]] = v;
        }
      }
      for (let u = 0; u < m; u++) {
        const gu = d[u] / prob;
        gradient[idx[u]] += w * gu;
        for (let v = 0; v < m; v++) hessian[idx[u] * np + idx[v]] += w * (dd[u * 5 + v] / prob - gu * (d[v] / prob));
      }
    }
  }
  return { value, gradient, hessian };
}

/** Pearson's r of the category codes, from the table: a start for rho (clipped well inside the bound). */
function codeCorrelation(t: ContingencyTable): number {
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = 0; i < t.rows; i++) {
    for (let j = 0; j < t.cols; j++) {
      const w = t.counts[i * t.cols + j];
      sx += w * i;
      sy += w * j;
      sxx += w * i * i;
      syy += w * j * j;
      sxy += w * i * j;
    }
  }
  const n = t.n;
  const r = (sxy - (sx * sy) / n) / Math.sqrt((sxx - (sx * sx) / n) * (syy - (sy * sy) / n));
  return Number.isFinite(r) ? Math.max(-0.95, Math.min(0.95, r)) : 0;
}

/** Whether thresholds θ[from..to) are strictly increasing and finite. */
export function increasing(theta: ArrayLike<number>, from: number, to: number): boolean {
  for (let i = from; i < to; i++) {
    if (!Number.isFinite(theta[i])) return false;
    if (i > from && !(theta[i] > theta[i - 1])) return false;
  }
  return true;
}

/**
 * Polychoric correlation of the table (the estimators of Olsson 1979; see the note at the top of this file).
 */
export function polychoricFromTable(
  t: ContingencyTable,
  estimator: OrdinalEstimator = 'two-step',
): Omit<OrdinalFit, 'categoriesX' | 'categoriesY'> {
  const a = marginalThresholds(t.rowTotals, t.n);
  const b = marginalThresholds(t.colTotals, t.n);
  const logLikNull = tableLogLik(t, 0, a, b);
  const two = maximiseOnInterval((rho) => tableRho(t, rho, a, b), codeCorrelation(t), -RHO_BOUND, RHO_BOUND);
  if (estimator === 'two-step') {
    const atBound = two.atBound !== 0;
    return {
      rho: two.x,
      se: atBound ? NaN : Math.sqrt(-1 / two.d2),
      estimator,
      thresholdsX: a,
      thresholdsY: b,
      logLik: two.value,
      n: t.n,
      ...likelihoodRatio(two.x, two.value, logLikNull),
      iterations: two.iterations,
      converged: two.converged,
      ...withNote(fitNote(atBound, two.converged, two.iterations)),
    };
  }
  const r = t.rows;
  const np = r + t.cols - 1;
  const ml = maximiseNewton(
    (theta) => tableFull(t, theta),
    [two.x, ...a, ...b],
    (theta) => increasing(theta, 1, r) && increasing(theta, r, np),
    RHO_BOUND,
  );
  const rho = ml.x[0];
  const se = ml.heldAtBound ? NaN : Math.sqrt(inverseInformationFirst(ml.hessian, np));
  return {
    rho,
    se,
    estimator,
    thresholdsX: Array.from(ml.x.subarray(1, r)),
    thresholdsY: Array.from(ml.x.subarray(r, np)),
    logLik: ml.value,
    n: t.n,
    ...likelihoodRatio(rho, ml.value, logLikNull),
    iterations: ml.iterations,
    converged: ml.converged,
    ...withNote(fitNote(ml.heldAtBound, ml.converged, ml.iterations)),
  };
}

/**
 * Polychoric correlation of two ordered categorical columns: the correlation of the bivariate normal variables
 * behind them (Olsson 1979, Psychometrika 44:443–460). Each column's categories are its distinct values in
 * ascending order, 2 to 10 of them; for 2 × 2 this is the tetrachoric correlation.
 *
 * @param x ordered categories, one per row (numbers: rating-scale codes, say)
 * @param y the same for the second column, paired with x row by row
 * @param opts.estimator 'two-step' (default: marginal thresholds, then rho) or 'ml' (all jointly)
 * @throws StatsInputError 'unequal-length' when x and y differ in length; 'constant' when a column holds one
 *   value; 'bad-option' for a non-number, more than 10 distinct values in a column or an unknown estimator.
 * @example polychoric([1, 1, 2, 2, 3, 3, 1, 2, 3, 3], [1, 2, 2, 3, 3, 3, 1, 1, 2, 3]).rho // 0.8148641599660815
 */
export function polychoric(x: ArrayLike<number>, y: ArrayLike<number>, opts?: OrdinalOptions): OrdinalFit {
  const estimator = readEstimator(opts, 'polychoric');
  if (x.length !== y.length) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  const cx = readCategories(x, 'polychoric', 'x');
  const cy = readCategories(y, 'polychoric', 'y');
  const fit = polychoricFromTable(crossTable(cx, cy), estimator);
  return { ...fit, categoriesX: cx.values, categoriesY: cy.values };
}
