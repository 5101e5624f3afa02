/**
 * Partial correlation against R 4.2.2: Pearson's r of lm() residuals, psych 2.2.9 partial.r, and pt() for the
 * p-values (test/fixtures/compare/compare-r.json, script compare-r.R beside it).
 */
import { partialCorrelation } from '../../../../src/stats/compare/partial';
import { Tail } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import { expectAbs, R, Region } from './fixtures';

type Column = keyof Region;

function completeData(region: Region, names: Column[]): number[][] {
  const rows = region[names[0]].map((_, i) => i).filter((i) => names.every((c) => region[c][i] !== null));
  return names.map((c) => rows.map((i) => region[c][i] as number));
}

describe('partial correlation (R residuals and psych::partial.r)', () => {
  const cases = [
    ['one', R.data.north],
    ['two', R.data.north],
    ['south_one', R.data.south],
  ] as const;
  test.each(cases)('%s', (key, region) => {
    const ref = R.partial[key];
    const controls = (Array.isArray(ref.controls) ? ref.controls : [ref.controls]) as Column[];
    const [x, y, ...ctl] = completeData(region, [ref.x as Column, ref.y as Column, ...controls]);
    for (const tail of ['both', 'positive', 'negative'] as Tail[]) {
      const res = partialCorrelation(x, y, ctl, { tail, level: ref.level });
      expect(res.n).toBe(ref.n);
      expect(res.controls).toBe(ref.k);
      expectRel(res.statistic, ref.r, 1e-9, 'r vs lm residuals');
      expectRel(res.statistic, ref.r_psych, 1e-9, 'r vs psych::partial.r');
      expectRel(res.test.value, ref.t, 1e-9, 't');
      expect(res.test.df).toBe(ref.df);
      const p = tail === 'both' ? ref.p_both : tail === 'positive' ? ref.p_positive : ref.p_negative;
      expectRel(res.pValue, p, 1e-6, `p ${tail}`);
      expectAbs(res.interval.lower, ref.lower, 1e-9, 'lower');
      expectAbs(res.interval.upper, ref.upper, 1e-9, 'upper');
    }
  });

  test('large offsets in a control do not cost digits (same answer as the control shifted by 1e9)', () => {
    // The partial correlation is unchanged by adding a constant to a control: an invariance, checked against
    // R's value on the unshifted data.
    const ref = R.partial.one;
    const [x, y, s] = completeData(R.data.north, ['tenure', 'performance', 'seniority']);
    const shifted = s.map((v) => v + 1e9);
    expectRel(partialCorrelation(x, y, [shifted], { tail: 'both', level: 0.95 }).statistic, ref.r, 1e-9);
  });

  test('huge and tiny magnitudes neither overflow nor underflow (scale invariance, R value on the original data)', () => {
    const ref = R.partial.one;
    const [x, y, s] = completeData(R.data.north, ['tenure', 'performance', 'seniority']);
    const opts = { tail: 'both' as Tail, level: 0.95 };
    expectRel(partialCorrelation(x.map((v) => v * 1e300), y.map((v) => v * 1e-300), [s.map((v) => v * 1e295)], opts).statistic, ref.r, 1e-9);
  });

  test('bad input', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const y = [2, 1, 4, 3, 6, 5];
    const opts = { tail: 'both' as Tail, level: 0.95 };
    expect(() => partialCorrelation(x, y, [[1, 1, 1, 1, 1, 1]], opts)).toThrow(/constant on the rows used/);
    expect(() => partialCorrelation(x, y, [[1, 2, 1, 2, 1, 3], [2, 4, 2, 4, 2, 6]], opts)).toThrow(/control column 2 adds nothing/);
    expect(() => partialCorrelation(x, y, [[1, 2, 3, 4, 5, 7]].map((c) => c.slice(0, 5)), opts)).toThrow(/same number of rows/);
    expect(() => partialCorrelation(x.slice(0, 4), y.slice(0, 4), [[1, 3, 2, 5]], opts)).toThrow(/needs at least 5/);
    expect(() => partialCorrelation(x, y, [x.map((v) => 2 * v + 1)], opts)).toThrow(/x is fully explained by the controls/);
    expect(() => partialCorrelation(x, y, [], opts)).toThrow(/at least one control/);
    expect(() => partialCorrelation(x, [3, 3, 3, 3, 3, 3], [[1, 3, 2, 5, 4, 4]], opts)).toThrow(/y is constant/);
  });
});
