/**
 * CHECKS, FLAGS and REPORT called as Excel calls them (2-D arrays, null for omitted arguments, an invocation with
 * the argument addresses). Data: Anscombe's quartet (Anscombe 1973, test/references.md) and the Hollander & Wolfe
 * (1973) data of R's ?cor.test example (test/references.md: r = 0.5711816, 95% CI (-0.1497426, 0.8955795),
 * p = 0.1082; Kendall tau = 0.4444444; Spearman rho = 0.6).
 */
import { CHECKS, FLAGS, REPORT } from '../../../src/functions/fn-checks';
import { clearSharedPairs } from '../../../src/functions/shared-pairs';
import { expectRel } from '../../helpers/close';
import { R } from '../stats/checks/fixtures';
import { cellError } from '../../helpers/cell-error';

const col = (v: unknown[]) => v.map((a) => [a]);
const row = (v: unknown[]) => [v];
const NONE = null as unknown as number;
const NO_WORD = null as unknown as string;
const at = (x: string, y: string) => ({ parameterAddresses: [x, y] }) as unknown as CustomFunctions.Invocation;
const SHEET = at('Sheet1!B2:B12', 'Sheet1!C2:C12');
const set = (k: number) => R.anscombe[k - 1];
const flags = (k: number, inv?: CustomFunctions.Invocation) => FLAGS(col(set(k).x), col(set(k).y), NONE, inv)[0][0];
const reportMap = (t: unknown[][]) => new Map(t.map(([label, value]) => [String(label), value]));

const HW_X = [44.4, 45.9, 41.9, 53.3, 44.7, 44.1, 50.7, 45.2, 60.1];
const HW_Y = [2.6, 3.1, 2.5, 5.0, 3.6, 4.0, 5.2, 2.8, 3.8];

/** Every cell is a finite number or text: no null (shows as 0), no NaN or Infinity. */
function expectCleanCells(table: unknown[][]): void {
  for (const r of table) {
    for (const c of r) {
      expect(c === null || c === undefined).toBe(false);
      if (typeof c === 'number') expect(Number.isFinite(c)).toBe(true);
      else expect(typeof c).toBe('string');
    }
  }
}

beforeEach(() => clearSharedPairs());

