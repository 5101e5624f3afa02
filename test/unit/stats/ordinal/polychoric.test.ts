/**
 * Polychoric correlation (Olsson 1979) against R 4.2.2 with polycor 0.8.1 and mvtnorm 1.1.3, on invented data
 * (test/fixtures/ordinal/polycor-r.json, made by polycor-r.R beside it; calls and versions recorded there):
 * - "tight": polycor's own likelihood maximised again with tight settings and Richardson-extrapolated
 *   derivatives; rho, thresholds and standard errors are held to 1e-9 (rho, thresholds) and 1e-7 (se, relative);
 * - "polycor": polychor() as it stands, whose optimisers stop early (optimise's default tol, BFGS and
 *   Nelder-Mead on finite differences): held only at that looseness, 1e-4 on the two-step rho and 5e-3 on ML.
 */
import { ordinalInterval } from '../../../../src/stats/ordinal/fit';
import { polychoric } from '../../../../src/stats/ordinal/polychoric';
import { StatsInputError } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import fixture from '../../../fixtures/ordinal/polycor-r.json';

interface TightFit {
  rho: number;
  se: number;
  thresholdsX: number[];
  thresholdsY: number[];
  logLik: number;
  lrStatistic: number;
  pValue: number;
  ci95: number[];
}
interface PolychoricCase {
  name: string;
  x: number[];
  y: number[];
  n: number;
  categoriesX: number[];
  categoriesY: number[];
  polycor: {
    twostep: { rho: number; se: number; thresholdsX: number[]; thresholdsY: number[] };
    twostep_optimise: { rho: number };
    ml: { rho: number; se: number };
  };
  tight: { twostep: TightFit; ml: TightFit; null: { logLik: number; logLikRefitted: number; maxThresholdShift: number } };
}
interface BoundaryCase {
  name: string;
  x: number[];
  y: number[];
  polycor: { twostep: { rho: number | string }; twostep_optimise: { rho: number } };
  atBound: { rho: number; logLik: number; logLikNull: number; slopeAtBound: number };
}

const cases = fixture.polychoric as unknown as PolychoricCase[];
const boundary = fixture.boundary as unknown as BoundaryCase[];

function expectAllClose(actual: number[] | undefined, expected: number[], abs: number, label: string): void {
  expect(actual).toHaveLength(expected.length);
  expected.forEach((e, i) => {
    const err = Math.abs(actual![i] - e);
    if (!(err <= abs)) throw new Error(`${label}[${i}]: expected ${e}, got ${actual![i]} (|error| ${err.toExponential(2)} > ${abs})`);
  });
}

describe.each(cases.map((c) => [c.name, c] as [string, PolychoricCase]))('R polycor-r.json, tight re-maximisation: %s', (_name, c) => {
  test.each([
    ['two-step', 'twostep'],
    ['ml', 'ml'],
  ] as const)('%s: rho, se, thresholds, logLik, G^2 and p as the tight R fit', (estimator, key) => {
    const fit = polychoric(c.x, c.y, { estimator });
    const t = c.tight[key];
    expect(fit).toMatchObject({ estimator, n: c.n, converged: true });
    expect(fit.note).toBeUndefined();
    expect(Math.abs(fit.rho - t.rho)).toBeLessThan(1e-9);
    expectRel(fit.se, t.se, 1e-7, 'se');
    expectAllClose(fit.thresholdsX, t.thresholdsX, 1e-9, 'thresholds x');
    expectAllClose(fit.thresholdsY, t.thresholdsY, 1e-9, 'thresholds y');
    expectRel(fit.logLik, t.logLik, 1e-12, 'logLik');
    expect(Math.abs(fit.lrStatistic - t.lrStatistic)).toBeLessThan(1e-8);
    expectRel(fit.pValue, t.pValue, 1e-8, 'p (pchisq, 1 df)');
    expectRel(fit.signedZ, Math.sign(t.rho) * Math.sqrt(t.lrStatistic), 1e-9, 'signed root');
    const ci = ordinalInterval(fit.rho, fit.se, 0.95);
    expect(Math.abs(ci.lower - t.ci95[0])).toBeLessThan(1e-7);
    expect(Math.abs(ci.upper - t.ci95[1])).toBeLessThan(1e-7);
  });

  test('categories are the distinct values, ascending (R table() dimnames)', () => {
    const fit = polychoric(c.x, c.y);
    expect(fit.categoriesX).toEqual(c.categoriesX);
    expect(fit.categoriesY).toEqual(c.categoriesY);
  });

  test('the null likelihood: thresholds re-fitted under rho = 0 are the marginal ones (R optim refit)', () => {
    // G² of either estimator uses the same null log-likelihood; R's refit of the thresholds under rho = 0 gives it.
    expect(c.tight.null.maxThresholdShift).toBeLessThan(1e-6);
    const fit = polychoric(c.x, c.y, { estimator: 'ml' });
    expectRel(fit.logLik - fit.lrStatistic / 2, c.tight.null.logLikRefitted, 1e-12, 'null logLik');
  });
});

