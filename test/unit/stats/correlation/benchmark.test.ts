/**
 * The equivalence test (two one-sided Fisher z tests; Goertzen & Cribbie 2010, Lakens 2017), the test of rho = rho0,
 * the effective rows of two series (Pyper & Peterman 1998) and r without each row, against the same formulas
 * computed independently in R 4.2.2 (test/fixtures/verdict/formulas-r.R and .json; R's own cor() for the rows left
 * out).
 */
import * as fs from 'fs';
import * as path from 'path';
import { equivalenceTest, testAgainst } from '../../../../src/stats/correlation/benchmark';
import { effectiveRows } from '../../../../src/stats/correlation/effective-n';
import { leaveOneOut } from '../../../../src/stats/correlation/leave-one-out';
import { Method, Tail } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';

const F = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../fixtures/verdict/formulas-r.json'), 'utf8'));

type Eq = { r: number; n: number; method: Method; bound: number; alpha: number; p: number; p_low: number; p_up: number; lower: number; upper: number };
describe('equivalence test', () => {
  test.each((F.equivalence as Eq[]).map((c) => [c.method, c.r, c.n, c] as const))('%s r = %d, n = %d', (_m, _r, _n, c) => {
    const e = equivalenceTest(c.r, c.n, c.method, c.bound, c.alpha);
    expectRel(e.pValue, c.p, 1e-12, 'p');
    expectRel(e.pLower, c.p_low, 1e-12, 'p low');
    expectRel(e.pUpper, c.p_up, 1e-12, 'p up');
    expectRel(e.interval.lower, c.lower, 1e-12, 'lower');
    expectRel(e.interval.upper, c.upper, 1e-12, 'upper');
    // The verdict and the interval agree: negligible exactly when the 1 - 2 alpha interval lies inside the bounds.
    expect(e.negligible).toBe(c.lower > -c.bound && c.upper < c.bound);
  });
  test('bad bounds and alphas are refused with a message', () => {
    expect(() => equivalenceTest(0.1, 50, 'pearson', 0, 0.05)).toThrow(/bound/);
    expect(() => equivalenceTest(0.1, 50, 'pearson', 0.1, 0.6)).toThrow(/alpha/);
    expect(() => equivalenceTest(1, 50, 'pearson', 0.1, 0.05)).toThrow(/perfect/);
  });
});

type Ag = { r: number; n: number; method: Method; against: number; z: number; both: number; positive: number; negative: number };
describe('test against a benchmark other than zero', () => {
  test.each((F.against as Ag[]).map((c) => [c.method, c.r, c.against, c] as const))('%s r = %d against %d', (_m, _r, _a, c) => {
    for (const [tail, p] of [['both', c.both], ['positive', c.positive], ['negative', c.negative]] as [Tail, number][]) {
      const t = testAgainst(c.r, c.n, c.method, c.against, tail);
      expectRel(t.z, c.z, 1e-12, 'z');
      expectRel(t.pValue, p, 1e-10, tail);
    }
  });
});

type Ef = { label: string; x: number[]; y: number[]; effective: number };
describe('effective rows (Pyper & Peterman 1998)', () => {
  test.each((F.effective as Ef[]).map((c) => [c.label, c] as const))('%s', (_l, c) => {
    expectRel(effectiveRows(c.x, c.y).effective, c.effective, 1e-10);
  });
});

describe('r without each row', () => {
  test.each((F.leave_one_out as { x: number[]; y: number[]; without: number[] }[]).map((c, i) => [i, c] as const))('case %i against R cor(x[-i], y[-i])', (_i, c) => {
    const l = leaveOneOut(c.x, c.y);
    c.without.forEach((w, i) => expectRel(l.without[i], w, 1e-10, `row ${i}`));
    const gaps = c.without.map((w) => Math.abs(w - l.r));
    expect(l.most).toBe(gaps.indexOf(Math.max(...gaps)));
  });
});
