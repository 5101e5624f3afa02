/**
 * The geometry of a normal Q-Q plot: where each point sits along the normal axis, and the reference line. Pure.
 */
import { normalQuantile } from '../distributions';
import { ranksAmong, typeSevenQuantiles } from './order-stats';

/**
 * Plotting positions for a normal Q-Q plot, as R's ppoints(): (i - a)/(n + 1 - 2a) with a = 3/8 for n <= 10
 * (Blom 1958, Statistical Estimates and Transformed Beta-Variables, Wiley) and a = 1/2 above (Hazen 1914).
 * @param rank 0-based rank among the n values (ties may sit at a half rank)
 * @example plottingPosition(0, 5) // 0.1190476... (R: ppoints(5)[1])
 */
export function plottingPosition(rank: number, n: number): number {
  const a = n <= 10 ? 3 / 8 : 1 / 2;
  return (rank + 1 - a) / (n + 1 - 2 * a);
}

/**
 * The reference line through the first and third quartiles of the values against those of the standard normal
 * (Chambers, Cleveland, Kleiner & Tukey 1983, Graphical Methods for Data Analysis, Wadsworth, sec. 6.3; the rule
 * of R's qqline with type-7 quantiles): value = intercept + slope * normal score.
 */
export function quartileLine(values: ArrayLike<number>): { slope: number; intercept: number } {
  const [q1, q3] = typeSevenQuantiles(values, [0.25, 0.75]);
  const z1 = normalQuantile(0.25);
  const z3 = normalQuantile(0.75);
  const slope = (q3 - q1) / (z3 - z1);
  return { slope, intercept: q1 - slope * z1 };
}

/**
 * The normal-axis position of each of `subset` among all the values (R's qqnorm abscissae for those points),
 * without sorting all of them: ranks by ranksAmong, then the normal quantile of their plotting positions.
 * Each subset value must occur in `all`.
 */
export function normalScores(all: ArrayLike<number>, subset: ArrayLike<number>): Float64Array {
  const n = all.length;
  const ranks = ranksAmong(all, subset);
  const out = new Float64Array(subset.length);
  for (let k = 0; k < out.length; k++) out[k] = normalQuantile(plottingPosition(ranks[k], n));
  return out;
}
