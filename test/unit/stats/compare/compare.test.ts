/**
 * Comparing two correlations: published worked examples (Fisher 1925, Steiger 1980, Zou 2007, as listed in
 * test/references.md) and R 4.2.2 psych::r.test (test/fixtures/compare/compare-r.json, script beside it).
 */
import { compareIndependent, compareIndependentSamples } from '../../../../src/stats/compare/independent';
import { compareShared, compareSharedSamples } from '../../../../src/stats/compare/shared';
import { compareSeparate, compareSeparateSamples } from '../../../../src/stats/compare/separate';
import { ComparisonResult, describeComparison } from '../../../../src/stats/compare/comparison';
import { StatsInputError, Tail } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import { expectAbs, R, RTails } from './fixtures';
import { pairsWithoutBlanks } from '../../../helpers/pairs';

const both = { tail: 'both' as Tail, level: 0.95 };
const TAILS: Tail[] = ['both', 'positive', 'negative'];

/** The p-value of every tail and the interval against an R record. */
function expectTailsAndInterval(run: (tail: Tail) => ComparisonResult, ref: RTails, label: string): void {
  for (const tail of TAILS) {
    const res = run(tail);
    const expected = tail === 'both' ? ref.p_both : tail === 'positive' ? ref.p_positive : ref.p_negative;
    expectRel(res.pValue, expected, 1e-6, `${label} p (${tail})`);
    expect(res.tail).toBe(tail);
    // The interval is two-sided whatever the tail.
    expectAbs(res.interval.lower, ref.lower, 1e-9, `${label} lower`);
    expectAbs(res.interval.upper, ref.upper, 1e-9, `${label} upper`);
    expect(res.interval.level).toBe(ref.level);
  }
}

describe('Fisher (1925) z test for independent groups, Zou (2007) interval', () => {
  test('Fisher (1925) examples as in the cocor test suite: z = 2.19 and z = -0.8751012342, p = 0.3815188256', () => {
    // [printed: cocor tests, test/references.md]
    expectAbs(compareIndependent(0.92, 60, 0.82, 50, both).test.value, 2.19, 0.005);
    const b = compareIndependent(0.4, 100, 0.5, 100, both);
    expectRel(b.test.value, -0.8751012342, 1e-9);
    expectRel(b.pValue, 0.3815188256, 1e-9);
    expectRel(b.statistic, -0.1, 1e-12);
  });

  test('Zou (2007) example 1: r1 = .49 (n 145), r2 = .36 (n 87) gives 95% CI (-.087, .359)', () => {
    // [printed: Zou 2007 via the cocor test suite, test/references.md] printed to three decimals
    const res = compareIndependent(0.49, 145, 0.36, 87, both);
    expectAbs(res.interval.lower, -0.087, 0.0005);
    expectAbs(res.interval.upper, 0.359, 0.0005);
    expect(res.design).toBe('independent');
    expect(describeComparison(res)).toMatch(/Fisher \(1925\).*Zou \(2007\)/);
  });

  test.each([['fisher_a'], ['fisher_b'], ['zou_independent'], ['zou_independent_90']] as const)(
    '%s against R psych::r.test and Zou interval on R Fisher limits, every tail',
    (key) => {
      const ref = R.published[key];
      expectRel(compareIndependent(ref.r1, ref.n1, ref.r2, ref.n2, both).test.value, ref.z, 1e-9, key);
      expectTailsAndInterval((tail) => compareIndependent(ref.r1, ref.n1, ref.r2, ref.n2, { tail, level: ref.level }), ref, key);
    },
  );

  test('from raw data: tenure and performance, north against south (R cor.test and psych::r.test)', () => {
    const ref = R.groups;
    const pick = (region: 'north' | 'south') => pairsWithoutBlanks(R.data[region].tenure, R.data[region].performance);
    const n = pick('north');
    const s = pick('south');
    const res = compareIndependentSamples(n.x, n.y, s.x, s.y, both);
    expectRel(res.r1, ref.r1, 1e-12);
    expectRel(res.r2, ref.r2, 1e-12);
    expectRel(res.statistic, ref.r1 - ref.r2, 1e-12);
    expect([res.n1, res.n2]).toEqual([ref.n1, ref.n2]);
    expectRel(res.test.value, ref.z, 1e-9);
    // Zou's interval is the same on R's own cor.test limits.
    expectAbs(res.interval.lower, ref.zou_from_cor_test![0], 1e-9);
    expectAbs(res.interval.upper, ref.zou_from_cor_test![1], 1e-9);
    expectTailsAndInterval((tail) => compareIndependentSamples(n.x, n.y, s.x, s.y, { tail, level: 0.95 }), ref, 'groups');
  });

  test('bad input', () => {
    expect(() => compareIndependent(1, 50, 0.3, 50, both)).toThrow(/strictly between -1 and 1/);
    expect(() => compareIndependent(0.2, 3, 0.3, 50, both)).toThrow(/n1 must be a whole number of at least 4/);
    expect(() => compareIndependent(0.2, 10.5, 0.3, 50, both)).toThrow(StatsInputError);
    expect(() => compareIndependent(0.2, 10, 0.3, 50, { tail: 'both', level: 1 })).toThrow(/level/);
    expect(() => compareIndependentSamples([1, 2, 3], [1, 3, 2], [1, 2, 3, 4], [2, 1, 4, 3], both)).toThrow(/first group has only 3/);
    expect(() => compareIndependentSamples([1, 2, 3, 4], [1, 2, 3, 4], [1, 2, 3, 4], [2, 1, 4, 3], both)).toThrow(/straight line/);
    expect(() => compareIndependentSamples([1, 2, 3, 4], [5, 5, 5, 5], [1, 2, 3, 4], [2, 1, 4, 3], both)).toThrow(/y1 is constant/);
  });
});

