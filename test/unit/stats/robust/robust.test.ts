/**
 * The robust coefficients and their tests against an independent implementation of the published formulas in
 * base R (test/fixtures/robust/robust-r.R, R 4.2.2; definitions and exact rules recorded in robust-r.json): the
 * percentage bend correlation (Wilcox 1994), the winsorized correlation (Wilcox 1993), the biweight
 * midcorrelation (Wilcox 2012, after Mosteller & Tukey 1977) and the skipped correlation's set-aside rows
 * (Wilcox 2004). No published worked example with printed values was available (see test/references.md).
 */
import robustJson from '../../../fixtures/robust/robust-r.json';
import { correlate } from '../../../../src/stats/correlation/correlate';
import { findSkippedRows } from '../../../../src/stats/robust/skipped';
import { StatsInputError, Method } from '../../../../src/stats/types';

interface TTest { r: number; t: number; df: number; p: number; reason: string | null }
interface SkippedRef {
  rule: string;
  skipped: number[];
  kept: number;
  pearson: { r: number; t_test: { t: number; df: number; p: number }; reason: string | null };
  all_directions?: { skipped: number[] };
}
interface RobustCase {
  name: string;
  n: number;
  x: number[];
  y: number[];
  percentage_bend: TTest;
  winsorized: TTest;
  biweight: TTest;
  skipped: SkippedRef;
}
const cases = (robustJson as unknown as { cases: RobustCase[] }).cases;

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-300, Math.abs(b));

describe.each(cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
  test.each(['percentage_bend', 'winsorized', 'biweight'] as const)('%s: r, t, df and two-sided p as the R implementation of the paper', (method) => {
    const ref = c[method];
    if (ref.reason !== null) {
      // R: the coefficient is undefined on these data (reason recorded in robust-r.json).
      expect(() => correlate(c.x, c.y, { method, tail: 'both', level: 0.95 })).toThrow(StatsInputError);
      return;
    }
    const res = correlate(c.x, c.y, { method: method as Method, tail: 'both', level: 0.95 });
    expect(rel(res.statistic, ref.r)).toBeLessThan(1e-12); // robust-r.json, base-R formula
    expect(res.test.df).toBe(ref.df);
    expect(rel(res.test.value, ref.t)).toBeLessThan(1e-10);
    expect(rel(res.pValue, ref.p)).toBeLessThan(1e-9); // R: 2 * pt(-|t|, df)
    expect(res.interval.lower).toBeLessThanOrEqual(res.statistic);
    expect(res.interval.upper).toBeGreaterThanOrEqual(res.statistic);
    expect(res.interval.method).toMatch(/percentile bootstrap, B = 2000 resamples of the rows, seeded from the data/);
  });

  test('skipped: the rows set aside and Pearson on the kept rows, as the R implementation of the rule', () => {
    const found = findSkippedRows(Float64Array.from(c.x), Float64Array.from(c.y));
    const ref = c.skipped;
    const rows: number[] = [];
    found!.skipped.forEach((v, i) => { if (v) rows.push(i + 1); });
    expect(rows).toEqual(ref.skipped); // robust-r.json, 1-based row numbers
    if (ref.pearson.reason !== null || ref.kept < 5) return;
    const res = correlate(c.x, c.y, { method: 'skipped', tail: 'both', level: 0.95 });
    expect(rel(res.statistic, ref.pearson.r)).toBeLessThan(1e-12);
    expect(res.skippedRows!.map((i) => i + 1)).toEqual(ref.skipped);
  });
});

test('the same cells always give the same robust interval (resamples seeded from the data)', () => {
  const c = cases.find((k) => k.name === 'heavy-tails-t2-n50')!;
  const a = correlate(c.x, c.y, { method: 'percentage_bend', tail: 'both', level: 0.95 });
  const b = correlate(Array.from(c.x), Array.from(c.y), { method: 'percentage_bend', tail: 'both', level: 0.95 });
  expect([b.interval.lower, b.interval.upper]).toEqual([a.interval.lower, a.interval.upper]);
  // One value changed in its last digit gives other resamples.
  const y2 = c.y.slice();
  y2[0] = y2[0] * (1 + 2 ** -50);
  const d = correlate(c.x, y2, { method: 'percentage_bend', tail: 'both', level: 0.95 });
  expect(d.interval.lower).not.toBe(a.interval.lower);
});