describe("Anscombe's quartet through FLAGS and CHECKS", () => {
  test('FLAGS tells the four sets apart, naming sheet rows', () => {
    // 11 rows: most checks cannot see, and FLAGS says so instead of a bare "no flags".
    expect(flags(1, SHEET)).toBe('no flags, but 6 checks had too few rows to tell');
    expect(flags(2, SHEET)).toMatch(/(^|; )curved(;|$)/);
    expect(flags(3, SHEET)).toMatch(/outlier at row 4/);
    expect(flags(3, SHEET)).not.toMatch(/curved/);
    expect(flags(4, SHEET)).toBe('one point sets the slope (row 9); 4 checks had too few rows to tell, 2 checks not testable');
    expect(new Set([1, 2, 3, 4].map((k) => flags(k, SHEET))).size).toBe(4);
  });

  test('CHECKS: header, then the eight checks in order, eight columns (effect and rule included), clean cells', () => {
    for (const k of [1, 2, 3, 4]) {
      const t = CHECKS(col(set(k).x), col(set(k).y), NONE, SHEET);
      expect(t[0]).toEqual(['Check', 'Test used', 'Statistic', 'p-value', 'Effect', 'Verdict', 'What it means', 'Judged by']);
      expect(t.map((r) => r[0])).toEqual([
        'Check', 'Normal x', 'Normal y', 'Normal residuals', 'Straight line', 'Even spread', 'Outliers', 'Influential points', 'Row order',
      ]);
      for (const r of t) expect(r.length).toBe(8);
      expectCleanCells(t);
      for (const r of t.slice(1)) expect(['fine', 'slight', 'problem', 'too few rows', 'not testable']).toContain(r[5]);
      for (const r of t.slice(1)) if (r[5] !== 'not testable') expect(String(r[4]).length).toBeGreaterThan(5);
    }
  });

  test('CHECKS verdicts: set 1 nothing found but too few rows to see most; set 2 curve; set 3 outlier; set 4 leverage', () => {
    const v = (k: number) => CHECKS(col(set(k).x), col(set(k).y), NONE, SHEET).slice(1).map((r) => r[5]);
    // 11 rows: enough for the outlier test (10, check-power.R), not for the others (19-64); influence has no test.
    expect(v(1)).toEqual(['too few rows', 'too few rows', 'too few rows', 'too few rows', 'too few rows', 'fine', 'fine', 'too few rows']);
    expect(v(2)[3]).toBe('problem');
    expect(v(3)[5]).toBe('problem');
    expect(v(3)[3]).toBe('too few rows');
    const t4 = CHECKS(col(set(4).x), col(set(4).y), NONE, SHEET);
    expect(t4[7]).toEqual(['Influential points', 'Leverage (hat value)', expect.any(Number), '', expect.stringMatching(/^leverage 1/), 'problem', expect.stringMatching(/^Row 9 sets the slope on its own/), expect.stringMatching(/sets the slope/)]);
    expect(t4[4].slice(2, 6)).toEqual(['', '', '', 'not testable']);
    expect(t4[4][6]).toBe('Not testable: x takes only two values, so curvature cannot be tested.');
  });

  test('CHECKS statistics against R 4.2.2 (checks-r.json): W, F, Breusch-Pagan, rstudent, Cook, Durbin-Watson', () => {
    const s = set(3);
    const t = CHECKS(col(s.x), col(s.y), NONE, SHEET);
    expectRel(t[1][2] as number, s.sw_x!.W, 1e-12);
    expectRel(t[3][2] as number, s.sw_e!.W, 1e-12);
    expectRel(t[4][2] as number, s.curvature!.F, 1e-8);
    expectRel(t[5][2] as number, s.bp.statistic, 1e-8);
    expectRel(t[6][2] as number, s.outlier.rstudent, 1e-9);
    expectRel(t[6][3] as number, s.outlier.bonferroni_p, 1e-6);
    expectRel(t[7][2] as number, s.cook.max, 1e-9);
    expectRel(t[8][2] as number, s.dw.statistic, 1e-10);
  });

  test('alpha: a stricter level drops the weaker flags of set 2', () => {
    expect(FLAGS(col(set(2).x), col(set(2).y), 0.05, SHEET)[0][0]).toMatch(/slight: y not normal/);
    expect(FLAGS(col(set(2).x), col(set(2).y), 0.01, SHEET)[0][0]).toBe('curved; slight: influential point at row 7; 5 checks had too few rows to tell');
  });
});

describe('naming points', () => {
  test('without addresses (tests, hosts that give none): position in the range', () => {
    expect(flags(3)).toMatch(/outlier at position 3/);
  });

  test('skipped cells keep sheet rows right', () => {
    const x = [null, 'n/a', ...set(3).x];
    const y = [1, 2, ...set(3).y];
    expect(FLAGS(col(x), col(y), NONE, at('Data!$B$5:$B$17', 'Data!$C$5:$C$17'))[0][0]).toMatch(/outlier at row 9/);
    expect(FLAGS(col(x), col(y), NONE)[0][0]).toMatch(/outlier at position 5/);
  });

  test('data laid out in a row: sheet columns', () => {
    expect(FLAGS(row(set(3).x), row(set(3).y), NONE, at("'North branch'!B3:L3", "'North branch'!B4:L4"))[0][0]).toMatch(/outlier at column D/);
  });
});

