/**
 * The verdict in the cases where a significance test alone misleads, each asserting the words a user reads:
 * five clean pairs, a pair with no relationship, one wild row among 100,000, monthly series whose neighbouring
 * rows are alike, and a value keyed in wrong. The data are generated here from fixed seeds; what is checked is
 * the wording the rules of src/stats/checks/verdict.ts and src/stats/verdict/ lead to.
 */
import { checksOf } from '../../../../src/stats/checks/checked';
import { PreparedPairs } from '../../../../src/stats/correlation/prepared';
import { conclude } from '../../../../src/stats/verdict/conclusion';
import { formatR } from '../../../../src/stats/format';
import { readCorrelation } from '../../../../src/stats/verdict/advice';
import { pearsonReference } from '../../../helpers/pearson-reference';

/** Standard normal numbers from a fixed seed (an LCG and Box-Muller): the same on every machine. */
function normals(seed: number, n: number): Float64Array {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return out;
}

const names = { key: 'rows', name: (i: number) => `row ${i + 2}` };
function verdictOf(x: ArrayLike<number>, y: ArrayLike<number>) {
  const prepared = new PreparedPairs(Float64Array.from(x), Float64Array.from(y));
  const report = checksOf(prepared, 0.05, names);
  const c = conclude(prepared, report, { method: 'pearson', level: 0.95, name: names.name });
  return { report, c, row: (key: string) => report.checks.find((k) => k.key === key)! };
}

test('5 clean pairs: every check "too few rows" or not testable; never "read as it stands"; too few rows to say', () => {
  const x = [2.1, 3.0, 3.8, 5.2, 6.1];
  const y = [11.0, 13.2, 14.1, 17.9, 19.6];
  const { report, c } = verdictOf(x, y);
  for (const k of report.checks) expect([k.key, ['too few rows', 'not testable', 'fine', 'slight'].includes(k.verdict)]).toEqual([k.key, true]);
  expect(report.tooFew + report.notTestable).toBeGreaterThanOrEqual(4);
  expect(c.recommendation.reason).not.toMatch(/as it stands/);
  expect(c.recommendation.reason).toMatch(/^With 5 rows most of the checks cannot see whether the assumptions hold/);
  expect(c.sensitivity.summary).toBe('too few rows to say');
  expect(c.sensitivity.line).toMatch(/^Too few rows to say/);
  for (const k of report.checks.filter((r) => r.verdict === 'too few rows')) expect(k.meaning).toMatch(/could miss/);
});

test('a pair with no relationship: no direction in any reading, what cannot be ruled out, equivalence and Bayes', () => {
  const x = normals(11, 48);
  const z = normals(12, 48);
  const y = Float64Array.from(x, (v, i) => 900 - 3 * v + 40 * z[i]);
  const { c } = verdictOf(x, y);
  expect(c.sensitivity.direction).toBe('none');
  const lines = readCorrelation(c.correlation, 'Households nearby', 'Rent per month', formatR);
  expect(lines[0]).toBe('No clear relationship between Households nearby and Rent per month in these 48 rows.');
  expect(lines.join(' ')).not.toMatch(/tends to go with/);
  expect(c.reading).toMatch(/no clear relationship/);
  expect(c.reading).not.toMatch(/tends to rise|tends to fall/);
  expect(c.equivalence).not.toBeNull();
  expect(c.equivalence!.bound).toBe(0.1);
  expect(c.bayes).not.toBeNull();
  expect(c.bayes!.bf01).toBeGreaterThan(1); // the data favour no correlation
  expect(c.detectable!).toBeGreaterThan(0.3);
  expect(c.sensitivity.line).toMatch(/no clear correlation/);
});

test('one wild row among 100,000: present but harmless (slight), the conclusion holds', () => {
  const n = 100000;
  const x = normals(21, n);
  const e = normals(22, n);
  const y = Float64Array.from(x, (v, i) => 0.5 * v + e[i]);
  y[61234] += 50; // fifty standard deviations off
  const { report, c, row } = verdictOf(x, y);
  expect([row('outliers').detected, row('outliers').verdict]).toEqual([true, 'slight']);
  expect(row('outliers').meaning).toMatch(/present, and harmless with 100000 rows/);
  expect(row('outliers').effect!.value).toBeLessThan(0.01);
  for (const key of ['normal-y', 'normal-residuals']) {
    expect([key, row(key).detected, row(key).verdict]).toEqual([key, true, 'slight']);
    expect(row(key).meaning).toMatch(/only because of the flagged rows/);
  }
  expect(report.flags).toEqual([]);
  expect(c.recommendation.name).toBe('Pearson');
  expect(c.recommendation.reason).not.toMatch(/Spearman/);
  expect(c.sensitivity.summary).toBe('holds under every check');
});

test('monthly series whose neighbouring rows are alike: the effective rows and the changes, not a rank coefficient', () => {
  const n = 48;
  const a = normals(31, n);
  const b = normals(32, n);
  const x = new Float64Array(n);
  const u = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    x[t] = (t > 0 ? 0.85 * x[t - 1] : 0) + a[t];
    u[t] = (t > 0 ? 0.85 * u[t - 1] : 0) + b[t];
  }
  const y = Float64Array.from(x, (v, t) => 100 + 2 * v + 3 * u[t]);
  const { row, c } = verdictOf(x, y);
  expect(row('row-order').verdict).toBe('problem');
  expect(row('row-order').effect!.value).toBeLessThan(0.7 * n);
  expect(c.recommendation.remedy).toBe('effective-rows');
  expect(c.recommendation.reason).toMatch(/correlate the changes from one row to the next/);
  expect(c.recommendation.reason).not.toMatch(/^Consider|Spearman instead/);
  expect(c.sensitivity.rows.map((r) => r.scenario)).toContain('effective rows');
});

