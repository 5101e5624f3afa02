/**
 * Polyserial correlation (Olsson, Drasgow & Dorans 1982) against R 4.2.2 with polycor 0.8.1, on invented data
 * (test/fixtures/ordinal/polycor-r.json, made by polycor-r.R beside it; calls and versions recorded there):
 * - "tight": polycor's own likelihood (x standardised by scale(), divisor n − 1) maximised again with tight
 *   settings; rho and thresholds held to 1e-9, standard errors to 1e-7 relative;
 * - "polycor": polyserial() as it stands (BFGS and Nelder-Mead on finite differences), held at that looseness.
 */
import { ordinalInterval } from '../../../../src/stats/ordinal/fit';
import { polyserial } from '../../../../src/stats/ordinal/polyserial';
import { StatsInputError } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import fixture from '../../../fixtures/ordinal/polycor-r.json';

interface TightFit {
  rho: number;
  se: number;
  thresholdsY: number[];
  logLik: number;
  lrStatistic: number;
  pValue: number;
  ci95: number[];
}
interface PolyserialCase {
  name: string;
  x: number[];
  y: number[];
  n: number;
  categoriesY: number[];
  polycor: { twostep: { rho: number; se: number; thresholdsY: number[] }; adhoc: { rho: number }; ml: { rho: number; se: number } };
  tight: { twostep: TightFit; ml: TightFit; null: { logLik: number; logLikRefitted: number; maxThresholdShift: number } };
}

const cases = fixture.polyserial as unknown as PolyserialCase[];

function expectAllClose(actual: number[], expected: number[], abs: number, label: string): void {
  expect(actual).toHaveLength(expected.length);
  expected.forEach((e, i) => {
    const err = Math.abs(actual[i] - e);
    if (!(err <= abs)) throw new Error(`${label}[${i}]: expected ${e}, got ${actual[i]} (|error| ${err.toExponential(2)} > ${abs})`);
  });
}

describe.each(cases.map((c) => [c.name, c] as [string, PolyserialCase]))('R polycor-r.json, tight re-maximisation: %s', (_name, c) => {
  test.each([
    ['two-step', 'twostep'],
    ['ml', 'ml'],
  ] as const)('%s: rho, se, thresholds, logLik, G^2 and p as the tight R fit', (estimator, key) => {
    const fit = polyserial(c.x, c.y, { estimator });
    const t = c.tight[key];
    expect(fit).toMatchObject({ estimator, n: c.n, converged: true, categoriesY: c.categoriesY });
    expect(fit.note).toBeUndefined();
    expect(fit.thresholdsX).toBeUndefined();
    expect(Math.abs(fit.rho - t.rho)).toBeLessThan(1e-9);
    expectRel(fit.se, t.se, 1e-7, 'se');
    expectAllClose(fit.thresholdsY, t.thresholdsY, 1e-9, 'thresholds');
    // polycor's objective: −Σ log(dnorm(z) (pnorm(τ_hi*) − pnorm(τ_lo*))).
    expectRel(fit.logLik, t.logLik, 1e-12, 'logLik');
    expect(Math.abs(fit.lrStatistic - t.lrStatistic)).toBeLessThan(1e-8);
    expectRel(fit.pValue, t.pValue, 1e-8, 'p (pchisq, 1 df)');
    expectRel(fit.signedZ, Math.sign(t.rho) * Math.sqrt(t.lrStatistic), 1e-9, 'signed root');
    const ci = ordinalInterval(fit.rho, fit.se, 0.95);
    expect(Math.abs(ci.lower - t.ci95[0])).toBeLessThan(1e-7);
    expect(Math.abs(ci.upper - t.ci95[1])).toBeLessThan(1e-7);
  });

  test('the null likelihood: thresholds re-fitted under rho = 0 are the marginal ones (R optim refit)', () => {
    expect(c.tight.null.maxThresholdShift).toBeLessThan(1e-6);
    const fit = polyserial(c.x, c.y, { estimator: 'ml' });
    expectRel(fit.logLik - fit.lrStatistic / 2, c.tight.null.logLikRefitted, 1e-12, 'null logLik');
  });
});

