/**
 * NEGLIGIBLE, BAYES, BAYES_REPORTED, SENSITIVITY and the `against` argument of PVALUE and REPORTED, called as Excel
 * calls them. Outside references: the formulas computed in R (test/fixtures/verdict/formulas-r.R), R's
 * BayesFactor::correlationBF (test/fixtures/verdict/bayes-factor-r.R), and the Hollander & Wolfe data of R's
 * ?cor.test (test/references.md).
 */
import * as fs from 'fs';
import * as path from 'path';
import { BAYES, BAYES_REPORTED, NEGLIGIBLE } from '../../../src/functions/fn-evidence';
import { SENSITIVITY } from '../../../src/functions/fn-checks';
import { PVALUE, REPORTED } from '../../../src/functions/fn-correlation';
import { clearSharedPairs } from '../../../src/functions/shared-pairs';
import { expectRel } from '../../helpers/close';
import { cellError } from '../../helpers/cell-error';

const dir = path.resolve(__dirname, '../../fixtures/verdict');
const F = JSON.parse(fs.readFileSync(path.join(dir, 'formulas-r.json'), 'utf8'));
const BF = JSON.parse(fs.readFileSync(path.join(dir, 'bayes-factor-r.json'), 'utf8'));
const col = (v: unknown[]) => v.map((a) => [a]);
const NONE = null as unknown as number;
const HW_X = [44.4, 45.9, 41.9, 53.3, 44.7, 44.1, 50.7, 45.2, 60.1];
const HW_Y = [2.6, 3.1, 2.5, 5.0, 3.6, 4.0, 5.2, 2.8, 3.8];

beforeEach(() => clearSharedPairs());

test('REPORTED and PVALUE against a benchmark other than zero: Fisher z as computed in R', () => {
  for (const c of F.against as { r: number; n: number; method: string; against: number; both: number; positive: number }[]) {
    expectRel(REPORTED(c.r, c.n, NONE, 'both', c.method, c.against)[0][2], c.both, 1e-10, `${c.method} both`);
    expectRel(REPORTED(c.r, c.n, NONE, 'positive', c.method, c.against)[0][2], c.positive, 1e-10, `${c.method} positive`);
  }
  // against omitted or 0: the usual test of no correlation, unchanged (R cor.test p = 0.1082 on these data).
  expect(PVALUE(col(HW_X), col(HW_Y), NONE as unknown as string, NONE as unknown as string, NONE)).toBeCloseTo(0.1082, 4);
  expect(PVALUE(col(HW_X), col(HW_Y), 'both', 'pearson', 0)).toBe(PVALUE(col(HW_X), col(HW_Y)));
  expect(cellError(() => PVALUE(col(HW_X), col(HW_Y), 'both', 'pearson', 1)).message).toMatch(/against must lie strictly between -1 and 1/);
});

test('NEGLIGIBLE: one row, p, the 1 - 2 alpha interval and the verdict in words', () => {
  const t = NEGLIGIBLE(col(HW_X), col(HW_Y), NONE, NONE, NONE as unknown as string);
  expect(t).toHaveLength(1);
  const [p, lo, hi, words] = t[0];
  // r = 0.5711816 on 9 rows (R cor.test): far from negligible.
  expect(p).toBeGreaterThan(0.5);
  expect(lo).toBeLessThan(0.5711816);
  expect(hi).toBeGreaterThan(0.5711816);
  expect(words).toMatch(/^not shown to be negligible/);
  expect(cellError(() => NEGLIGIBLE(col(HW_X), col(HW_Y), 2, NONE, NONE as unknown as string)).message).toMatch(/bound must lie strictly between 0 and 1/);
});

test('BAYES_REPORTED from r and n: BF10 as R correlationBF, BF01 its reciprocal, a probability, a credible interval', () => {
  const c = (BF.cases as { n: number; r: number; rscale: number; bf10: number | null }[]).find((k) => k.n === 48 && k.rscale === 1 && k.bf10 !== null && k.bf10 > 1)!;
  const [[bf10, bf01, post, median, lower, upper]] = BAYES_REPORTED(c.r, c.n, NONE, NONE) as number[][];
  expectRel(bf10, c.bf10 as number, 1e-6);
  expectRel(bf01, 1 / (c.bf10 as number), 1e-6);
  expect(post).toBeCloseTo(bf10 / (1 + bf10), 12);
  expect(lower).toBeLessThan(median);
  expect(median).toBeLessThan(upper);
  expect(cellError(() => BAYES_REPORTED(0.3, 40, -1, NONE)).message).toMatch(/prior width/);
});

test('BAYES from cells equals BAYES_REPORTED on the same r and n', () => {
  const fromCells = BAYES(col(HW_X), col(HW_Y), NONE, NONE);
  const fromR = BAYES_REPORTED(0.5711816139, 9, NONE, NONE);
  expectRel(fromCells[0][0] as number, fromR[0][0] as number, 1e-6);
});

test('SENSITIVITY: header, the alternatives, a summary that says what the conclusion rests on', () => {
  const t = SENSITIVITY(col(HW_X), col(HW_Y), NONE, NONE as unknown as string);
  expect(t[0]).toEqual(['Alternative', 'Coefficient', 'Lower', 'Upper', 'p-value', 'Rows', 'Conclusion', 'Holds']);
  expect(t[1][0]).toBe('as computed (Pearson)');
  expectRel(t[1][1] as number, 0.5711816, 1e-6);
  expect(t[1][6]).toBe('no clear correlation');
  expect(t[t.length - 1][0]).toBe('Summary');
  expect(t[t.length - 1][6]).toBe('too few rows to say');
});
