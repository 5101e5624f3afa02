/** Koenker's studentized Breusch-Pagan test against R 4.2.2 lmtest::bptest(m, studentize = TRUE) (checks-r.json). */
import { breuschPagan } from '../../../../src/stats/checks/breusch-pagan';
import { fitLine } from '../../../../src/stats/correlation/regression';
import { expectRel } from '../../../helpers/close';
import { R, RChecks } from './fixtures';
import { simulate } from './simulated-data';

function check(x: ArrayLike<number>, y: ArrayLike<number>, ref: RChecks): void {
  const t = breuschPagan(x, fitLine(x, y).residuals);
  expectRel(t.statistic, ref.bp.statistic, 1e-8, 'n R^2');
  expectRel(t.pValue, ref.bp.p, 1e-6, 'p');
}

describe('Breusch-Pagan (Koenker)', () => {
  test.each([1, 3, 4])('Anscombe set %d', (k) => {
    const s = R.anscombe[k - 1];
    check(s.x, s.y, s);
  });

  test('Anscombe set 2: the squared residuals are symmetric in x, so n R^2 is zero to rounding (R: 8e-31, p = 1)', () => {
    const s = R.anscombe[1];
    const t = breuschPagan(s.x, fitLine(s.x, s.y).residuals);
    expect(t.statistic).toBeLessThan(1e-20);
    expect(s.bp.statistic).toBeLessThan(1e-20);
    expectRel(t.pValue, s.bp.p, 1e-9);
  });

  test.each(R.simulated.map((s) => [s.kind, s.n, s] as const))('simulated %s, n = %d', (kind, n, s) => {
    const { x, y } = simulate(kind, n);
    check(x, y, s);
  });

  test('the spread that grows with x is found and named', () => {
    const s = R.simulated.find((c) => c.kind === 'widening' && c.n === 400)!;
    const { x, y } = simulate('widening', 400);
    const t = breuschPagan(x, fitLine(x, y).residuals);
    expect(s.bp.p).toBeLessThan(1e-6);
    expect(t.trend).toBe('widens');
  });

  test('not testable: residuals of equal size, fewer than 4 points', () => {
    expect(() => breuschPagan([1, 2, 3, 4], [1, -1, -1, 1])).toThrow(/same size/);
    expect(() => breuschPagan([1, 2, 3], [1, -2, 1])).toThrow(/at least 4/);
  });
});
