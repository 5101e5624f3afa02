/**
 * The least-squares line's fitted values and residuals against R's lm(y ~ x), fitted() and resid() (fixture and
 * script: test/fixtures/regression/residuals-r.json and residuals-r.R; R version recorded in the fixture).
 * Cases, all invented data: a kiln log (one decimal), the same with gaps, 60 rows on a falling line (two
 * decimals), a constant y, x near 1e9 typed to the cent, and x near 1e12 with y near 2.5e6, both typed to the
 * cent. The offset cases are held to R's fit of the typed decimals without their offset (residuals-r.R says
 * why: at 1e12, lm on the raw x finds x collinear with the intercept and drops it).
 * Tolerance 1e-9 relative: fitted values against their own size, residuals against the largest residual.
 */
import { lineResiduals } from '../../../../src/stats/correlation/residuals';
import { StatsInputError } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import { pairsWithoutBlanks } from '../../../helpers/pairs';
import { R_RESIDUALS, referenceOf, residualCase, ResidualCase, worstDifferences } from './residuals-fixture';

/** The complete pairs of a case, as the cell layer hands them to the core. */
function pairsOf(c: ResidualCase): { x: number[]; y: number[] } {
  return pairsWithoutBlanks(c.x, c.y);
}

describe(`lineResiduals agrees with R lm(y ~ x) (${R_RESIDUALS.R})`, () => {
  test.each(R_RESIDUALS.cases.map((c) => [c.name, c] as const))('%s: fitted values and residuals within 1e-9', (_name, c) => {
    const { x, y } = pairsOf(c);
    const fit = lineResiduals(x, y);
    const ref = referenceOf(c); // source: R, the call recorded in ref.call
    expect(fit.n).toBe(c.positions.length);
    const worst = worstDifferences(fit.fitted, fit.residuals, ref);
    expect(worst.fitted).toBeLessThanOrEqual(1e-9);
    expect(worst.residuals).toBeLessThanOrEqual(1e-9);
  });

  test('slope and intercept: R coef(lm(y ~ x)), and the centred slope where x carries an offset', () => {
    for (const c of R_RESIDUALS.cases) {
      const { x, y } = pairsOf(c);
      const fit = lineResiduals(x, y);
      const slope = c.centred_slope ?? c.coefficients[1]!; // source: R coef(), see residuals-r.R
      if (slope === 0) expect(fit.slope).toBe(0);
      else expectRel(fit.slope, slope, 1e-9, `${c.name} slope`);
      // The intercept (y at x = 0) is held only without an offset: at x near 1e9 R's own is uncertain (see the script).
      if (c.offset === undefined) expectRel(fit.intercept, c.coefficients[0], 1e-9, `${c.name} intercept`);
    }
  });

  test('the residuals sum to zero and are orthogonal to x (the normal equations), on the falling line', () => {
    const { x, y } = pairsOf(residualCase('falling-60'));
    const fit = lineResiduals(x, y);
    const n = x.length;
    const scale = Math.max(...Array.from(fit.residuals, Math.abs));
    const mean = x.reduce((s, v) => s + v, 0) / n;
    const spread = Math.max(...x.map((v) => Math.abs(v - mean)));
    let sum = 0;
    let cross = 0;
    fit.residuals.forEach((e, i) => {
      sum += e;
      cross += e * (x[i] - mean);
    });
    expect(Math.abs(sum)).toBeLessThan(1e-12 * n * scale);
    expect(Math.abs(cross)).toBeLessThan(1e-12 * n * scale * spread);
  });

  test('a constant y: fitted values are its mean and every residual is 0 (R gives the same)', () => {
    const c = residualCase('constant-y');
    const fit = lineResiduals(pairsOf(c).x, pairsOf(c).y);
    expect(Array.from(fit.residuals)).toEqual(c.residuals); // source: R resid(lm(y ~ x))
    expect(Array.from(fit.fitted)).toEqual(c.fitted); // source: R fitted(lm(y ~ x))
  });
});

describe('magnitudes from 1e-300 to 1e300 (power-of-two scaling is exact, so R scaled the same way is the reference)', () => {
  // Residuals of (x * 2^a, y * 2^b) are 2^b times those of (x, y); fitted values likewise. The scaled columns are
  // no longer decimals, so this also runs the binary centring.
  const c = residualCase('kiln');
  test.each([
    [-990, 990],
    [990, -990],
    [-990, -990],
    [0, 996],
  ])('x * 2^%d, y * 2^%d: finite, and R lm(y ~ x) residuals scaled, within 1e-9', (a, b) => {
    const { x, y } = pairsOf(c);
    const fit = lineResiduals(x.map((v) => v * 2 ** a), y.map((v) => v * 2 ** b));
    expect([...fit.fitted, ...fit.residuals].filter((v) => !Number.isFinite(v))).toEqual([]);
    const ref = { fitted: c.fitted.map((v) => v * 2 ** b), residuals: c.residuals.map((v) => v * 2 ** b) }; // source: R, kiln case
    const worst = worstDifferences(fit.fitted, fit.residuals, ref);
    expect(worst.fitted).toBeLessThanOrEqual(1e-9);
    expect(worst.residuals).toBeLessThanOrEqual(1e-9);
  });
});

describe('refusals', () => {
  const codeOf = (f: () => unknown): string => {
    try {
      f();
    } catch (e) {
      if (e instanceof StatsInputError) return `${e.code}: ${e.message}`;
      throw e;
    }
    return 'no error';
  };
  test('fewer than 3 pairs', () => {
    expect(codeOf(() => lineResiduals([1, 2], [3, 4]))).toBe('too-few: only 2 usable pairs of numbers: residuals of a straight line need at least 3');
  });
  test('a constant x', () => {
    expect(codeOf(() => lineResiduals([7, 7, 7, 7], [1, 2, 3, 4]))).toBe('constant: x is constant: a straight line through the points needs x to vary');
    expect(codeOf(() => lineResiduals([1e9 + 0.25, 1e9 + 0.25, 1e9 + 0.25], [1, 2, 3]))).toMatch(/^constant:/);
  });
  test('unequal lengths', () => {
    expect(codeOf(() => lineResiduals([1, 2, 3], [1, 2]))).toMatch(/^unequal-length:/);
  });
});
