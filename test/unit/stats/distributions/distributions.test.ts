/**
 * Distributions and special functions of the statistics core, held against references outside the project:
 * - test/fixtures/distributions/distributions.json, made by make-fixture.py next to it with mpmath 1.2.1
 *   (50 digits), scipy 1.10.1 and R 4.2.2 (exact calls and versions recorded in the file);
 * - published values: the R and SciPy documentation and test suites (as collected in test/references.md)
 *   and printed statistical tables.
 */
import { readFileSync } from 'fs';
import { join } from 'path';
import * as distributions from '../../../../src/stats/distributions';

type Fn = (...args: number[]) => number;
const functions = distributions as unknown as Record<string, Fn>;

interface ReferenceValue {
  value: number | string;
  trusted: boolean;
  expr?: string;
}
interface FixtureCase {
  fn: string;
  args: number[];
  mpmath?: number | string;
  scipy?: ReferenceValue;
  R?: ReferenceValue;
}
interface Fixture {
  versions: Record<string, string>;
  calls: Record<string, Record<string, string>>;
  cases: FixtureCase[];
}

const fixture: Fixture = JSON.parse(
  readFileSync(join(__dirname, '../../../fixtures/distributions/distributions.json'), 'utf8'),
);

/** Relative error, with an exact zero required where the reference is zero. */
function relativeError(actual: number, expected: number): number {
  if (expected === 0) return actual === 0 ? 0 : Infinity;
  return Math.abs(actual - expected) / Math.abs(expected);
}

/** Tolerance for tails and quantiles against a trustworthy reference (1e-10 relative). */
const TOLERANCE = 1e-10;

describe('distributions against the fixture (mpmath 50 digits; scipy and R where they agree with it)', () => {
  const byFunction = new Map<string, FixtureCase[]>();
  for (const c of fixture.cases) {
    if (!byFunction.has(c.fn)) byFunction.set(c.fn, []);
    byFunction.get(c.fn)!.push(c);
  }

  it('covers every function of the module', () => {
    expect([...byFunction.keys()].sort()).toEqual(
      [
        'chiSquareCdf', 'chiSquareIsf', 'chiSquareQuantile', 'chiSquareSf', 'fCdf', 'fIsf', 'fQuantile', 'fSf',
        'lnBeta', 'lnGamma', 'normalCdf', 'normalIsf', 'normalPdf', 'normalQuantile', 'normalSf',
        'regularizedBeta', 'regularizedBetaComplement', 'regularizedGammaP', 'regularizedGammaQ',
        'studentTCdf', 'studentTIsf', 'studentTQuantile', 'studentTSf',
      ].sort(),
    );
  });

  for (const [name, cases] of byFunction) {
    it(`${name}: relative error ≤ ${TOLERANCE} against ${fixture.calls[name].mpmath ? 'mpmath' : ''}, scipy (${
      fixture.calls[name].scipy ?? '—'
    }), R (${fixture.calls[name].R ?? '—'})`, () => {
      const fn = functions[name];
      const failures: string[] = [];
      let checked = 0;
      for (const c of cases) {
        const actual = fn(...c.args);
        const references: Array<[string, number]> = [];
        if (typeof c.mpmath === 'number') references.push(['mpmath', c.mpmath]);
        for (const source of ['scipy', 'R'] as const) {
          const reference = c[source];
          if (reference && reference.trusted && typeof reference.value === 'number') {
            references.push([source, reference.value]);
          }
        }
        for (const [source, expected] of references) {
          checked++;
          const error = relativeError(actual, expected);
          if (!(error <= TOLERANCE)) {
            failures.push(`${name}(${c.args.join(', ')}) = ${actual}, ${source} ${expected}, rel. error ${error}`);
          }
        }
      }
      expect(checked).toBeGreaterThan(0);
      expect(failures).toEqual([]);
    });
  }
});

