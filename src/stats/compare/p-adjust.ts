/**
 * Adjusting p-values for testing many hypotheses at once. Both step through the p-values in sorted order; ties
 * keep their input order (the sort is stable), which does not change the adjusted values.
 */
import { argsort } from '../internal/sort';

/**
 * Holm's step-down adjustment, controlling the family-wise error rate (Holm 1979, "A simple sequentially
 * rejective multiple test procedure", Scandinavian Journal of Statistics 6:65-70): with p sorted ascending,
 * adjusted p_(i) = max over j <= i of min(1, (m - j + 1) p_(j)).
 * @example holmAdjust([0.01, 0.04, 0.03]) // Float64Array [0.03, 0.06, 0.06]
 */
export function holmAdjust(p: ArrayLike<number>): Float64Array {
  const m = p.length;
  const order = argsort(p);
  const out = new Float64Array(m);
  let running = 0;
  for (let i = 0; i < m; i++) {
    const idx = order[i];
    const v = Math.min(1, (m - i) * p[idx]);
    if (v > running) running = v;
    out[idx] = running;
  }
  return out;
}

/**
 * Benjamini & Hochberg's step-up adjustment, controlling the false discovery rate (Benjamini & Hochberg 1995,
 * "Controlling the false discovery rate: a practical and powerful approach to multiple testing", Journal of the
 * Royal Statistical Society B 57:289-300): with p sorted ascending, adjusted p_(i) = min over j >= i of
 * min(1, m p_(j) / j).
 * @example benjaminiHochbergAdjust([0.01, 0.04, 0.03]) // Float64Array [0.03, 0.04, 0.04]
 */
export function benjaminiHochbergAdjust(p: ArrayLike<number>): Float64Array {
  const m = p.length;
  const order = argsort(p);
  const out = new Float64Array(m);
  let running = 1;
  for (let i = m - 1; i >= 0; i--) {
    const idx = order[i];
    const v = Math.min(1, (m / (i + 1)) * p[idx]); // same order of operations as R's p.adjust
    if (v < running) running = v;
    out[idx] = running;
  }
  return out;
}
