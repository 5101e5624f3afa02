/**
 * The Compare section lines up columns for each design and gets the same statistics as psych::r.test in R
 * (fixture and script: test/fixtures/panel/; R and psych versions in the fixture). Independent groups: Fisher's
 * z; one column in common: Williams' t (Steiger 1980, eq. 7); separate pairs: Steiger's pooled Z (eq. 14-15).
 */
import * as fs from 'fs';
import * as path from 'path';
import { computeComparison, isCompareFailure, CompareView } from '../../../taskpane/compare-view';
import { detectDesign } from '../../../taskpane/design';
import { dataBlock, numericColumn } from '../../../taskpane/pairs';
import type { NumericColumnRead } from '../../../taskpane/workbook';

const R = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../fixtures/panel/panel-r.json'), 'utf8')).compare;
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/** A table column on a sheet: header in row 1, data from row 2. */
function col(sheet: string, column: number, header: string, data: number[]): NumericColumnRead {
  return numericColumn({ address: `${sheet}!col${column}`, sheet, firstRow: 1, firstColumn: column, values: [[header], ...data.map((v) => [v])], header });
}

const J = col('Same', 1, 'j', R.j);
const K = col('Same', 2, 'k', R.k);
const H = col('Same', 3, 'h', R.h);
const M = col('Same', 4, 'm', R.m);
const J2 = col('Other', 1, 'j', R.j2);
const K2 = col('Other', 2, 'k', R.k2);

function run(a: [NumericColumnRead, NumericColumnRead], b: [NumericColumnRead, NumericColumnRead]): CompareView {
  const det = detectDesign([dataBlock(a[0]), dataBlock(a[1])], [dataBlock(b[0]), dataBlock(b[1])]);
  const v = computeComparison(a, b, det.design!, det, 0.95);
  if (isCompareFailure(v)) throw new Error(v.error);
  return v;
}

test('independent groups (another sheet): r1, r2, z, p as psych::r.test(n, r12, r34, n2)', () => {
  const v = run([J, K], [J2, K2]);
  expect(v.design).toBe('independent');
  expect(rel(v.result.r1, R.independent.r1)).toBeLessThan(1e-9);
  expect(rel(v.result.r2, R.independent.r2)).toBeLessThan(1e-9);
  expect(rel(v.result.test.value, R.independent.z)).toBeLessThan(1e-9);
  expect(rel(v.result.pValue, R.independent.p)).toBeLessThan(1e-6);
});

test('one column in common, in either position: Williams t as psych::r.test(n, r12, r13, r23)', () => {
  for (const b of [[J, H], [H, J]] as [NumericColumnRead, NumericColumnRead][]) {
    const v = run([J, K], b);
    expect(v.design).toBe('shared');
    expect(rel(v.result.r1, R.shared.r1)).toBeLessThan(1e-9);
    expect(rel(v.result.r2, R.shared.r2)).toBeLessThan(1e-9);
    expect(rel(v.result.test.value, R.shared.t)).toBeLessThan(1e-9);
    expect(rel(v.result.pValue, R.shared.p)).toBeLessThan(1e-6);
  }
});

test('four different columns on the same rows: Steiger Z as psych::r.test(n, r12, r34, r13, r14, r23, r24)', () => {
  const v = run([J, K], [H, M]);
  expect(v.design).toBe('separate');
  expect(rel(v.result.r1, R.separate.r1)).toBeLessThan(1e-9);
  expect(rel(v.result.r2, R.separate.r2)).toBeLessThan(1e-9);
  expect(rel(v.result.test.value, R.separate.z)).toBeLessThan(1e-9);
  expect(rel(v.result.pValue, R.separate.p)).toBeLessThan(1e-6);
});

test('each correlation carries its own Fisher-z interval, containing it', () => {
  const v = run([J, K], [J2, K2]);
  expect(v.interval1.lower).toBeLessThan(v.result.r1);
  expect(v.interval1.upper).toBeGreaterThan(v.result.r1);
  expect(v.interval2.lower).toBeLessThan(v.result.r2);
  expect(v.where).toEqual({ a: 'Same!A2:A41', b: 'Other!A2:A31' });
});