describe.each(cases.map((c) => [c.name, c] as [string, PolychoricCase]))("R polycor's own output (loose optimisers): %s", (_name, c) => {
  test('two-step: polychor(std.err = TRUE) and polychor() within their optimisers\' reach', () => {
    const fit = polychoric(c.x, c.y);
    expect(Math.abs(fit.rho - c.polycor.twostep.rho)).toBeLessThan(1e-4);
    expect(Math.abs(fit.rho - c.polycor.twostep_optimise.rho)).toBeLessThan(1e-4);
    expectRel(fit.se, c.polycor.twostep.se, 1e-3, 'se');
    expectAllClose(fit.thresholdsX, c.polycor.twostep.thresholdsX, 1e-12, 'thresholds x');
    expectAllClose(fit.thresholdsY, c.polycor.twostep.thresholdsY, 1e-12, 'thresholds y');
  });
  test('ML: polychor(ML = TRUE, std.err = TRUE), Nelder-Mead', () => {
    const fit = polychoric(c.x, c.y, { estimator: 'ml' });
    expect(Math.abs(fit.rho - c.polycor.ml.rho)).toBeLessThan(5e-3);
    expectRel(fit.se, c.polycor.ml.se, 1e-2, 'se');
  });
});

describe('perfect association: rho at the bound 0.9999 with a note, no standard error (R polycor-r.json, boundary)', () => {
  test.each(boundary.map((b) => [b.name, b] as [string, BoundaryCase]))('%s', (_name, b) => {
    for (const estimator of ['two-step', 'ml'] as const) {
      const fit = polychoric(b.x, b.y, { estimator });
      expect(fit.rho).toBe(0.9999);
      expect(fit.se).toBeNaN();
      expect(fit.note).toMatch(/bound ±0\.9999/);
      expect(fit).toMatchObject({ estimator, converged: true });
      const ci = ordinalInterval(fit.rho, fit.se, 0.95);
      expect(ci.lower).toBeNaN();
      expect(ci.note).toMatch(/no standard error/);
      // The likelihood there and at rho = 0 (R: polycor's objective over the used cells, marginal thresholds).
      if (estimator === 'two-step') {
        expectRel(fit.logLik, b.atBound.logLik, 1e-10, 'logLik at the bound');
        expectRel(fit.lrStatistic, 2 * (b.atBound.logLik - b.atBound.logLikNull), 1e-10, 'G^2');
      } else {
        // Re-fitted thresholds can only raise the likelihood at the bound.
        expect(fit.logLik).toBeGreaterThanOrEqual(b.atBound.logLik - 1e-9);
      }
    }
    // polycor: optimise() ends short of the bound on the flat likelihood; polychor(std.err = TRUE) stops with an
    // error (recorded as its message). Both lie above 0.99.
    expect(b.polycor.twostep_optimise.rho).toBeGreaterThan(0.99);
  });

  test('reversed categories: the bound at -0.9999', () => {
    const b = boundary[0];
    const fit = polychoric(b.x, b.y.map((v) => -v));
    expect(fit.rho).toBe(-0.9999);
    expect(fit.signedZ).toBeLessThan(0);
    expect(fit.se).toBeNaN();
  });
});