describe('published values', () => {
  const {
    normalCdf, normalSf, normalQuantile, studentTSf, studentTCdf, studentTQuantile, fQuantile, chiSquareQuantile,
  } = distributions;

  it('t test p-values printed in the R and SciPy documentation', () => {
    // R ?cor.test example (Hollander & Wolfe data): t = 1.8411, df = 7, p = 0.1082; one-sided 0.05409 [printed].
    expect(2 * studentTSf(1.8411, 7)).toBeCloseTo(0.1082, 4);
    expect(studentTSf(1.8411, 7)).toBeCloseTo(0.05409, 4);
    // SciPy pearsonr docstring: r = −0.828503883588428, n = 7 → p = 0.021280260007523286 [printed].
    const r1 = -0.828503883588428;
    const t1 = r1 * Math.sqrt(5 / (1 - r1 * r1));
    expect(relativeError(2 * studentTCdf(t1, 5), 0.021280260007523286)).toBeLessThan(1e-9);
    // SciPy test suite citing R 3.6.2: r = 0.6741998624632421, n = 4 → p = 0.325800137536 [printed].
    const r2 = 0.6741998624632421;
    const t2 = r2 * Math.sqrt(2 / (1 - r2 * r2));
    expect(2 * studentTSf(t2, 2)).toBeCloseTo(0.325800137536, 11);
    // SciPy test suite, Spearman ρ = 0.82078268166812329, n = 5, t approximation → p = 0.088587005313543798 [printed].
    const r3 = 0.82078268166812329;
    const t3 = r3 * Math.sqrt(3 / (1 - r3 * r3));
    expect(relativeError(2 * studentTSf(t3, 3), 0.088587005313543798)).toBeLessThan(1e-9);
    // psych::r.test, Steiger (1980) case A: Williams t = −0.89128 on n − 3 = 100 df, p = .374919 [printed].
    expect(2 * studentTCdf(-0.89128, 100)).toBeCloseTo(0.374919, 5); // t printed to 5 decimals
  });

  it('normal p-values printed in the SciPy documentation and the cocor test suite', () => {
    // SciPy skewtest docstring: z = 1.0108048609177787 → p = 0.3121098361421897 [source].
    expect(relativeError(2 * normalSf(1.0108048609177787), 0.3121098361421897)).toBeLessThan(1e-12);
    // SciPy kurtosistest docstring: z = −1.7058104152122062 → p = 0.08804338332528348 [source].
    expect(relativeError(2 * normalCdf(-1.7058104152122062), 0.08804338332528348)).toBeLessThan(1e-12);
    // cocor tests, Fisher (1925) z: z = −0.8751012342 → p = 0.3815188256 [source].
    expect(2 * normalCdf(-0.8751012342)).toBeCloseTo(0.3815188256, 10);
    // psych::r.test, Steiger (1980) case B: z = −1.404975 → p = .160029 [source].
    expect(2 * normalCdf(-1.404975)).toBeCloseTo(0.160029, 5);
  });

  it('critical |r| at α = .05 two-tailed (test/references.md, exact from the t quantile) [custom]', () => {
    const critical = (df: number): number => {
      const t = studentTQuantile(0.975, df);
      return t / Math.sqrt(t * t + df);
    };
    expect(critical(8)).toBeCloseTo(0.6319, 5);
    expect(critical(20)).toBeCloseTo(0.42271, 5);
    expect(critical(30)).toBeCloseTo(0.34937, 5);
    expect(critical(100)).toBeCloseTo(0.1946, 5);
  });

  it('printed percentage points of the t, normal, chi-square and F tables [handbook; recalled from memory]', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.96, 3);
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
    expect(studentTQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
    expect(studentTQuantile(0.995, 5)).toBeCloseTo(4.032, 3);
    expect(chiSquareQuantile(0.95, 1)).toBeCloseTo(3.841, 3);
    expect(chiSquareQuantile(0.95, 10)).toBeCloseTo(18.307, 3);
    expect(fQuantile(0.95, 1, 10)).toBeCloseTo(4.96, 2);
    expect(fQuantile(0.95, 2, 20)).toBeCloseTo(3.49, 2);
    expect(fQuantile(0.99, 5, 10)).toBeCloseTo(5.64, 2);
  });
});