test('a rent keyed in wrong: "check row 28 for a data-entry error first"', () => {
  const n = 48;
  const area = Float64Array.from(normals(41, n), (v) => 70 + 15 * v);
  const noise = normals(42, n);
  const rent = Float64Array.from(area, (v, i) => Math.round(400 + 11 * v + 60 * noise[i]));
  rent[26] *= 10; // row 28 (data from row 2): an extra zero
  const { row, c } = verdictOf(area, rent);
  const out = row('outliers');
  expect(out.verdict).toBe('problem');
  expect(out.place).toBe('row 28');
  expect(out.detail.farOut).toBe(1);
  expect(Math.abs(out.statistic as number)).toBeGreaterThan(10);
  expect(c.recommendation.remedy).toBe('check-row');
  expect(c.recommendation.reason).toMatch(/^Check row 28 for a data-entry error first/);
  // If the value is right: the percentage bend correlation, with how far it sits from Pearson's r.
  expect(c.recommendation.name).toBe('percentage bend');
  expect(c.recommendation.reason).toMatch(/r_pb = -?0\.\d+ against Pearson's r = -?0\.\d+/);
  expect(c.sensitivity.rows.map((r) => r.scenario)).toContain('robust coefficient');
});

test('two five-point rating items: the polychoric correlation is named', () => {
  const n = 200;
  const a = normals(51, n);
  const b = normals(52, n);
  const cut = (v: number) => (v < -1.2 ? 1 : v < -0.4 ? 2 : v < 0.4 ? 3 : v < 1.2 ? 4 : 5);
  const x = Float64Array.from(a, cut);
  const y = Float64Array.from(a, (v, i) => cut(0.6 * v + 0.8 * b[i]));
  const { c } = verdictOf(x, y);
  expect(c.recommendation.name).toBe('polychoric');
  expect(c.recommendation.remedy).toBe('ordinal');
  expect(c.recommendation.reason).toMatch(/rating-scale items/);
});

/** Fisher's (1921) interval tanh(atanh r +/- z / sqrt(n - 3)); z from R 4.2.2: qnorm(0.95) = 1.6448536269514715,
 *  qnorm(0.975) = 1.9599639845400536. */
const fisherEnds = (r: number, n: number, z: number) => [Math.tanh(Math.atanh(r) - z / Math.sqrt(n - 3)), Math.tanh(Math.atanh(r) + z / Math.sqrt(n - 3))];

test('100,000 rows and r near 0.02: significant, yet read as real but negligible, with the share of y it could explain', () => {
  const n = 100000;
  const x = normals(21, n);
  const z = normals(22, n);
  const y = Float64Array.from(x, (v, i) => 50 + 0.2 * v + 10 * z[i]);
  const { c } = verdictOf(x, y);
  const r = pearsonReference(x, y);
  const [lo90, hi90] = fisherEnds(r, n, 1.6448536269514715);
  const [, hi95] = fisherEnds(r, n, 1.9599639845400536);
  // The premise, from the formulas above: the 95% interval excludes 0 while the 90% one lies within +/-0.1.
  expect(lo90).toBeGreaterThan(0);
  expect(hi90).toBeLessThan(0.1);
  expect(c.correlation.pValue).toBeLessThan(0.05);
  expect(c.sensitivity.direction).toBe('positive');
  expect(c.equivalence).not.toBeNull();
  expect(c.equivalence!.pValue).toBeLessThan(0.05); // both one-sided tests reject |rho| >= 0.1
  expect(c.equivalence!.negligible).toBe(c.equivalence!.pValue < 0.05);
  expect(c.equivalence!.interval.lower).toBeCloseTo(lo90, 12);
  expect(c.equivalence!.interval.upper).toBeCloseTo(hi90, 12);
  expect(c.bayes).toBeNull(); // the Bayes factor is for "is there any correlation?", settled here
  expect(c.reading).toMatch(/^Across 100,000 pairs, y tends to rise as x rises, but negligibly: r = /);
  expect(c.reading).toContain(`accounts for ${String(Number((100 * hi95 * hi95).toPrecision(2)))}% of the variation in y`);
  expect(c.reading).toMatch(/real but too small to matter/);
  expect(c.reading).not.toMatch(/no clear relationship/);
});

test('a clear correlation that reaches beyond 0.1 is not called negligible, however many rows', () => {
  const n = 100000;
  const x = normals(23, n);
  const z = normals(24, n);
  const y = Float64Array.from(x, (v, i) => 0.3 * v + z[i]);
  const { c } = verdictOf(x, y);
  const [lo90] = fisherEnds(pearsonReference(x, y), n, 1.6448536269514715);
  expect(lo90).toBeGreaterThan(0.1);
  expect(c.equivalence).toBeNull();
  expect(c.reading).not.toMatch(/negligibl/);
  expect(c.reading).toMatch(/y tends to rise as x rises: r = /);
});
