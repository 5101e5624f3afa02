/**
 * Durbin-Watson against R 4.2.2 lmtest 0.9.40 dwtest (statistic; p exact by Pan's procedure for n < 100, normal
 * approximation with exact moments otherwise) and an independent evaluation of Imhof's formula in R with eigen()
 * and integrate() (checks-r.json, checks-r.R). Building blocks checked against closed forms.
 */
import { durbinWatson } from '../../../../src/stats/checks/durbin-watson';
import { quadraticFormTails } from '../../../../src/stats/checks/imhof';
import { integrate } from '../../../../src/stats/internal/quadrature';
import { symmetricEigenvalues } from '../../../../src/stats/internal/symmetric-eigenvalues';
import { fitLine } from '../../../../src/stats/correlation/regression';
import { expectRel } from '../../../helpers/close';
import { R, RChecks } from './fixtures';
import { simulate } from './simulated-data';

function check(x: ArrayLike<number>, y: ArrayLike<number>, ref: RChecks): void {
  const r = durbinWatson(x, fitLine(x, y).residuals);
  expectRel(r.statistic, ref.dw.statistic, 1e-10, 'DW');
  if (ref.n < 100) {
    expect(r.method).toMatch(/exact/);
    // Imhof in R (QUADPACK, LAPACK): agreement to the integration tolerance.
    expectRel(r.pPositive, ref.dw.imhof_below!, 1e-9, 'P(DW <= d), R Imhof');
    expectRel(r.pNegative, ref.dw.imhof_above!, 1e-9, 'P(DW >= d), R Imhof');
    // lmtest's pan with 15 iterations is accurate to about 1e-5 where it succeeds.
    if (ref.dw.exact) {
      expect(Math.abs(r.pPositive - ref.dw.p_greater)).toBeLessThan(1e-4);
      expect(Math.abs(r.pValue - ref.dw.p_two_sided)).toBeLessThan(1e-4);
      expect(Math.abs(r.pNegative - ref.dw.p_less)).toBeLessThan(1e-4);
    }
  } else {
    expect(r.method).toMatch(/normal approximation/);
    expectRel(r.pPositive, ref.dw.p_greater, 1e-9, 'greater');
    expectRel(r.pNegative, ref.dw.p_less, 1e-9, 'less');
    if (ref.dw.p_two_sided > 0) expectRel(r.pValue, ref.dw.p_two_sided, 1e-9, 'two-sided');
  }
}

describe('Durbin-Watson', () => {
  test.each([1, 2, 3, 4])('Anscombe set %d (exact; lmtest dwtest agrees to 1e-12 here)', (k) => {
    const s = R.anscombe[k - 1];
    check(s.x, s.y, s);
    const r = durbinWatson(s.x, fitLine(s.x, s.y).residuals);
    expectRel(r.pPositive, s.dw.p_greater, 1e-9, 'pan');
  });

  test.each(R.simulated.map((s) => [s.kind, s.n, s] as const))('simulated %s, n = %d', (kind, n, s) => {
    const { x, y } = simulate(kind, n);
    check(x, y, s);
  });

  test('the plain sample of 99, where lmtest pan leaves [0, 1] and dwtest falls back to the approximation', () => {
    const s = R.simulated.find((c) => c.kind === 'plain' && c.n === 99)!;
    expect(s.dw.exact).toBe(false);
    const { x, y } = simulate('plain', 99);
    expectRel(durbinWatson(x, fitLine(x, y).residuals).pPositive, s.dw.imhof_below!, 1e-9);
  });

  test('AR(1) rows (rho = 0.6) are found: n = 99 exact, n = 100 approximate', () => {
    for (const n of [99, 100]) {
      const { x, y } = simulate('ar1', n);
      expect(durbinWatson(x, fitLine(x, y).residuals).pPositive).toBeLessThan(1e-5);
    }
  });

  test('not testable: fewer than 4 points, residuals all zero', () => {
    expect(() => durbinWatson([1, 2, 3], [0.1, -0.2, 0.1])).toThrow(/at least 4/);
    expect(() => durbinWatson([1, 2, 3, 4], [0, 0, 0, 0])).toThrow(/exactly on a line/);
  });
});

describe('building blocks', () => {
  test('eigenvalues of the first-difference matrix A are 2 - 2 cos(pi j / n) (Durbin & Watson 1950, sec. 4)', () => {
    const n = 12;
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      a[i * n + i] = i === 0 || i === n - 1 ? 1 : 2;
      if (i + 1 < n) a[i * n + i + 1] = a[(i + 1) * n + i] = -1;
    }
    const ev = symmetricEigenvalues(a, n);
    for (let j = 0; j < n; j++) {
      const expected = 2 - 2 * Math.cos((Math.PI * (n - 1 - j)) / n);
      expect(Math.abs(ev[j] - expected)).toBeLessThan(1e-13);
    }
  });

  test('Imhof: z1^2 - a z2^2 < 0 has probability (2/pi) atan(sqrt(a)) (the ratio of two normals is Cauchy)', () => {
    for (const a of [0.1, 1, 3, 50]) {
      const t = quadraticFormTails([1, -a]);
      expectRel(t.below, (2 / Math.PI) * Math.atan(Math.sqrt(a)), 1e-10, `a = ${a}`);
      expectRel(t.below + t.above, 1, 1e-12);
    }
  });

  test('Imhof: P(chi2(4) < chi2(2)) = P(Beta(2, 1) < 1/2) = 0.25 (weights 1, 1, 1, 1, -1, -1)', () => {
    const t = quadraticFormTails([1, 1, 1, 1, -1, -1]);
    expectRel(t.below, 0.25, 1e-10);
  });

  test('Gauss-Kronrod integration', () => {
    expectRel(integrate((t) => Math.exp(-t), 0, 30, { absTol: 1e-13, relTol: 0 }), 1 - Math.exp(-30), 1e-13);
    expectRel(integrate((t) => 1 / Math.sqrt(t), 0, 1, { absTol: 1e-10, relTol: 0, maxPieces: 2000 }), 2, 1e-8);
  });
});
