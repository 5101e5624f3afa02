/**
 * runChecks: the eight checks computed once. Anscombe's quartet (Anscombe 1973, The American Statistician
 * 27:17-21; the data as in test/references.md and R's datasets::anscombe) must come out as set 1 clean, set 2 curved,
 * set 3 with an outlier, set 4 resting on one point. Per-point values against R 4.2.2 (checks-r.json); the K^2
 * branch above 5000 rows against scipy 1.10.1 normaltest (normaltest-scipy.json).
 */
import { CHECK_KEYS, CheckReport, CheckRow } from '../../../../src/stats/checks/check-report';
import { runChecks } from '../../../../src/stats/checks/run-checks';
import { StatsInputError } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import { R, SCIPY } from './fixtures';
import { simulate } from './simulated-data';

const sheetRows = Array.from({ length: 11 }, (_, i) => i + 2); // data in rows 2..12 under a header
const set = (k: number) => R.anscombe[k - 1];
const checksOf = (k: number) => runChecks(set(k).x, set(k).y, { alpha: 0.05, rows: sheetRows });
const row = (r: CheckReport, key: CheckRow['key']) => r.checks.find((c) => c.key === key)!;
const verdicts = (r: CheckReport) => Object.fromEntries(r.checks.map((c) => [c.key, c.verdict]));

