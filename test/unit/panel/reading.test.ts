/** The plain-language reading. Strength words follow Cohen (1988), Statistical Power Analysis for the Behavioral
 * Sciences, 2nd ed., sec. 3.2: |r| = .1 small, .3 medium, .5 large (named weak, moderate, strong here). */
import { formatPValue, formatR, readCorrelation, strengthWord } from '../../../taskpane/reading';
import type { CorrelationResult } from '../../../src/stats/types';

test.each([
  [0.05, 'negligible'], [0.1, 'weak'], [-0.29, 'weak'], [0.3, 'moderate'], [-0.5, 'strong'], [0.99, 'strong'],
])('strength of %f is %s (Cohen 1988 thresholds)', (r, word) => expect(strengthWord(r)).toBe(word));

test('number formats keep a visible sign and a true minus', () => {
  expect(formatR(0.816)).toBe('0.82');
  expect(formatR(-0.4)).toBe('−0.40');
  expect(formatR(-0.003)).toBe('−0.003');
  expect(formatPValue(0.0004)).toBe('< 0.001');
  expect(formatPValue(0.0534)).toBe('0.053');
});

test('the reading says what p is and what it is not, and whether the interval includes zero', () => {
  const res: CorrelationResult = {
    method: 'pearson', name: 'Pearson', statistic: -0.35, pValue: 0.04, tail: 'both',
    interval: { lower: -0.6, upper: 0.02, level: 0.95, method: '' }, n: 40, test: { name: 't', value: -2.1, df: 38 }, pMethod: '',
  };
  const lines = readCorrelation(res, 'Price', 'Orders');
  expect(lines[0]).toMatch(/^Moderate negative association: higher Price tends to go with lower Orders/);
  expect(lines[1]).toMatch(/includes zero/);
  expect(lines[2]).toMatch(/not the chance that there is none/);
});
