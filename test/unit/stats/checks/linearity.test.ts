/**
 * The F test for adding x^2 against R 4.2.2: anova(lm(y ~ x), lm(y ~ x + I(x^2))) and
 * lmtest::resettest(m, power = 2, type = "fitted") (fixture checks-r.json, script checks-r.R).
 */
import { curvatureTest } from '../../../../src/stats/checks/linearity';
import { fitLine } from '../../../../src/stats/correlation/regression';
import { expectRel } from '../../../helpers/close';
import { R, RChecks } from './fixtures';
import { simulate } from './simulated-data';

function check(x: ArrayLike<number>, y: ArrayLike<number>, ref: RChecks): void {
  const t = curvatureTest(x, fitLine(x, y).residuals);
  const c = ref.curvature!;
  expectRel(t.statistic, c.F, 1e-8, 'F (anova)');
  expectRel(t.statistic, c.reset_F, 1e-8, 'F (RESET)');
  expectRel(t.pValue, c.p, 1e-6, 'p');
  expect(t.df2).toBe(ref.n - 3);
}

describe('curvature F test', () => {
  test.each([1, 2, 3])('Anscombe set %d', (k) => {
    const s = R.anscombe[k - 1];
    check(s.x, s.y, s);
  });

  test.each(R.simulated.filter((s) => s.curvature).map((s) => [s.kind, s.n, s] as const))('simulated %s, n = %d', (kind, n, s) => {
    const { x, y } = simulate(kind, n);
    check(x, y, s);
  });

  test('Anscombe set 2 bends downward; a U shape bends upward', () => {
    const s = R.anscombe[1];
    expect(curvatureTest(s.x, fitLine(s.x, s.y).residuals).bend).toBe('down');
    const x = [-3, -2, -1, 0, 1, 2, 3, 4];
    const y = x.map((v, i) => v * v + (i % 2 ? 0.1 : -0.1));
    expect(curvatureTest(x, fitLine(x, y).residuals).bend).toBe('up');
  });

  test('same F with a large offset in x (the quadratic is nearly collinear there)', () => {
    const s = R.anscombe[0];
    const t = curvatureTest(s.x.map((v) => v + 1e6), fitLine(s.x.map((v) => v + 1e6), s.y).residuals);
    expectRel(t.statistic, s.curvature!.F, 1e-6);
  });

  test('not testable: two-valued x (Anscombe set 4), fewer than 4 points', () => {
    const s = R.anscombe[3];
    expect(() => curvatureTest(s.x, fitLine(s.x, s.y).residuals)).toThrow('x takes only two values, so curvature cannot be tested');
    expect(() => curvatureTest([1, 2, 3], [0.1, -0.2, 0.1])).toThrow(/at least 4/);
  });

  test('an exact parabola gives an infinite F and p = 0', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const y = x.map((v) => v * v);
    const t = curvatureTest(x, fitLine(x, y).residuals);
    expect(t.statistic).toBe(Infinity);
    expect(t.pValue).toBe(0);
  });
});
