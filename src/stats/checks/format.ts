/** Number formatting for the plain-language sentences of the checks and the report (text, not cell values). */

/**
 * A number in three significant digits, plain for everyday sizes, exponent form for the very small or large.
 * @example formatNumber(0.81642) // "0.816"
 * @example formatNumber(1203.54) // "1204"
 */
export function formatNumber(v: number): string {
  if (v === 0) return '0';
  if (!Number.isFinite(v)) return v > 0 ? 'infinite' : v < 0 ? '-infinite' : 'undefined';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(1).replace('e+', 'e');
  if (a >= 1000) return String(Math.round(v));
  return String(Number(v.toPrecision(3)));
}

/**
 * A p-value as it reads in a sentence: "p < 0.001" below a thousandth, else two significant digits.
 * @example formatP(0.0240987) // "p = 0.024"
 */
export function formatP(p: number): string {
  if (p < 0.001) return 'p < 0.001';
  return `p = ${String(Number(p.toPrecision(2)))}`;
}
