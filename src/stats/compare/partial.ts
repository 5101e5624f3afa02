import { fisherInterval, pFromT, tFromR } from '../correlation/fisher';
import { powerOfTwoScale } from '../correlation/comoments';
import { clipUnit } from '../correlation/pearson';
import { euclideanNorm, orthonormalBasis, residualsOn, centred } from './residualize';
import { validTestOptions } from '../options';
import { StatsInputError, Tail, TestResult } from '../types';

/** The result of a partial correlation (a TestResult: `statistic` is the partial r of x and y given the
 * controls, clipped to [-1, 1]; `method` is Pearson, the coefficient computed on the residuals). */
export interface PartialResult extends TestResult {
  /** Number of control columns. */
  controls: number;
  /** What was held fixed, in words. */
  description: string;
}

export interface PartialOptions {
  tail: Tail;
  /** Confidence level of the two-sided interval, in (0, 1). */
  level: number;
}

/** Relative residual size below which x or y counts as fully explained by the controls. */
const EXPLAINED = 1e-10;

/**
 * Partial correlation of x and y controlling for k columns: Pearson's r between the residuals of x and of y after
 * least-squares fits on the controls (Yule 1897, "On the theory of correlation", Journal of the Royal
 * Statistical Society 60:812-854; Fisher 1924, "The distribution of the partial correlation coefficient",
 * Metron 3:329-332, who showed it is distributed as a simple r from n - k rows).
 *
 * - p-value: t = r sqrt(df / (1 - r^2)) with df = n - 2 - k.
 * - Interval: Fisher z with SE = 1/sqrt(n - 3 - k), two-sided at `level`.
 *
 * Inputs are complete rows (equal lengths, all finite).
 * @throws StatsInputError for fewer than k + 4 rows, a constant or redundant control, or x or y constant or
 *   fully explained by the controls.
 * @example partialCorrelation(x, y, [seniority], { tail: 'both', level: 0.95 }).statistic
 */
export function partialCorrelation(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  controls: ArrayLike<number>[],
  opts: PartialOptions,
): PartialResult {
  const n = x.length;
  const k = controls.length;
  if (y.length !== n || controls.some((c) => c.length !== n)) {
    throw new StatsInputError('unequal-length', 'x, y and every control column must hold the same number of rows');
  }
  if (k < 1) throw new StatsInputError('too-few', 'give at least one control column');
  validTestOptions(opts);
  if (n < k + 4) {
    throw new StatsInputError(
      'too-few',
      `only ${n} complete rows: with ${k} control column${k === 1 ? '' : 's'} a partial correlation needs at least ${k + 4}`,
    );
  }
  // Each column is divided by a power of two near its largest magnitude (exact, and r does not depend on scale),
  // so values near 1e300 or 1e-300 neither overflow nor underflow in the sums below.
  const basis = orthonormalBasis(controls.map(scaled), (i) => (k === 1 ? 'the control column' : `control column ${i + 1}`));
  const ex = explainedCheck(scaled(x), basis, 'x');
  const ey = explainedCheck(scaled(y), basis, 'y');
  let sxy = 0;
  for (let i = 0; i < n; i++) sxy += ex[i] * ey[i];
  const r = clipUnit(sxy / (euclideanNorm(ex) * euclideanNorm(ey)));
  const df = n - 2 - k;
  const t = tFromR(r, df);
  return {
    method: 'pearson',
    description: `partial Pearson correlation controlling for ${k} column${k === 1 ? '' : 's'}`,
    statistic: r,
    pValue: pFromT(t, df, opts.tail),
    tail: opts.tail,
    interval: fisherInterval(r, 1 / Math.sqrt(n - 3 - k), opts.level, 'Fisher z, SE = 1/sqrt(n - 3 - k)'),
    n,
    controls: k,
    test: { name: 't', value: t, df },
    pMethod: 't test, df = n - 2 - k',
  };
}

function scaled(v: ArrayLike<number>): Float64Array {
  const s = powerOfTwoScale(v);
  // A plain loop: Float64Array.from with a mapping function calls it through the generic iterator path, several
  // times slower at a million rows.
  const out = new Float64Array(v.length);
  for (let i = 0; i < v.length; i++) out[i] = v[i] / s;
  return out;
}

/** Residuals of v on the controls, refusing a column that is constant or that the controls explain fully. */
function explainedCheck(v: ArrayLike<number>, basis: Float64Array[], name: string): Float64Array {
  const before = euclideanNorm(centred(v));
  if (!(before > 0)) throw new StatsInputError('constant', `${name} is constant: a correlation needs variation in both columns`);
  const e = residualsOn(v, basis);
  if (!(euclideanNorm(e) > EXPLAINED * before)) {
    throw new StatsInputError('constant', `${name} is fully explained by the controls: nothing is left to correlate`);
  }
  return e;
}