test('a shared-variable override without a common column says so', () => {
  const det = detectDesign([dataBlock(J), dataBlock(K)], [dataBlock(H), dataBlock(M)]);
  const v = computeComparison([J, K], [H, M], 'shared', det, 0.95);
  expect(isCompareFailure(v) && v.error).toMatch(/share exactly one column/);
});

test('too few rows gives the core message', () => {
  const tiny = (c: NumericColumnRead): NumericColumnRead => ({ ...c, numbers: c.numbers.slice(0, 3) });
  const v = computeComparison([tiny(J), tiny(K)], [J2, K2], 'independent', { design: 'independent', why: '' }, 0.95);
  expect(isCompareFailure(v) && v.error).toMatch(/at least 4/);
});

test('the comparison follows the coefficient chosen: Spearman groups compared with their own standard errors', () => {
  const det = detectDesign([dataBlock(J), dataBlock(K)], [dataBlock(J2), dataBlock(K2)]);
  const v = computeComparison([J, K], [J2, K2], det.design!, det, 0.95, undefined, 'spearman');
  if (isCompareFailure(v)) throw new Error(v.error);
  expect(v.result.method).toBe('spearman');
  expect(v.result.pMethod).toMatch(/Bonett & Wright/);
  // Each pair's own interval is Spearman's Fisher-z interval (Bonett & Wright SE), containing its rho.
  expect(v.interval1.method).toMatch(/Bonett & Wright/);
  expect(v.interval1.lower).toBeLessThan(v.result.r1);
  expect(v.interval1.upper).toBeGreaterThan(v.result.r1);
  // One column in common, with a robust coefficient: a seeded bootstrap of the rows.
  const shared = detectDesign([dataBlock(J), dataBlock(K)], [dataBlock(J), dataBlock(H)]);
  const w = computeComparison([J, K], [J, H], shared.design!, shared, 0.95, undefined, 'percentage_bend');
  if (isCompareFailure(w)) throw new Error(w.error);
  expect(w.result.interval.method).toMatch(/percentile bootstrap of the difference/);
  expect(w.interval1.method).toMatch(/percentile bootstrap/);
});

describe('cautions on what a comparison asks', () => {
  const north = [col('North', 2, 'Mechanics (FTE)', [1, 2, 3, 4, 5, 6]), col('North', 3, 'Repairs per week', [2, 4, 5, 4, 6, 8])] as [NumericColumnRead, NumericColumnRead];
  const southSame = [col('South', 2, 'mechanics (FTE)', [2, 3, 1, 5, 4, 6]), col('South', 3, 'Repairs per week', [3, 3, 2, 6, 5, 6])] as [NumericColumnRead, NumericColumnRead];
  const southOther = [col('South', 6, 'Floor area m²', [90, 120, 100, 150, 130, 170]), col('South', 7, 'Rent per month', [900, 1300, 1000, 1600, 1250, 1900])] as [NumericColumnRead, NumericColumnRead];
  const view = (a: typeof north, b: typeof north, design?: 'independent' | 'shared' | 'separate') => {
    const detection = detectDesign([dataBlock(a[0]), dataBlock(a[1])], [dataBlock(b[0]), dataBlock(b[1])]);
    const v = computeComparison(a, b, design ?? detection.design!, detection, 0.95);
    if (isCompareFailure(v)) throw new Error(v.error);
    return v;
  };

  test('two groups on the same measures (case aside): no caution', () => {
    expect(view(north, southSame).cautions).toEqual([]);
  });

  test('two groups on different measures are said to compare unlike things', () => {
    expect(view(north, southOther).cautions).toEqual([
      'Pair A (Mechanics (FTE) with Repairs per week) and pair B (Floor area m² with Rent per month) are not the same measures: a comparison of two groups asks whether one relationship differs between them, so here it compares unlike things. Pick the same two columns in each group.',
    ]);
  });

  test('a design chosen against the addresses says what its test assumes', () => {
    const c = view(north, southSame, 'separate').cautions;
    expect(c).toHaveLength(1);
    expect(c[0]).toMatch(/^The addresses suggest “two separate groups \(different rows\)”, but “same rows, four different columns” is chosen: its test assumes all four columns are measured on the same rows\./);
  });
});
