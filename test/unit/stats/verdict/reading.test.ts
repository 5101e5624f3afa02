/** The plain-language reading. Strength words follow Cohen (1988), Statistical Power Analysis for the Behavioral
 * Sciences, 2nd ed., ch. 3: |r| = .1 small, .3 medium, .5 large; Kendall's tau is worded on the scale of r by
 * Greiner's relation r = sin(pi tau / 2) (Kendall 1970, Rank Correlation Methods). */
import { formatPValue, formatR } from '../../../src/stats/format';
import { readCorrelation } from '../../../taskpane/reading';
import type { CorrelationResult } from '../../../src/stats/types';

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
  expect(lines[0]).toMatch(/^Medium negative correlation by Cohen's \(1988\) convention .*: higher Price tends to go with lower Orders\.$/);
  expect(lines[1]).toMatch(/includes zero/);
  expect(lines[2]).toMatch(/not the chance that there is none/);
});

test("Kendall's tau is worded on the scale of r: tau = 0.35 is about r = 0.52, a large correlation", () => {
  const res: CorrelationResult = {
    method: 'kendall', name: 'Kendall tau-b', statistic: 0.35, pValue: 0.001, tail: 'both',
    interval: { lower: 0.15, upper: 0.52, level: 0.95, method: '' }, n: 60, test: { name: 'z', value: 3.9 }, pMethod: '',
  };
  // sin(pi * 0.35 / 2) = 0.5225 (Greiner's relation), above Cohen's .5 for "large".
  expect(readCorrelation(res, 'a', 'b')[0]).toMatch(/^Large positive correlation/);
});

test('Cohen thresholds: .1 small, .3 medium, .5 large, below .1 very small', () => {
  const at = (r: number): string => readCorrelation({
    method: 'pearson', name: 'Pearson', statistic: r, pValue: 0.5, tail: 'both',
    interval: { lower: -0.9, upper: 0.9, level: 0.95, method: '' }, n: 10, test: { name: 't', value: 0 }, pMethod: '',
  }, 'a', 'b')[0];
  expect(at(0.05)).toMatch(/^Very small/);
  expect(at(0.1)).toMatch(/^Small/);
  expect(at(-0.3)).toMatch(/^Medium/);
  expect(at(0.5)).toMatch(/^Large/);
});