describe("Williams' t (Steiger 1980, eq. 7) for a shared variable, Zou (2007) interval", () => {
  test('Steiger (1980) Case A: r_jk = .4, r_jh = .5, r_kh = .1, n = 103 gives t = -0.89128, p = .374919', () => {
    // [printed: Steiger 1980 / psych::r.test, test/references.md]
    const res = compareShared({ rjk: 0.4, rjh: 0.5, rkh: 0.1, n: 103 }, both);
    expectAbs(res.test.value, -0.89128, 5e-6);
    expectAbs(res.pValue, 0.374919, 5e-7);
    expect(res.test.df).toBe(100);
  });

  test('Zou (2007) example 2: r_jk = .396, r_jh = .179, r_kh = .088, n = 66 gives (-.093, .517)', () => {
    // [printed: Zou 2007 via the cocor test suite, test/references.md] printed to three decimals
    const res = compareShared({ rjk: 0.396, rjh: 0.179, rkh: 0.088, n: 66 }, both);
    expectAbs(res.interval.lower, -0.093, 0.0005);
    expectAbs(res.interval.upper, 0.517, 0.0005);
  });

  test.each([['steiger_a'], ['zou_shared']] as const)('%s against R psych::r.test, every tail', (key) => {
    const ref = R.published[key];
    const c3 = { rjk: ref.rjk, rjh: ref.rjh, rkh: ref.rkh, n: ref.n };
    const res = compareShared(c3, both);
    expectRel(res.test.value, ref.t, 1e-9, key);
    expectRel(res.estimateCorrelation, ref.c, 1e-9, key);
    expectTailsAndInterval((tail) => compareShared(c3, { tail, level: 0.95 }), ref, key);
  });

  test('from raw data: performance with tenure against performance with the test score (R)', () => {
    const ref = R.shared;
    const d = R.data.north;
    const rows = d.performance.map((_, i) => i).filter((i) => d.performance[i] !== null && d.tenure[i] !== null && d.test[i] !== null);
    const pick = (v: (number | null)[]) => rows.map((i) => v[i] as number);
    const run = (tail: Tail) => compareSharedSamples(pick(d.performance), pick(d.tenure), pick(d.test), { tail, level: 0.95 });
    const res = run('both');
    expect(res.n1).toBe(ref.n);
    expectRel(res.r1, ref.rjk, 1e-12);
    expectRel(res.r2, ref.rjh, 1e-12);
    expectRel(res.test.value, ref.t, 1e-9);
    expectTailsAndInterval(run, ref, 'shared data');
  });

  test('bad input', () => {
    expect(() => compareShared({ rjk: 0.9, rjh: -0.9, rkh: 0.9, n: 50 }, both)).toThrow(/cannot all hold/);
    expect(() => compareShared({ rjk: 0.4, rjh: 0.5, rkh: 0.1, n: 3 }, both)).toThrow(/n must be a whole number of at least 4/);
    expect(() => compareSharedSamples([1, 2, 3], [2, 1, 3], [3, 1, 2], both)).toThrow(/only 3 usable rows/);
    expect(() => compareSharedSamples([1, 2, 3, 4], [2, 1, 3, 5], [2, 1, 3, 5], both)).toThrow(/a and b lie exactly on a straight line/);
  });
});