describe('REPORT', () => {
  test('Hollander & Wolfe data: r, interval, p as R cor.test; Spearman and Kendall alongside', () => {
    const m = reportMap(REPORT(col(HW_X), col(HW_Y), NONE, NO_WORD));
    expect(m.get('Pairs used')).toBe(9);
    expect(m.get('Pairs skipped (blank, text or TRUE/FALSE)')).toBe(0);
    expect(m.get('Coefficient')).toBe('Pearson');
    expectRel(m.get('r') as number, 0.5711816, 1e-6);
    expectRel(m.get('95% interval, lower') as number, -0.1497426, 1e-6);
    expectRel(m.get('95% interval, upper') as number, 0.8955795, 1e-6);
    expectRel(m.get('p-value (two-sided, t test, df = n - 2)') as number, 0.108173054349494, 1e-6); // R 4.2.2 cor.test(x, y)$p.value
    expectRel(m.get('Slope of the line (change in y per unit of x)') as number, 0.0971809539487221, 1e-9); // R 4.2.2: coef(lm(y ~ x))
    expectRel(m.get('Intercept of the line (y where x = 0)') as number, -1.0241071649039057, 1e-9);
    expectRel(m.get('r² (Pearson: share of the variation in y the line accounts for)') as number, 0.5711816 ** 2, 1e-6);
    expectRel(m.get('Spearman rho alongside') as number, 0.6, 1e-12);
    expectRel(m.get('Kendall tau-b alongside') as number, 0.4444444, 1e-6);
    expect(m.has('Pearson r alongside')).toBe(false);
  });

  test('the reading: strength convention stated, what p is and is not, and no claim beyond the data', () => {
    const reading = String(reportMap(REPORT(col(HW_X), col(HW_Y), NONE, NO_WORD)).get('Reading'));
    // The interval includes zero: no direction is stated, only what the data cannot rule out.
    expect(reading).toMatch(/the data show no clear relationship/);
    expect(reading).not.toMatch(/tends to rise|tends to fall|positive correlation/);
    expect(reading).toMatch(/p = 0\.11 is the chance of data at least this extreme if there were no correlation \(not the chance that there is none\)/);
    expect(reading).toMatch(/the 95% interval runs from -0\.15 to 0\.896, so the data cannot rule out a correlation as strong as 0\.15 in the negative direction or 0\.896 in the positive/);
    const one = String(reportMap(REPORT(col(set(1).x), col(set(1).y), NONE, NO_WORD)).get('Reading'));
    expect(one).toMatch(/^Across 11 pairs, y tends to rise as x rises: r = 0\.816 is a large correlation/);
    expect(one).toMatch(/does not show that x causes y\.$/);
    expect(one.split('. ').length).toBe(1); // one sentence
  });

  test('recommendations follow the flags', () => {
    const rec = (k: number, method: string | null = null) => {
      const m = reportMap(REPORT(col(set(k).x), col(set(k).y), NONE, method as string, NO_WORD, NO_WORD, NO_WORD, SHEET));
      return [m.get('Recommended coefficient'), String(m.get('Why'))];
    };
    // 11 clean rows: never "read as it stands" while most checks could not see.
    expect(rec(1)[0]).toBe('Pearson');
    expect(rec(1)[1]).toMatch(/^With 11 rows most of the checks cannot see whether the assumptions hold/);
    expect(rec(1)[1]).not.toMatch(/as it stands/);
    expect(rec(2)[0]).toBe('Kendall tau-b');
    expect(rec(2)[1]).toMatch(/^The points bend away from a straight line/);
    // An outlier (Anscombe's third set): the percentage bend correlation, with how far it moves from Pearson.
    expect(rec(3)[0]).toBe('percentage bend');
    expect(rec(3)[1]).toMatch(/^An outlier \(row 4\) moves r: leaving row 4 out moves r from 0\.816 to/);
    expect(rec(3)[1]).toMatch(/r_pb = \d\.\d+ against Pearson's r = 0\.816/);
    expect(rec(3, 'spearman')[0]).toBe('Spearman');
    expect(rec(3, 'spearman')[1]).toMatch(/Spearman \(as chosen\) is a rank coefficient and resists it/);
    expect(rec(4)).toEqual(['none is reliable on these data', expect.stringMatching(/^One point sets the slope \(row 9\)/)]);
  });

  test('level and method words; Kendall read on the scale of r; clean cells', () => {
    const t = REPORT(col(HW_X), col(HW_Y), 0.9, 'Kendall');
    expectCleanCells(t);
    const m = reportMap(t);
    expect(m.get('Coefficient')).toBe('Kendall tau-b');
    expect(m.has('90% interval, lower')).toBe(true);
    expectRel(m.get('tau-b') as number, 0.4444444444444444, 1e-12);
    expect(String(m.get('Reading'))).toMatch(/tau-b = 0\.444 \(about r = 0\.643 by Greiner's relation\)/);
  });

  test('too few pairs for an interval: said in words, not NaN', () => {
    const m = reportMap(REPORT(col([1, 2, 3]), col([2, 1, 3]), NONE, NO_WORD));
    expect(m.get('95% interval, lower')).toBe('an interval needs at least 4 pairs');
  });
});

describe('not-testable paths through CHECKS', () => {
  test('three pairs: six residual checks too few, normality of x and y runs but cannot see', () => {
    const t = CHECKS(col([1, 2, 4]), col([1, 3, 2]), NONE);
    expectCleanCells(t);
    const reasons = t.slice(1).filter((r) => r[5] === 'not testable').map((r) => r[6]);
    expect(reasons).toEqual(Array(6).fill('Not testable: too few rows: this check needs at least 4 pairs.'));
    expect(t.slice(1, 3).map((r) => r[5])).toEqual(['too few rows', 'too few rows']);
  });

  test('points exactly on a line', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const t = CHECKS(col(x), col(x.map((v) => 10 - 2 * v)), NONE);
    expect(t.slice(3).map((r) => r[5])).toEqual(Array(6).fill('not testable'));
    expect(FLAGS(col(x), col(x.map((v) => 10 - 2 * v)), NONE)[0][0]).toBe('no flags, but 2 checks had too few rows to tell, 6 checks not testable');
  });
});

describe('bad input', () => {
  test('a constant column: #VALUE! saying which', () => {
    const e = cellError(() => CHECKS(col([5, 5, 5, 5]), col([1, 2, 3, 4]), NONE));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toMatch(/x is constant/);
    expect(cellError(() => FLAGS(col([1, 2, 3, 4]), col([7, 7, 7, 7]), NONE)).message).toMatch(/y is constant/);
    expect(cellError(() => REPORT(col([1, 2, 3, 4]), col([7, 7, 7, 7]), NONE, NO_WORD)).message).toMatch(/y is constant/);
  });

  test('too few pairs: #N/A with the count', () => {
    const e = cellError(() => CHECKS(col([1, 2, 'x']), col([3, 4, 5]), NONE));
    expect(e.code).toBe('#N/A');
    expect(e.message).toMatch(/only 2 usable pairs/);
    expect(cellError(() => FLAGS(col([1]), col([2]), NONE)).code).toBe('#N/A');
  });

  test('bad options and shapes: #VALUE!', () => {
    expect(cellError(() => CHECKS(col(HW_X), col(HW_Y), 5)).message).toMatch(/alpha must be between 0 and 1/);
    expect(cellError(() => FLAGS(col(HW_X), col(HW_Y), 0)).message).toMatch(/alpha/);
    expect(cellError(() => REPORT(col(HW_X), col(HW_Y), 95, NO_WORD)).message).toMatch(/level must be between 0 and 1/);
    expect(cellError(() => REPORT(col(HW_X), col(HW_Y), NONE, 'pearsons')).message).toMatch(/method must be one of/);
    expect(cellError(() => CHECKS(col(HW_X), col(HW_Y.slice(1)), NONE)).message).toMatch(/same number of cells/);
    expect(cellError(() => CHECKS([[1, 2], [3, 4]], col([1, 2]), NONE)).message).toMatch(/single column or a single row/);
  });
});

test('REPORT names the columns in its reading: given names, else headers in the first cells, else x and y', () => {
  // Anscombe (1973) set 1 rises clearly, so the reading states a direction.
  const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
  const y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
  const reading = (t: unknown) => String((t as [string, unknown][]).find((r) => r[0] === 'Reading')![1]);
  expect(reading(REPORT(x.map((v) => [v]), y.map((v) => [v])))).toMatch(/y tends to rise as x rises.*does not show that x causes y/);
  expect(reading(REPORT([['Visits'], ...x.map((v) => [v])], [['Sales'], ...y.map((v) => [v])]))).toMatch(/Sales tends to rise as Visits rises.*does not show that Visits causes Sales/);
  expect(reading(REPORT(x.map((v) => [v]), y.map((v) => [v]), undefined, undefined, undefined, 'Training hours', 'Sales per head'))).toMatch(/Sales per head tends to rise as Training hours rises/);
});
