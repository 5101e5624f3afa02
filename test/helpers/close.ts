/** Relative-error assertion: |actual - expected| <= rel * max(|expected|, tiny). */
export function expectRel(actual: number, expected: number, rel: number, label = ''): void {
  const scale = Math.max(Math.abs(expected), 1e-300);
  const err = Math.abs(actual - expected) / scale;
  if (!(err <= rel)) {
    throw new Error(`${label} expected ${expected}, got ${actual} (relative error ${err.toExponential(2)} > ${rel})`);
  }
}

/** Number of correct significant digits, LRE = -log10(|a - e| / |e|) (McCullough 1998), capped at 15. */
export function logRelativeError(actual: number, expected: number): number {
  if (actual === expected) return 15;
  const e = Math.abs(actual - expected) / Math.abs(expected);
  return Math.min(15, -Math.log10(e));
}