describe("Steiger's (1980) pooled Z for separate pairs, Zou (2007) interval", () => {
  test('Steiger (1980) Case B: z = -1.404975, p = .160029', () => {
    // [printed: Steiger 1980 / psych::r.test pooled, test/references.md]
    const res = compareSeparate({ rjk: 0.5, rhm: 0.6, rjh: 0.8, rjm: 0.5, rkh: 0.5, rkm: 0.7, n: 103 }, both);
    expectAbs(res.test.value, -1.404975, 5e-7);
    expectAbs(res.pValue, 0.160029, 5e-7);
  });

  test('Zou (2007) example 3 gives (-.096, .501), with c = .0891 (the paper misprints .0917)', () => {
    // [printed: Zou 2007 via the cocor test suite, test/references.md]; the paper prints .500 for the upper limit
    const res = compareSeparate({ rjk: 0.396, rhm: 0.189, rjh: 0.208, rjm: 0.143, rkh: 0.023, rkm: 0.423, n: 66 }, both);
    expectAbs(res.interval.lower, -0.096, 0.0005);
    expectAbs(res.interval.upper, 0.501, 0.0005);
    expectAbs(res.estimateCorrelation, 0.0891, 0.00005);
  });

  test.each([['steiger_b'], ['zou_separate']] as const)('%s against R psych::r.test, every tail', (key) => {
    const ref = R.published[key];
    const c6 = { rjk: ref.rjk, rhm: ref.rhm, rjh: ref.rjh, rjm: ref.rjm, rkh: ref.rkh, rkm: ref.rkm, n: ref.n };
    const res = compareSeparate(c6, both);
    expectRel(res.test.value, ref.z, 1e-9, key);
    // psych's factored form of the covariance against our Pearson-Filon expansion.
    expectRel(res.estimateCorrelation, ref.c, 1e-9, key);
    expectTailsAndInterval((tail) => compareSeparate(c6, { tail, level: 0.95 }), ref, key);
  });

  test('from raw data: tenure-performance against test-training in the same stores (R)', () => {
    const ref = R.separate;
    const d = R.data.north;
    const cols = [d.tenure, d.performance, d.test, d.training];
    const rows = d.tenure.map((_, i) => i).filter((i) => cols.every((c) => c[i] !== null));
    const [a, b, c, e] = cols.map((v) => rows.map((i) => v[i] as number));
    const run = (tail: Tail) => compareSeparateSamples(a, b, c, e, { tail, level: 0.95 });
    const res = run('both');
    expect(res.n1).toBe(ref.n);
    expectRel(res.test.value, ref.z, 1e-9);
    expectRel(res.estimateCorrelation, ref.c, 1e-9);
    expectTailsAndInterval(run, ref, 'separate data');
  });

  test('bad input', () => {
    expect(() => compareSeparate({ rjk: 0.5, rhm: 0.6, rjh: 1.2, rjm: 0.5, rkh: 0.5, rkm: 0.7, n: 103 }, both)).toThrow(/between -1 and 1/);
    expect(() => compareSeparate({ rjk: 0.5, rhm: 0.6, rjh: 0.8, rjm: 0.5, rkh: 0.5, rkm: 0.7, n: 2 }, both)).toThrow(/at least 4/);
    expect(() => compareSeparateSamples([1, 2, 3, 4], [1, 2, 3, 5], [2, 1, 4, 3], [7, 7, 7, 7], both)).toThrow(/d is constant/);
  });
});
