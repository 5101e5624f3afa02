/**
 * Number of distinct values, stopping at 3: only "one", "two" or "three or more" matters (constant columns,
 * two-valued columns named point-biserial or phi, curvature that two x values cannot show).
 * @example distinctUpToThree([0, 1, 0, 1]) // 2
 */
export function distinctUpToThree(v: ArrayLike<number>): number {
  const n = v.length;
  if (n === 0) return 0;
  const a = v[0];
  let b = NaN;
  for (let i = 1; i < n; i++) {
    const c = v[i];
    if (c === a || c === b) continue;
    if (b !== b) b = c;
    else return 3;
  }
  return b !== b ? 1 : 2;
}
