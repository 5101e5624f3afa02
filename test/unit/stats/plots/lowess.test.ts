/**
 * LOWESS against R's stats::lowess() (fixture and generating script: test/fixtures/lowess/; R version recorded in
 * the fixture). Cases: R's `cars` data (Ezekiel 1930) with the defaults and with f = 0.3, iter = 0; a curved
 * relation with heavy-tailed noise and a gross outlier (robustness passes), with delta = 0; a rating scale with
 * many tied x values; a small unsorted input.
 */
import * as fs from 'fs';
import * as path from 'path';
import { lowess } from '../../../../src/stats/plots/lowess';
import { StatsInputError } from '../../../../src/stats/types';

interface LowessCase {
  name: string;
  call: string;
  f: number;
  iter: number;
  delta: number;
  x: number[];
  y: number[];
  expectedX: number[];
  expectedY: number[];
}

const fixture = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../fixtures/lowess/lowess.json'), 'utf8'),
) as { R: string; cases: LowessCase[] };

function expectClose(actual: ArrayLike<number>, expected: number[], rel: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const scale = Math.max(1, Math.abs(expected[i]));
    if (Math.abs(actual[i] - expected[i]) > rel * scale) {
      throw new Error(`index ${i}: got ${actual[i]}, R gives ${expected[i]}`);
    }
  }
}

describe('lowess agrees with R stats::lowess()', () => {
  for (const c of fixture.cases) {
    test(`${c.name}: ${c.call} (${fixture.R})`, () => {
      const fit = lowess(c.x, c.y, { span: c.f, iterations: c.iter, delta: c.delta });
      expectClose(fit.x, c.expectedX, 0);
      expectClose(fit.y, c.expectedY, 1e-9);
    });
  }

  test('default delta is 1% of the x range, as in R (cars case uses the default)', () => {
    const c = fixture.cases.find((k) => k.name === 'cars')!;
    const fit = lowess(c.x, c.y);
    expectClose(fit.y, c.expectedY, 1e-9);
  });
});

describe('lowess input handling', () => {
  test('one point returns itself; zero points return empty', () => {
    expect(Array.from(lowess([2], [5]).y)).toEqual([5]);
    expect(lowess([], []).y.length).toBe(0);
  });
  test('rejects unequal lengths, non-finite values and a bad span', () => {
    expect(() => lowess([1, 2], [1])).toThrow(StatsInputError);
    expect(() => lowess([1, NaN, 3], [1, 2, 3])).toThrow(StatsInputError);
    expect(() => lowess([1, 2, 3], [1, 2, 3], { span: 0 })).toThrow(StatsInputError);
  });
  test('a straight line is reproduced exactly (local linear fits are unbiased for lines)', () => {
    const x = Array.from({ length: 40 }, (_, i) => i * 0.5);
    const y = x.map((v) => 2 - 3 * v);
    const fit = lowess(x, y);
    for (let i = 0; i < x.length; i++) expect(fit.y[i]).toBeCloseTo(2 - 3 * fit.x[i], 10);
  });
});
