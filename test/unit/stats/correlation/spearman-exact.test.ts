/**
 * Spearman's p-value for data without ties against two outside references:
 * - the exact null distribution of S by full enumeration of all n! rankings, n = 3..10
 *   (test/fixtures/verdict/spearman-exact-enumeration.py and .json, exact fractions), to 1e-12;
 * - R 4.2.2 cor.test(x, y, method = "spearman", exact = TRUE) for n = 4..1289, every alternative
 *   (test/fixtures/verdict/spearman-r.R and .json, versions in the file), to 1e-6 relative. R enumerates up to
 *   n = 9 and uses the Edgeworth series of Best & Roberts (1975, AS 89) above, as Covary does.
 */
import * as fs from 'fs';
import * as path from 'path';
import { correlate } from '../../../../src/stats/correlation/correlate';
import { enumeratedTails, spearmanCounts, SPEARMAN_ENUMERATED_MAX_N } from '../../../../src/stats/correlation/spearman-exact';
import { Tail } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';

const dir = path.resolve(__dirname, '../../../fixtures/verdict');
const ENUM = JSON.parse(fs.readFileSync(path.join(dir, 'spearman-exact-enumeration.json'), 'utf8'));
const R = JSON.parse(fs.readFileSync(path.join(dir, 'spearman-r.json'), 'utf8'));

interface EnumCase { n: number; total: number; counts: Record<string, number>; lower: Record<string, string>; upper: Record<string, string> }
const enumerated = (ENUM.distributions as EnumCase[]).filter((d) => d.n <= SPEARMAN_ENUMERATED_MAX_N);

describe('the null distribution of S by enumeration (fixture: full enumeration in Python, exact counts)', () => {
  test('the fixture covers n = 3..9', () => expect(enumerated.map((d) => d.n)).toEqual([3, 4, 5, 6, 7, 8, 9]));
  test.each(enumerated.map((d) => [d.n, d] as const))('n = %i: counts and both tails', (n, d) => {
    const counts = spearmanCounts(n);
    for (let s = 0; s < counts.length; s++) expect([s, counts[s]]).toEqual([s, d.counts[String(s)] ?? 0]);
    for (const [s, lower] of Object.entries(d.lower)) {
      const t = enumeratedTails(n, Number(s));
      expect(Math.abs(t.lower - Number(lower))).toBeLessThan(1e-12);
      expect(Math.abs(t.upper - Number(d.upper[s]))).toBeLessThan(1e-12);
    }
  });
});

interface RCase { n: number; x?: number[]; y?: number[]; rho: number; S: number; p_two_sided: number; p_greater: number; p_less: number; label: string }
const withData = (R.cases as RCase[]).filter((c) => Array.isArray(c.x) && Array.isArray(c.y));

describe("R cor.test(method = 'spearman', exact = TRUE)", () => {
  test('the fixture covers n from 4 to 1289 with data', () => {
    const ns = new Set(withData.map((c) => c.n));
    for (const n of [4, 6, 9, 10, 12, 20, 50, 100, 200]) expect([n, ns.has(n)]).toEqual([n, true]);
  });
  test.each(withData.map((c, i) => [i, c.n, c.label, c] as const))('case %i (n = %i, %s): rho and the three p-values', (_i, _n, _label, c) => {
    const x = c.x as number[];
    const y = c.y as number[];
    const run = (tail: Tail) => correlate(x, y, { method: 'spearman', tail, level: 0.95 });
    const both = run('both');
    expect(Math.abs(both.statistic - c.rho)).toBeLessThan(1e-12);
    expectRel(both.pValue, c.p_two_sided, 1e-6, 'two-sided');
    expectRel(run('positive').pValue, c.p_greater, 1e-6, 'greater');
    expectRel(run('negative').pValue, c.p_less, 1e-6, 'less');
    expect(both.pMethod).toMatch(c.n <= 9 ? /enumeration/ : /Edgeworth/);
  });
});

describe('perfect rank agreement', () => {
  const x = [1, 2, 3, 4, 5, 6];
  const y = x.map((v) => v ** 3);
  test('n = 6, perfectly monotone: exact p = 2/720 two-sided, 1/720 one-sided (enumeration)', () => {
    expect(correlate(x, y, { method: 'spearman', tail: 'both', level: 0.95 }).pValue).toBeCloseTo(2 / 720, 15);
    expect(correlate(x, y, { method: 'spearman', tail: 'positive', level: 0.95 }).pValue).toBeCloseTo(1 / 720, 15);
  });
  test('no zero-width interval: the bounds are withheld with a reason, for Spearman and Kendall', () => {
    for (const method of ['spearman', 'kendall'] as const) {
      const i = correlate(x, y, { method, tail: 'both', level: 0.95 }).interval;
      expect([Number.isNaN(i.lower), Number.isNaN(i.upper)]).toEqual([true, true]);
      expect(i.note).toMatch(/agree perfectly/);
    }
  });
});