describe('properties (Olsson 1979: the model is symmetric in x and y and in the direction of each scale)', () => {
  const c = cases.find((k) => k.name === 'likert5_n200')!;
  const u = cases.find((k) => k.name === 'uneven_codes')!;

  test.each(['two-step', 'ml'] as const)('%s: swapping x and y gives the same rho, se and G^2', (estimator) => {
    for (const k of [c, u]) {
      const a = polychoric(k.x, k.y, { estimator });
      const b = polychoric(k.y, k.x, { estimator });
      expect(Math.abs(a.rho - b.rho)).toBeLessThan(1e-12);
      expectRel(b.se, a.se, 1e-9, 'se');
      expectAllClose(b.thresholdsX, a.thresholdsY, 1e-12, 'thresholds');
      expectRel(b.lrStatistic, a.lrStatistic, 1e-10, 'G^2');
    }
  });

  test.each(['two-step', 'ml'] as const)('%s: reversing one column\'s order flips the sign; reversing both keeps rho', (estimator) => {
    const a = polychoric(u.x, u.y, { estimator });
    const flipped = polychoric(u.x, u.y.map((v) => 10 - v), { estimator });
    expect(Math.abs(flipped.rho + a.rho)).toBeLessThan(1e-12);
    expectRel(flipped.se, a.se, 1e-9, 'se');
    expect(flipped.signedZ).toBeCloseTo(-a.signedZ, 9);
    expect(flipped.thresholdsY.map((t) => -t).reverse()).toEqual(a.thresholdsY.map((t) => expect.closeTo(t, 12)));
    const both = polychoric(u.x.map((v) => -v), u.y.map((v) => -v), { estimator });
    expect(Math.abs(both.rho - a.rho)).toBeLessThan(1e-12);
  });

  test('relabelling categories by any increasing map changes nothing (only their order counts)', () => {
    const a = polychoric(c.x, c.y);
    const b = polychoric(c.x.map((v) => v * v * 7 - 3), c.y.map((v) => Math.log(v)));
    expect(b.rho).toBe(a.rho);
    expect(b.se).toBe(a.se);
  });

  test('a 3 x 4 table of equal counts (independence exactly) gives rho = 0, G^2 = 0, p = 1', () => {
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 1; i <= 3; i++) for (let j = 1; j <= 4; j++) for (let k = 0; k < 5; k++) {
      x.push(i);
      y.push(j);
    }
    const fit = polychoric(x, y, { estimator: 'ml' });
    expect(Math.abs(fit.rho)).toBeLessThan(1e-12);
    expect(fit.lrStatistic).toBeLessThan(1e-10);
    expect(fit.pValue).toBeCloseTo(1, 5);
  });
});

describe('input errors (messages for a spreadsheet user)', () => {
  const twelve = Array.from({ length: 14 }, (_, i) => i + 1);
  test('more than 10 distinct values: bad-option, with the count', () => {
    expect(() => polychoric(twelve, twelve.map((v) => v % 3))).toThrow(
      new StatsInputError('bad-option', 'polychoric needs ordered categories: x has 14 distinct values, at most 10 are allowed'),
    );
    try {
      polychoric([1, 2, 1, 2, 1, 2, 1, 2, 1, 2, 1, 2, 1, 2], twelve);
    } catch (e) {
      expect((e as StatsInputError).code).toBe('bad-option');
      expect((e as StatsInputError).message).toBe('polychoric needs ordered categories: y has 14 distinct values, at most 10 are allowed');
    }
    expect.assertions(3);
  });
  test('a column with one value: constant', () => {
    expect(() => polychoric([3, 3, 3, 3], [1, 2, 1, 2])).toThrow(
      new StatsInputError('constant', 'polychoric needs at least 2 categories: every value of x is 3'),
    );
  });
  test('unequal lengths, blanks, an unknown estimator', () => {
    expect(() => polychoric([1, 2, 3], [1, 2])).toThrow(expect.objectContaining({ code: 'unequal-length' }));
    expect(() => polychoric([1, 2, NaN, 1], [1, 2, 1, 2])).toThrow(
      new StatsInputError('bad-option', 'polychoric needs a number in every row: x has NaN in row 3'),
    );
    expect(() => polychoric([1, 2, 1, 2], [1, 2, 2, 1], { estimator: 'exact' as never })).toThrow(
      expect.objectContaining({ code: 'bad-option' }),
    );
  });
});