describe.each(cases.map((c) => [c.name, c] as [string, PolyserialCase]))("R polycor's own output (loose optimisers): %s", (_name, c) => {
  test('two-step: polyserial(std.err = TRUE), BFGS from the ad hoc start', () => {
    const fit = polyserial(c.x, c.y);
    expect(Math.abs(fit.rho - c.polycor.twostep.rho)).toBeLessThan(1e-4);
    expectRel(fit.se, c.polycor.twostep.se, 1e-3, 'se');
    expectAllClose(fit.thresholdsY, c.polycor.twostep.thresholdsY, 1e-12, 'thresholds');
  });
  test('ML: polyserial(ML = TRUE, std.err = TRUE), Nelder-Mead', () => {
    const fit = polyserial(c.x, c.y, { estimator: 'ml' });
    expect(Math.abs(fit.rho - c.polycor.ml.rho)).toBeLessThan(5e-3);
    expectRel(fit.se, c.polycor.ml.se, 1e-2, 'se');
  });
});

describe('properties (Olsson, Drasgow & Dorans 1982: rho is that of the standardised x)', () => {
  const c = cases.find((k) => k.name === 'seven_cat_n300')!;

  test.each(['two-step', 'ml'] as const)('%s: a positive linear change of x leaves the fit as it is; a negative one flips rho', (estimator) => {
    const a = polyserial(c.x, c.y, { estimator });
    const scaled = polyserial(c.x.map((v) => 1000 + 0.01 * v), c.y, { estimator });
    expect(Math.abs(scaled.rho - a.rho)).toBeLessThan(1e-9);
    expectRel(scaled.se, a.se, 1e-7, 'se');
    const negated = polyserial(c.x.map((v) => -v), c.y, { estimator });
    expect(Math.abs(negated.rho + a.rho)).toBeLessThan(1e-12);
    expectRel(negated.se, a.se, 1e-9, 'se');
  });

  test.each(['two-step', 'ml'] as const)('%s: reversing the order of y\'s categories flips the sign', (estimator) => {
    const a = polyserial(c.x, c.y, { estimator });
    const b = polyserial(c.x, c.y.map((v) => -v), { estimator });
    expect(Math.abs(b.rho + a.rho)).toBeLessThan(1e-12);
    expectRel(b.lrStatistic, a.lrStatistic, 1e-10, 'G^2');
    expectAllClose(b.thresholdsY.map((t) => -t).reverse(), a.thresholdsY, 1e-12, 'thresholds');
  });

  test('y cut from x itself: ML at the bound 0.9999 with a note; two-step inside it', () => {
    const x = Array.from({ length: 40 }, (_, i) => i / 4);
    const y = x.map((v) => (v < 3 ? 1 : v < 6 ? 2 : 3));
    // ML moves the thresholds to where x splits the categories, and then the likelihood rises all the way to 1.
    const ml = polyserial(x, y, { estimator: 'ml' });
    expect(ml.rho).toBe(0.9999);
    expect(ml.se).toBeNaN();
    expect(ml.note).toMatch(/bound ±0\.9999/);
    // The marginal thresholds (Φ⁻¹(12/40), Φ⁻¹(24/40)) miss those points, so at rho = 1 some rows would have
    // probability 0: the two-step maximum lies inside, with a standard error.
    const two = polyserial(x, y);
    expect(two.thresholdsY).toEqual([expect.closeTo(-0.5244005127080407, 12), expect.closeTo(0.2533471031357998, 12)]);
    expect(two.rho).toBeGreaterThan(0.99);
    expect(two.rho).toBeLessThan(0.9999);
    expect(two.se).toBeGreaterThan(0);
    expect(two.note).toBeUndefined();
  });
});

describe('input errors (messages for a spreadsheet user)', () => {
  test('y with more than 10 categories, y constant, x constant', () => {
    const x = Array.from({ length: 12 }, (_, i) => i * 0.37);
    expect(() => polyserial(x, x)).toThrow(
      new StatsInputError('bad-option', 'polyserial needs ordered categories: y has 12 distinct values, at most 10 are allowed'),
    );
    expect(() => polyserial(x, x.map(() => 4))).toThrow(expect.objectContaining({ code: 'constant' }));
    expect(() => polyserial(x.map(() => 2.5), x.map((_, i) => i % 3))).toThrow(
      new StatsInputError('constant', 'polyserial needs x to vary: every value of x is the same'),
    );
  });
  test('too few rows, unequal lengths, non-numbers', () => {
    expect(() => polyserial([1, 2], [0, 1])).toThrow(expect.objectContaining({ code: 'too-few' }));
    expect(() => polyserial([1, 2, 3], [0, 1])).toThrow(expect.objectContaining({ code: 'unequal-length' }));
    expect(() => polyserial([1, Infinity, 3, 4], [0, 1, 0, 1])).toThrow(
      new StatsInputError('bad-option', 'polyserial needs a number in every row: x has Infinity in row 2'),
    );
  });
});
