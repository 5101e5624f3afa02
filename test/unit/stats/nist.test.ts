/**
 * Numerical accuracy on NIST Statistical Reference Datasets (certified values, public domain):
 * Norris (linear regression, lower difficulty) and NumAcc1-4 (univariate, offsets up to 1e7).
 * Accuracy is reported as the log relative error LRE (McCullough 1998, "Assessing the reliability of
 * statistical software: Part I", The American Statistician 52:358-366): correct significant digits.
 */
import { coMoments } from '../../../src/stats/correlation/comoments';
import { correlate } from '../../../src/stats/correlation/correlate';
import { fitLine } from '../../../src/stats/correlation/regression';
import { logRelativeError } from '../../helpers/close';
import norris from '../../fixtures/nist/norris.json';

describe('NIST StRD Norris', () => {
  const fit = fitLine(norris.x, norris.y);
  const r = correlate(norris.x, norris.y, { method: 'pearson', tail: 'both', level: 0.95 }).statistic;
  test('slope, intercept, R^2 and residual SD to at least 12 significant digits', () => {
    expect(logRelativeError(fit.slope, norris.certified.slope)).toBeGreaterThanOrEqual(12);
    expect(logRelativeError(fit.intercept, norris.certified.intercept)).toBeGreaterThanOrEqual(12);
    expect(logRelativeError(r * r, norris.certified.rSquared)).toBeGreaterThanOrEqual(12);
    expect(logRelativeError(Math.sqrt(fit.rss / (fit.n - 2)), norris.certified.residualSD)).toBeGreaterThanOrEqual(12);
  });
});

/** NumAcc2-4 as NIST defines them: 1001 values, the centre then 500 pairs of centre -/+ 0.1 alternating. */
function numAcc(centre: number): number[] {
  // Built from the decimal text, as a spreadsheet reads typed values: the double nearest each decimal.
  const tenths = Math.round(centre * 10);
  const v = [Number((tenths / 10).toFixed(1))];
  for (let i = 0; i < 500; i++) v.push(Number(((tenths - 1) / 10).toFixed(1)), Number(((tenths + 1) / 10).toFixed(1)));
  return v;
}
const sd = (v: number[]) => {
  const m = coMoments(v, v);
  return Math.sqrt((m.sxx * m.scaleX * m.scaleX) / (v.length - 1));
};

describe('NIST StRD NumAcc1-4 (certified: NumAcc1 mean 10000002, SD 1; NumAcc2-4 mean centre, SD 0.1)', () => {
  test('NumAcc1: mean and SD exact', () => {
    const v = [10000001, 10000003, 10000002];
    const m = coMoments(v, v);
    expect(logRelativeError(m.meanX, 10000002)).toBeGreaterThanOrEqual(12);
    expect(logRelativeError(sd(v), 1)).toBeGreaterThanOrEqual(12);
  });
  test.each([
    ['NumAcc2', 1.2],
    ['NumAcc3', 1000000.2],
    ['NumAcc4', 10000000.2],
  ])('%s: mean and SD to 12 digits, and r = 1 against the un-offset pattern', (_name, centre) => {
    const v = numAcc(centre);
    const m = coMoments(v, v);
    expect(logRelativeError(m.meanX, centre)).toBeGreaterThanOrEqual(12);
    // The decimals are not exactly representable in binary; reading them as decimals keeps 12+ digits.
    expect(logRelativeError(sd(v), 0.1)).toBeGreaterThanOrEqual(12);
    const base = numAcc(1.2);
    const r = correlate(v, base, { method: 'pearson', tail: 'both', level: 0.95 }).statistic;
    expect(logRelativeError(r, 1)).toBeGreaterThanOrEqual(12);
    const flipped = base.map((b) => 2.4 - b);
    expect(logRelativeError(correlate(v, flipped, { method: 'pearson', tail: 'both', level: 0.95 }).statistic, -1)).toBeGreaterThanOrEqual(12);
  });
});