describe("Anscombe's quartet is told apart", () => {
  test('every report has the eight rows in order', () => {
    for (const k of [1, 2, 3, 4]) expect(checksOf(k).checks.map((c) => c.key)).toEqual(CHECK_KEYS);
  });

  test('set 1: clean', () => {
    const r = checksOf(1);
    expect(r.flags).toEqual([]);
    expect(r.notTestable).toBe(0);
    expect(r.points.flagged).toEqual([]);
  });

  test('set 2: curved (it also bends the line enough for two points to reach Cook\'s cut-off)', () => {
    const r = checksOf(2);
    // A curve taking up most of the scatter (f² far above Cohen's 0.15): a problem even at 11 rows.
    expect(row(r, 'straight-line').verdict).toBe('problem');
    expect(row(r, 'straight-line').flag).toBe('curved');
    expect(row(r, 'straight-line').meaning).toMatch(/bend downward/);
    expect(row(r, 'straight-line').effect!.value).toBeGreaterThan(0.15);
    // 11 rows are enough for the outlier test to see a gross error (check-power.R: 10), and it finds none.
    expect(row(r, 'outliers').verdict).toBe('fine');
    expect(r.points.setsSlope).toBe(-1);
    expectRel(row(r, 'straight-line').statistic!, set(2).curvature!.F, 1e-8);
  });

  test('set 3: an outlier at sheet row 4 (the third pair)', () => {
    const r = checksOf(3);
    const out = row(r, 'outliers');
    expect(out.verdict).toBe('problem');
    expect(out.flag).toBe('outlier at row 4');
    expect(out.point).toBe(2);
    expectRel(out.statistic!, set(3).outlier.rstudent, 1e-9);
    // No curve found, but 11 rows are too few to rule one out (check-power.R: 25 needed).
    expect(row(r, 'straight-line').verdict).toBe('too few rows');
    expect(r.points.outliers).toEqual([2]);
    expect(r.flags).toContain('outlier at row 4');
  });

  test('set 4: one point sets the slope (sheet row 9), curvature not testable', () => {
    const r = checksOf(4);
    const infl = row(r, 'influence');
    expect(infl.verdict).toBe('problem');
    expect(infl.test).toBe('Leverage (hat value)');
    expect(infl.flag).toBe('one point sets the slope (row 9)');
    expect(infl.meaning).toMatch(/Cook's distance is undefined/);
    expect(row(r, 'straight-line').verdict).toBe('not testable');
    expect(row(r, 'straight-line').reason).toBe('x takes only two values, so curvature cannot be tested');
    expect(row(r, 'normal-x').verdict).toBe('not testable');
    expect(r.points.setsSlope).toBe(7);
    expect(r.flags).toEqual(['one point sets the slope (row 9)']);
    expect(Number.isNaN(r.points.cooksDistance[7])).toBe(true);
  });

  test('the four sets give four different verdict patterns', () => {
    const patterns = [1, 2, 3, 4].map((k) => JSON.stringify(verdicts(checksOf(k))));
    expect(new Set(patterns).size).toBe(4);
  });
});

describe('each row against R', () => {
  test.each([1, 2, 3, 4])('Anscombe set %d', (k) => {
    const s = set(k);
    const r = runChecks(s.x, s.y, { alpha: 0.05 });
    const pairs: [CheckRow['key'], { W: number; p: number } | null][] = [['normal-x', s.sw_x], ['normal-y', s.sw_y], ['normal-residuals', s.sw_e]];
    for (const [key, sw] of pairs) {
      const c = row(r, key);
      if (c.verdict === 'not testable') continue;
      expectRel(c.statistic!, sw!.W, 1e-12, `${key} W`);
      expectRel(c.pValue!, sw!.p, 1e-9, `${key} p`);
    }
    if (s.curvature) {
      expectRel(row(r, 'straight-line').statistic!, s.curvature.F, 1e-8);
    }
    if (k !== 2) expectRel(row(r, 'even-spread').statistic!, s.bp.statistic, 1e-8);
    expectRel(row(r, 'even-spread').pValue!, s.bp.p, 1e-6);
    expectRel(row(r, 'outliers').statistic!, s.outlier.rstudent, 1e-9);
    expectRel(row(r, 'outliers').pValue!, s.outlier.bonferroni_p, 1e-6);
    if (k !== 4) expectRel(row(r, 'influence').statistic!, s.cook.max, 1e-9);
    expectRel(row(r, 'row-order').statistic!, s.dw.statistic, 1e-10);
    expectRel(row(r, 'row-order').pValue!, s.dw.imhof_below!, 1e-9);
    // per-point arrays for the panel
    s.points!.hat.forEach((h, i) => expectRel(r.points.leverage[i], h, 1e-12));
    s.points!.rstudent.forEach((v, i) => (v === null ? expect(r.points.studentized[i]).toBeNaN() : expectRel(r.points.studentized[i], v, 1e-9)));
    expectRel(r.line.slope, s.slope, 1e-12);
    expectRel(r.line.intercept, s.intercept, 1e-12);
  });
});

describe('not testable, each in its own row', () => {
  test('three pairs: residual checks and influence say "too few rows"; normality of x and y still runs', () => {
    const r = runChecks([1, 2, 4], [1, 3, 2], { alpha: 0.05 });
    expect(row(r, 'normal-x').verdict).toBe('too few rows');
    // Leaving one of three rows out leaves two, whose r is always +/-1: influence needs four rows too.
    for (const key of ['normal-residuals', 'straight-line', 'even-spread', 'outliers', 'influence', 'row-order'] as const) {
      expect(row(r, key).verdict).toBe('not testable');
      expect(row(r, key).reason).toMatch(/too few rows: this check needs at least 4 pairs/);
    }
  });

  test('points exactly on a line: the residual checks have nothing to test', () => {
    const x = [1, 2, 3, 4, 5, 6, 7];
    const r = runChecks(x, x.map((v) => 3 * v - 2), { alpha: 0.05 });
    for (const key of ['normal-residuals', 'straight-line', 'even-spread', 'outliers', 'influence', 'row-order'] as const) {
      expect(row(r, key).verdict).toBe('not testable');
      expect(row(r, key).reason).toMatch(/exactly on a straight line/);
    }
    expect(r.flags).toEqual([]);
  });

  test('a two-valued y (groups) is not tested for normality', () => {
    const r = runChecks([1, 2, 3, 4, 5, 6], [0, 0, 1, 0, 1, 1], { alpha: 0.05 });
    expect(row(r, 'normal-y').reason).toBe('y takes only two values (two groups), so a normal shape does not apply');
  });

  test('every row keeps its shape when not testable: null statistic and p, a reason, a meaning', () => {
    const r = runChecks([1, 2, 4], [1, 3, 2], { alpha: 0.05 });
    for (const c of r.checks.filter((k) => k.verdict === 'not testable')) {
      expect(c.statistic).toBeNull();
      expect(c.pValue).toBeNull();
      expect(c.meaning).toBe(`Not testable: ${c.reason}.`);
    }
  });
});

describe('large data', () => {
  test('above 5000 rows normality switches to K² (scipy normaltest on the same data)', () => {
    const c = SCIPY.cases.find((k) => k.kind === 'plain' && k.n === 6000)!;
    const { x, y } = simulate('plain', 6000);
    const r = runChecks(x, y, { alpha: 0.05 });
    expect(row(r, 'normal-x').test).toBe("D'Agostino–Pearson K²");
    expectRel(row(r, 'normal-x').statistic!, c.x.k2, 1e-9);
    expectRel(row(r, 'normal-y').pValue!, c.y.k2_p, 1e-6);
    expectRel(row(r, 'normal-residuals').statistic!, c.residuals.k2, 1e-9);
    expectRel(row(r, 'normal-residuals').detail.skewness, c.residuals.skewness, 1e-9);
    expect(row(r, 'row-order').test).toMatch(/approximation/); // above 1,500 rows (DW_EXACT_MAX)
  });

  test('1,048,576 rows (a full sheet): linear time, finding AR(1) rows', () => {
    const { x, y } = simulate('ar1', 1048576);
    const cpu = process.cpuUsage();
    const r = runChecks(x, y, { alpha: 0.05 });
    const { user, system } = process.cpuUsage(cpu);
    // Trending x and y with AR(1) errors: found, and so few effective rows that the intervals would be far too narrow.
    expect(row(r, 'row-order').verdict).toBe('problem');
    expect(row(r, 'row-order').effect!.value).toBeLessThan(0.7 * 1048576);
    expect(row(r, 'row-order').test).toMatch(/approximation/);
    expect(r.points.studentized.length).toBe(1048576);
    // About 0.2-0.7 s of CPU in plain Node, some 10 s under jest (its sandbox makes every global lookup such as
    // Math.abs slow); the bound only catches a slip into quadratic time, which would take hours here.
    console.log(`runChecks, 1,048,576 rows: ${((user + system) / 1e6).toFixed(2)} s CPU`);
    expect((user + system) / 1e6).toBeLessThan(60);
  });
});

describe('units far apart', () => {
  test('x in units of 1e-300 and y of 1e300: every check as for (x, y) (R values), the slope leaves the range', () => {
    const s = set(3);
    const r = runChecks(s.x.map((v) => v * 1e-300), s.y.map((v) => v * 1e300), { alpha: 0.05 });
    expectRel(row(r, 'normal-residuals').statistic!, s.sw_e!.W, 1e-12);
    expectRel(row(r, 'straight-line').statistic!, s.curvature!.F, 1e-8);
    expectRel(row(r, 'even-spread').statistic!, s.bp.statistic, 1e-8);
    expectRel(row(r, 'outliers').statistic!, s.outlier.rstudent, 1e-9);
    expectRel(row(r, 'influence').statistic!, s.cook.max, 1e-9);
    expectRel(row(r, 'row-order').statistic!, s.dw.statistic, 1e-10);
    expect(r.line.slope).toBe(Infinity);
    expectRel(r.points.residuals[2] / 1e300, 3.241090909, 1e-9); // R 4.2.2: resid(lm(y3 ~ x3, anscombe))[3]
  });
});

describe('bad input', () => {
  test('refused as a whole: too few pairs, constant columns, non-finite values, bad alpha, unequal lengths', () => {
    expect(() => runChecks([1, 2], [3, 4], { alpha: 0.05 })).toThrow(StatsInputError);
    expect(() => runChecks([1, 1, 1, 1], [1, 2, 3, 4], { alpha: 0.05 })).toThrow(/x is constant/);
    expect(() => runChecks([1, 2, 3, 4], [5, 5, 5, 5], { alpha: 0.05 })).toThrow(/y is constant/);
    expect(() => runChecks([1, 2, NaN, 4], [1, 2, 3, 4], { alpha: 0.05 })).toThrow(/finite/);
    expect(() => runChecks([1, 2, 3], [1, 2, 3], { alpha: 1.5 })).toThrow(/alpha/);
    expect(() => runChecks([1, 2, 3], [1, 2], { alpha: 0.05 })).toThrow(/same number/);
  });

  test('points named by position when no sheet rows are given, or by a caller-supplied name', () => {
    const s = set(3);
    expect(runChecks(s.x, s.y, { alpha: 0.05 }).flags).toContain('outlier at position 3');
    expect(runChecks(s.x, s.y, { alpha: 0.05, pointName: (i) => `column ${'BCDEFGHIJKL'[i]}` }).flags).toContain('outlier at column D');
  });
});

test('x far from zero (1e15 + k, 5e14 + k) with noisy y: the checks run, as the coefficient does', () => {
  // Integers from 1e15 are exact doubles and their spread is 29, so nothing about the data is lost to the offset;
  // before, the rounding allowance grew with |x| itself and called 6 of 8 checks "not testable".
  let s = 9;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const noise = Array.from({ length: 30 }, () => 6 * (u() - 0.5));
  const base = runChecks(Array.from({ length: 30 }, (_, k) => k), noise.map((e, k) => k + e), { alpha: 0.05 });
  for (const off of [1e15, 5e14]) {
    const x = Array.from({ length: 30 }, (_, k) => off + k);
    const r = runChecks(x, noise.map((e, k) => k + e), { alpha: 0.05 });
    expect(r.checks.filter((c) => c.verdict === 'not testable').map((c) => c.key)).toEqual([]);
    // Shifting x changes nothing a check looks at: the same verdicts as at offset 0.
    expect(r.checks.map((c) => c.verdict)).toEqual(base.checks.map((c) => c.verdict));
    expect(r.flags).toEqual(base.flags);
  }
  // A line that is exact stays "on the line" at the offset.
  const exact = runChecks(Array.from({ length: 30 }, (_, k) => 1e15 + k), Array.from({ length: 30 }, (_, k) => 2 * k + 1), { alpha: 0.05 });
  expect(exact.checks.filter((c) => c.verdict === 'not testable').length).toBeGreaterThanOrEqual(5);
});