test('a robust coefficient has no Fisher interval and says so; too few rows are refused', () => {
  const c = cases[0];
  expect(() => correlate(c.x, c.y, { method: 'biweight', tail: 'both', level: 0.95, interval: 'fisher' })).toThrow(/no Fisher-z interval/);
  expect(() => correlate([1, 2, 3, 4], [2, 1, 4, 3], { method: 'winsorized', tail: 'both', level: 0.95 })).toThrow(/at least 5/);
});

/**
 * The rule restated directly, as its JSDoc words it: directions from a full stable sort of the distances, every
 * row projected on every direction. findSkippedRows reaches the same rows by selection and by testing only the
 * rows that are far enough from the centre to pass any direction's limit; this holds the two to the same set.
 */
function skippedByDefinition(x: Float64Array, y: Float64Array): number[] {
  const n = x.length;
  const med = (a: Float64Array) => {
    const s = Float64Array.from(a).sort();
    return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
  };
  const scale = (a: Float64Array, c: number) => {
    const d = a.map((v) => Math.abs(v - c));
    const mad = med(d);
    return mad > 0 ? mad / 0.6744897501960817 : 1.2533141373155003 * (d.reduce((s, v) => s + v, 0) / n);
  };
  const cx = med(x);
  const cy = med(y);
  const sx = scale(x, cx);
  const sy = scale(y, cy);
  const u = x.map((v) => (v - cx) / sx);
  const v = y.map((w) => (w - cy) / sy);
  const norm2 = u.map((a, i) => a * a + v[i] * v[i]);
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => norm2[b] - norm2[a] || a - b);
  const dirs = n <= 100 ? Array.from({ length: n }, (_, i) => i) : order.slice(0, 100);
  const stride = n > 50000 ? Math.ceil(n / 50000) : 1;
  const cut = Math.sqrt(-2 * Math.log(0.025));
  const flagged = new Set<number>();
  for (const i of dirs) {
    if (!(norm2[i] > 0)) continue;
    const len = Math.sqrt(norm2[i]);
    const proj = (j: number) => Math.abs(u[j] * u[i] + v[j] * v[i]) / len;
    const sample: number[] = [];
    for (let j = 0; j < n; j += stride) sample.push(proj(j));
    sample.sort((a, b) => a - b);
    const m = sample.length;
    const md = m % 2 ? sample[(m - 1) / 2] : (sample[m / 2 - 1] + sample[m / 2]) / 2;
    const f = m / 4 + 5 / 12;
    const k = Math.floor(f);
    const h = f - k;
    const q1 = (1 - h) * sample[k - 1] + h * sample[k];
    const q2 = (1 - h) * sample[m - k] + h * sample[m - k - 1];
    const limit = md + cut * (q2 - q1);
    for (let j = 0; j < n; j++) if (proj(j) > limit) flagged.add(j);
  }
  return [...flagged].sort((a, b) => a - b);
}

test.each([
  ['1,000 rows, five planted outliers', 1000, 'outliers'],
  ['3,000 rows on a coarse grid (many equal distances)', 3000, 'ties'],
  ['120,000 rows (directions read from every 3rd row)', 120000, 'outliers'],
] as const)('the skipped rule on %s sets aside exactly the rows its definition does', (_label, n, kind) => {
  let s = 7;
  const rnd = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = rnd() + rnd() + rnd();
    x[i] = kind === 'ties' ? Math.round(a * 4) : a;
    y[i] = kind === 'ties' ? Math.round((a + rnd()) * 4) : a + rnd() * 0.8;
  }
  if (kind === 'outliers') for (const i of [3, 10, 400, 777, n - 1]) y[i] += 9;
  const found = findSkippedRows(x, y)!;
  const rows: number[] = [];
  found.skipped.forEach((f, i) => { if (f) rows.push(i); });
  const expected = skippedByDefinition(x, y);
  expect(rows).toEqual(expected);
  expect(found.count).toBe(expected.length);
  if (kind === 'outliers') expect(rows).toEqual(expect.arrayContaining([3, 10, 400, 777, n - 1]));
});
