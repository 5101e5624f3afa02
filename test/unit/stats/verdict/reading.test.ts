/** The plain-language reading. Strength words follow Cohen (1988), Statistical Power Analysis for the Behavioral
 * Sciences, 2nd ed., ch. 3: |r| = .1 small, .3 medium, .5 large; Kendall's tau is worded on the scale of r by
 * Greiner's relation r = sin(pi tau / 2) (Kendall 1970, Rank Correlation Methods). An interval that includes zero
 * gives no direction at all. */
import { formatCorrelation, formatPValue, formatR } from '../../../../src/stats/format';
import { readCorrelation } from '../../../../src/stats/verdict/advice';
import type { CorrelationResult } from '../../../../src/stats/types';

const result = (r: number, lower: number, upper: number, p: number, method: CorrelationResult['method'] = 'pearson', n = 40): CorrelationResult => ({
  method, name: method === 'kendall' ? 'Kendall tau-b' : method === 'spearman' ? 'Spearman' : 'Pearson', statistic: r, pValue: p, tail: 'both',
  interval: { lower, upper, level: 0.95, method: '' }, n, test: { name: 't', value: 0, df: n - 2 }, pMethod: '',
});

test('number formats keep a visible sign and a true minus, and never show a bound short of 1 as 1', () => {
  expect(formatR(0.816)).toBe('0.82');
  expect(formatR(-0.4)).toBe('−0.40');
  expect(formatR(-0.003)).toBe('−0.003');
  expect(formatR(0.994)).toBe('0.99');
  expect(formatR(0.996)).toBe('0.996');
  expect(formatR(-0.9999)).toBe('−0.9999');
  expect(formatR(1)).toBe('1.00');
  expect(formatCorrelation(0.99996)).toBe('0.99996');
  expect(formatCorrelation(0.816)).toBe('0.816');
  expect(formatPValue(0.0004)).toBe('< 0.001');
  expect(formatPValue(0.0534)).toBe('0.053');
});

test('an interval that excludes zero: strength, direction named by the columns, what p is and is not', () => {
  const lines = readCorrelation(result(-0.35, -0.6, -0.04, 0.03), 'Price', 'Orders', formatR);
  expect(lines[0]).toMatch(/^Medium negative correlation by Cohen's \(1988\) convention .*: higher Price tends to go with lower Orders\.$/);
  expect(lines[1]).toMatch(/holds the correlations these data are consistent with/);
  expect(lines[2]).toMatch(/not the chance that there is none/);
});

test('an interval that includes zero: no direction, and what the data cannot rule out', () => {
  const lines = readCorrelation(result(-0.05, -0.33, 0.24, 0.74, 'pearson', 48), 'Households nearby', 'Rent per month', formatR);
  expect(lines[0]).toBe('No clear relationship between Households nearby and Rent per month in these 48 rows.');
  expect(lines.join(' ')).not.toMatch(/tends to go with|higher|lower/);
  expect(lines[1]).toBe('The 95% interval, −0.33 to 0.24, includes zero: the data cannot rule out a correlation as strong as 0.33 (negative) or 0.24 (positive).');
});

test("Kendall's tau is worded on the scale of r: tau = 0.35 is about r = 0.52, a large correlation", () => {
  // sin(pi * 0.35 / 2) = 0.5225 (Greiner's relation), above Cohen's .5 for "large".
  const line = readCorrelation(result(0.35, 0.15, 0.52, 0.001, 'kendall', 60), 'a', 'b', formatR)[0];
  expect(line).toMatch(/^Large positive correlation/);
  expect(line).toMatch(/τ-b 0\.35 is about r = 0\.52 by Greiner's relation/);
});

test('Cohen thresholds: .1 small, .3 medium, .5 large, below .1 very small (intervals that exclude zero)', () => {
  const at = (r: number): string => readCorrelation(result(r, r > 0 ? r / 2 : r * 1.5, r > 0 ? r * 1.5 : r / 2, 0.001, 'pearson', 5000), 'a', 'b', formatR)[0];
  expect(at(0.05)).toMatch(/^Very small/);
  expect(at(0.1)).toMatch(/^Small/);
  expect(at(-0.3)).toMatch(/^Medium/);
  expect(at(0.5)).toMatch(/^Large/);
});