describe('edge cases (limits of the definitions; never a throw)', () => {
  const d = distributions;

  it('infinite statistics and infinite df', () => {
    expect(d.studentTSf(Infinity, 5)).toBe(0);
    expect(d.studentTSf(-Infinity, 5)).toBe(1);
    expect(d.studentTCdf(Infinity, 5)).toBe(1);
    expect(d.studentTCdf(-Infinity, 5)).toBe(0);
    expect(d.normalSf(Infinity)).toBe(0);
    expect(d.normalCdf(-Infinity)).toBe(0);
    expect(d.normalCdf(Infinity)).toBe(1);
    // df = Infinity is the normal distribution.
    for (const t of [-3, 0.5, 2, 10]) expect(d.studentTSf(t, Infinity)).toBe(d.normalSf(t));
    expect(d.studentTIsf(1e-10, Infinity)).toBe(d.normalIsf(1e-10));
    expect(d.studentTQuantile(0.975, Infinity)).toBe(d.normalQuantile(0.975));
    // F with d2 = Infinity is χ²(d1)/d1.
    expect(d.fSf(2, 3, Infinity)).toBe(d.chiSquareSf(6, 3));
    expect(d.fSf(Infinity, 3, 7)).toBe(0);
    expect(d.chiSquareSf(Infinity, 3)).toBe(0);
  });

  it('x ≤ 0 for F and chi-square', () => {
    expect(d.fSf(0, 2, 5)).toBe(1);
    expect(d.fCdf(0, 2, 5)).toBe(0);
    expect(d.fSf(-1, 2, 5)).toBe(1);
    expect(d.fCdf(-1, 2, 5)).toBe(0);
    expect(d.chiSquareSf(0, 2)).toBe(1);
    expect(d.chiSquareCdf(-3, 2)).toBe(0);
  });

  it('p = 0 and p = 1 in the quantiles', () => {
    expect(d.normalQuantile(0)).toBe(-Infinity);
    expect(d.normalQuantile(1)).toBe(Infinity);
    expect(d.normalIsf(0)).toBe(Infinity);
    expect(d.normalIsf(1)).toBe(-Infinity);
    expect(d.studentTQuantile(0, 4)).toBe(-Infinity);
    expect(d.studentTQuantile(1, 4)).toBe(Infinity);
    expect(d.studentTIsf(0, 4)).toBe(Infinity);
    expect(d.studentTIsf(1, 4)).toBe(-Infinity);
    expect(d.fQuantile(0, 2, 5)).toBe(0);
    expect(d.fQuantile(1, 2, 5)).toBe(Infinity);
    expect(d.fIsf(0, 2, 5)).toBe(Infinity);
    expect(d.fIsf(1, 2, 5)).toBe(0);
    expect(d.chiSquareQuantile(0, 3)).toBe(0);
    expect(d.chiSquareQuantile(1, 3)).toBe(Infinity);
    expect(d.chiSquareIsf(0, 3)).toBe(Infinity);
    expect(d.chiSquareIsf(1, 3)).toBe(0);
    expect(Object.is(d.studentTQuantile(0.5, 7), 0)).toBe(true);
    expect(Object.is(d.normalIsf(0.5), 0)).toBe(true);
  });

  it('NaN in, NaN out; outside the domain, NaN; nothing throws', () => {
    const calls: Array<() => number> = [
      () => d.normalSf(NaN), () => d.normalCdf(NaN), () => d.normalPdf(NaN), () => d.normalQuantile(NaN),
      () => d.normalIsf(NaN), () => d.normalQuantile(1.5), () => d.normalIsf(-0.1),
      () => d.studentTSf(NaN, 3), () => d.studentTSf(1, NaN), () => d.studentTCdf(1, 0), () => d.studentTSf(1, -2),
      () => d.studentTQuantile(NaN, 3), () => d.studentTQuantile(0.5, NaN), () => d.studentTIsf(2, 3),
      () => d.studentTIsf(0.1, 0),
      () => d.fSf(NaN, 1, 2), () => d.fSf(1, NaN, 2), () => d.fCdf(1, 1, -2), () => d.fQuantile(-1, 1, 2),
      () => d.fIsf(0.1, 0, 2), () => d.fIsf(NaN, 1, 2),
      () => d.chiSquareSf(NaN, 2), () => d.chiSquareCdf(1, NaN), () => d.chiSquareSf(1, 0),
      () => d.chiSquareQuantile(2, 3), () => d.chiSquareIsf(0.1, -1), () => d.chiSquareQuantile(NaN, 3),
      () => d.lnGamma(NaN), () => d.lnBeta(NaN, 1), () => d.lnBeta(-1, 2),
      () => d.regularizedBeta(1.5, 1, 1), () => d.regularizedBeta(0.5, 0, 1), () => d.regularizedBeta(NaN, 1, 1),
      () => d.regularizedBetaComplement(0.5, -1, 1), () => d.regularizedGammaP(-1, 1), () => d.regularizedGammaP(1, -1),
      () => d.regularizedGammaQ(NaN, 1), () => d.regularizedGammaQ(1, NaN),
    ];
    for (const call of calls) expect(call()).toBeNaN();
  });

  it('poles and ends of the special functions', () => {
    expect(d.lnGamma(0)).toBe(Infinity);
    expect(d.lnGamma(-3)).toBe(Infinity);
    expect(d.lnGamma(1)).toBe(0);
    expect(d.lnGamma(2)).toBe(0);
    expect(d.lnBeta(0, 2)).toBe(Infinity);
    expect(d.regularizedBeta(0, 2, 3)).toBe(0);
    expect(d.regularizedBeta(1, 2, 3)).toBe(1);
    expect(d.regularizedBetaComplement(0, 2, 3)).toBe(1);
    expect(d.regularizedGammaP(2, 0)).toBe(0);
    expect(d.regularizedGammaQ(2, 0)).toBe(1);
    expect(d.regularizedGammaQ(2, Infinity)).toBe(0);
  });
});
