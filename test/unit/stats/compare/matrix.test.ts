/**
 * The correlation matrix and p-value adjustment against R 4.2.2: cor.test on each pair's complete rows and
 * p.adjust(holm / BH) across the distinct pairs (test/fixtures/compare/compare-r.json, script compare-r.R).
 */
import { correlate } from '../../../../src/stats/correlation/correlate';
import { correlationMatrix } from '../../../../src/stats/compare/matrix';
import { benjaminiHochbergAdjust, holmAdjust } from '../../../../src/stats/compare/p-adjust';
import { expectRel } from '../../../helpers/close';
import { R, Region, withNaN } from './fixtures';

const NAMES: (keyof Region)[] = ['tenure', 'test', 'performance', 'seniority', 'training'];

describe('p-value adjustment (R p.adjust)', () => {
  test('Holm (1979) and Benjamini & Hochberg (1995) on p-values with ties', () => {
    const { p, holm, BH } = R.padjust;
    holmAdjust(p).forEach((v, i) => expectRel(v, holm[i], 1e-14, `holm ${i}`));
    benjaminiHochbergAdjust(p).forEach((v, i) => expectRel(v, BH[i], 1e-14, `BH ${i}`));
  });

  test('documented examples', () => {
    expect(Array.from(holmAdjust([0.01, 0.04, 0.03]))).toEqual([0.03, 0.06, 0.06]);
    expect(Array.from(benjaminiHochbergAdjust([0.01, 0.04, 0.03])).map((v) => +v.toFixed(12))).toEqual([0.03, 0.04, 0.04]);
  });
});

describe('correlation matrix, pairwise-complete rows (R cor.test + p.adjust)', () => {
  const columns = NAMES.map((c) => withNaN(R.data.north[c]));
  test.each(['pearson', 'spearman', 'kendall'] as const)('%s', (method) => {
    const ref = R.matrix[method];
    const res = correlationMatrix(columns, method, NAMES);
    const k = NAMES.length;
    expect(res.k).toBe(k);
    expect(res.tests).toBe(10);
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        const at = i * k + j;
        const label = `${method} [${NAMES[i]}, ${NAMES[j]}]`;
        expect(res.pairs[at]).toBe(ref.pairs[i][j]);
        if (i === j) {
          expect(res.coef[at]).toBe(1);
          expect(Number.isNaN(res.pValue[at]) && Number.isNaN(res.pHolm[at]) && Number.isNaN(res.pFdr[at])).toBe(true);
          continue;
        }
        expectRel(res.coef[at], ref.coef[i][j], 1e-9, label);
        expectRel(res.pValue[at], ref.p[i][j] as number, 1e-6, `${label} p`);
        expectRel(res.pHolm[at], ref.holm[i][j] as number, 1e-6, `${label} holm`);
        expectRel(res.pFdr[at], ref.fdr[i][j] as number, 1e-6, `${label} fdr`);
      }
    }
  });

  test('Spearman on columns without gaps (ranked once per column) equals the one-pair computation', () => {
    // Consistency of the two code paths; both are held against R above.
    const gapless = (['tenure', 'performance', 'seniority'] as const).map((c) => withNaN(R.data.north[c]));
    const res = correlationMatrix(gapless, 'spearman');
    const one = correlate(gapless[0], gapless[1], { method: 'spearman', tail: 'both', level: 0.95 });
    expect(res.coef[1]).toBe(one.statistic);
    expect(res.pValue[1]).toBe(one.pValue);
  });

  test('messages name the columns', () => {
    const a = Float64Array.of(1, 2, 3, 4, 5);
    const b = Float64Array.of(NaN, NaN, NaN, 2, 1);
    const c = Float64Array.of(7, 7, 7, 7, 8);
    expect(() => correlationMatrix([a, b], 'pearson', ['sales', 'visits'])).toThrow(/sales and visits share only 2 rows/);
    expect(() => correlationMatrix([a, c.map((v, i) => (i === 4 ? NaN : v))], 'spearman', ['sales', 'visits'])).toThrow(
      /sales and visits: one of them is constant/,
    );
    expect(() => correlationMatrix([a], 'pearson')).toThrow(/at least 2 columns/);
  });
});
