/**
 * Every number the project turns into text, in one place: the sentences of the checks, the advice and the
 * readings (formatNumber, formatP), and what the panel shows in its tiles and tooltips (formatR, formatPValue,
 * formatCount, formatValue). Cell answers are numbers and never pass through here.
 */

/**
 * A number in `digits` significant digits (default 3), plain for everyday sizes, exponent form for the very
 * small or large.
 * @example formatNumber(0.81642) // "0.816"
 * @example formatNumber(1203.54) // "1204"
 */
export function formatNumber(v: number, digits = 3): string {
  if (v === 0) return '0';
  if (!Number.isFinite(v)) return v > 0 ? 'infinite' : v < 0 ? '-infinite' : 'undefined';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(digits - 2).replace('e+', 'e');
  if (a >= 1000) return String(Math.round(v));
  return String(Number(v.toPrecision(digits)));
}

/**
 * A p-value as it reads in a sentence: "p < 0.001" below a thousandth, else two significant digits.
 * @example formatP(0.0240987) // "p = 0.024"
 */
export function formatP(p: number): string {
  if (p < 0.001) return 'p < 0.001';
  return `p = ${String(Number(p.toPrecision(2)))}`;
}

/**
 * A correlation in a sentence: three significant digits, but never so few that a value short of +/-1 reads as
 * exactly 1 (0.99996 reads "0.99996", not "1").
 * @example formatCorrelation(0.816) // "0.816"
 */
export function formatCorrelation(v: number): string {
  if (!Number.isFinite(v)) return formatNumber(v);
  if (Math.abs(v) === 1 || Math.abs(v) < 0.99) return formatNumber(v);
  let digits = 3;
  let s = String(Number(v.toPrecision(digits)));
  while (Math.abs(Number(s)) === 1 && digits < 17) s = String(Number(v.toPrecision(++digits)));
  return s;
}

/** r, an interval bound or a difference, two decimals with a true minus sign; "–" when there is none. */
export function formatR(r: number): string {
  if (!Number.isFinite(r)) return '–';
  let s = r.toFixed(2);
  // Keep the sign visible when two decimals would round a small value to zero (an interval bound just below 0).
  if (r !== 0 && Math.abs(r) < 0.005) s = r.toFixed(3);
  // And never show a value short of +/-1 as 1.00 (an upper bound of 0.996 is not "perfect is possible").
  for (let d = 3; Math.abs(r) < 1 && Math.abs(Number(s)) === 1 && d <= 12; d++) s = r.toFixed(d);
  return s.replace('-', '−');
}

/** A p-value for display: "< 0.001" below a thousandth, else three decimals; "–" when there is none. */
export function formatPValue(p: number): string {
  if (!Number.isFinite(p)) return '–';
  if (p < 0.001) return '< 0.001';
  return p.toFixed(3);
}

/** A correlation magnitude for a sentence: formatR's two decimals, or two significant digits below 0.1 (0.0028,
 *  not 0.00), for the smallest correlation a sample detects. */
export function formatSmallR(r: number): string {
  return r < 0.1 ? String(Number(r.toPrecision(2))) : formatR(r);
}

/** A p-value after "p" in a sentence: "= 0.003", or "< 0.001" as formatPValue gives it. */
export function pClause(p: number): string {
  const s = formatPValue(p);
  return s.startsWith('<') ? s : `= ${s}`;
}

/** A whole count with thousands separators. */
export function formatCount(n: number): string {
  return Math.round(n).toLocaleString('en-US');
}

/** A cell value in a tooltip: four significant digits (exponent form beyond 1e6 or below 1e-3); "–" when missing. */
export function formatValue(v: number): string {
  if (!Number.isFinite(v)) return '–';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(2);
  return String(Number(v.toPrecision(4)));
}
