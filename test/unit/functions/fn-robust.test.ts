/**
 * The new method words and CORRECTED as Excel calls them (2-D arrays, null for omitted arguments). Expected
 * values: the base-R implementation of the robust coefficients (test/fixtures/robust/robust-r.json), R's
 * psychometric 2.3 and the Hunter & Schmidt order written out in R (test/fixtures/corrections/psychometric-r.json),
 * and the rank comparison formulas in R (test/fixtures/compare/rank-diff-r.json); see test/references.md.
 */
import robustJson from '../../fixtures/robust/robust-r.json';
import psychJson from '../../fixtures/corrections/psychometric-r.json';
import rankJson from '../../fixtures/compare/rank-diff-r.json';
import { COEF, INTERVAL, PVALUE } from '../../../src/functions/fn-correlation';
import { CORRECTED } from '../../../src/functions/fn-evidence';
import { DIFF_REPORTED, DIFF_SHARED } from '../../../src/functions/fn-compare';
import { REPORT } from '../../../src/functions/fn-checks';
import { cellError } from '../../helpers/cell-error';

const col = (v: unknown[]) => v.map((a) => [a]);
const NONE = null as unknown as number;
const NO_WORD = null as unknown as string;
const cases = (robustJson as unknown as { cases: { name: string; x: number[]; y: number[]; percentage_bend: { r: number; p: number }; winsorized: { r: number; p: number }; skipped: { skipped: number[] } }[] }).cases;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

test('COEF and PVALUE with the robust method words (robust-r.json, base R from the papers)', () => {
  const c = cases.find((k) => k.name === 'normal-n30-two-outliers')!;
  expect(rel(COEF(col(c.x), col(c.y), 'percentage_bend'), c.percentage_bend.r)).toBeLessThan(1e-12);
  expect(rel(COEF(col(c.x), col(c.y), 'Winsorized'), c.winsorized.r)).toBeLessThan(1e-12);
  expect(rel(PVALUE(col(c.x), col(c.y), NO_WORD, 'percentage_bend'), c.percentage_bend.p)).toBeLessThan(1e-9);
});

test('INTERVAL takes "bca" and "percentile" and refuses a Fisher interval for a robust coefficient', () => {
  const c = cases[0];
  const [[lo, hi]] = INTERVAL(col(c.x), col(c.y), NONE, NO_WORD, 'bca');
  const r = COEF(col(c.x), col(c.y));
  expect(lo).toBeLessThan(r);
  expect(hi).toBeGreaterThan(r);
  // The same cells, the same bootstrap: no flicker on recalculation.
  expect(INTERVAL(col(c.x), col(c.y), NONE, NO_WORD, 'bca')).toEqual([[lo, hi]]);
  expect(cellError(() => INTERVAL(col(c.x), col(c.y), NONE, 'biweight', 'fisher'))).toMatchObject({ code: '#VALUE!' });
  expect(cellError(() => INTERVAL(col(c.x), col(c.y), NONE, NO_WORD, 'jackknife')).message).toMatch(/interval must be one of "fisher", "percentile", "bca"/);
});

test('REPORT with the skipped correlation names the rows it set aside (robust-r.json)', () => {
  const c = cases.find((k) => k.name === 'normal-n30-two-outliers')!;
  const table = REPORT(col(c.x), col(c.y), NONE, 'skipped', NO_WORD) as [string, unknown][];
  const line = table.find((r) => String(r[0]).startsWith('Rows set aside as outliers'))!;
  expect(line[0]).toBe(`Rows set aside as outliers (${c.skipped.skipped.length})`);
  for (const row of c.skipped.skipped) expect(String(line[1])).toMatch(new RegExp(`\\b${row}\\b`));
  expect(String(table.find((r) => r[0] === 'Interval method')![1])).toMatch(/percentile bootstrap, B = 2000/);
});

interface Correction { name: string; r: number; relX?: number | null; relY?: number | null; U?: number | null; restriction?: string | null; n?: number | null; level?: number; corrected: number; lower?: number | null; upper?: number | null }
const corrections = (psychJson as unknown as { cases: Correction[] }).cases;

test.each(corrections.map((c) => [c.name, c] as const))('CORRECTED: %s (psychometric-r.json, Hunter & Schmidt order in R)', (_n, c) => {
  const opt = (v: number | null | undefined) => (v === null || v === undefined ? NONE : v);
  const [[r, lo, hi, words]] = CORRECTED(c.r, opt(c.relX), opt(c.relY), opt(c.U), c.restriction && c.restriction !== 'none' ? c.restriction : NO_WORD, opt(c.n), c.level ?? NONE);
  expect(Math.abs((r as number) - c.corrected)).toBeLessThan(1e-12);
  if (typeof c.lower === 'number' && typeof c.upper === 'number') {
    expect(Math.abs((lo as number) - c.lower)).toBeLessThan(1e-12);
    expect(Math.abs((hi as number) - c.upper)).toBeLessThan(1e-12);
  }
  expect(String(words)).toMatch(/applicant group, not a property of the people in the sheet/);
});

test('CORRECTED refuses what cannot be corrected, with a message', () => {
  expect(cellError(() => CORRECTED(1.2, NONE, NONE, NONE, NO_WORD, NONE, NONE)).message).toMatch(/between -1 and 1/);
  expect(cellError(() => CORRECTED(0.3, 1.5, NONE, NONE, NO_WORD, NONE, NONE)).message).toMatch(/rel_x/);
});

test('DIFF_REPORTED with "spearman" and "kendall" as the formulas in R (rank-diff-r.json)', () => {
  const ref = rankJson as unknown as Record<'spearman' | 'kendall', { r1: number; n1: number; r2: number; n2: number; p_both: number; lower_95: number; upper_95: number }[]>;
  for (const method of ['spearman', 'kendall'] as const) {
    const c = ref[method][0];
    const [[d, lo, hi, p]] = DIFF_REPORTED(c.r1, c.n1, c.r2, c.n2, NONE, NO_WORD, method);
    expect(d).toBe(c.r1 - c.r2);
    expect(Math.abs(lo - c.lower_95)).toBeLessThan(1e-12);
    expect(Math.abs(hi - c.upper_95)).toBeLessThan(1e-12);
    expect(rel(p, c.p_both)).toBeLessThan(1e-9);
  }
  expect(cellError(() => DIFF_REPORTED(0.3, 50, 0.1, 60, NONE, NO_WORD, 'biweight')).message).toMatch(/method must be one of/);
});

test('DIFF_SHARED with "spearman": a bootstrap of the rows, the same answer on every call', () => {
  const c = cases.find((k) => k.name === 'heavy-tails-t2-n50')!;
  const z = c.x.map((v, i) => v + c.y[i]);
  const a = DIFF_SHARED(col(c.x), col(c.y), col(z), NONE, NO_WORD, 'spearman');
  expect(DIFF_SHARED(col(c.x), col(c.y), col(z), NONE, NO_WORD, 'spearman')).toEqual(a);
  const [[d, lo, hi, p]] = a;
  expect(lo).toBeLessThanOrEqual(d);
  expect(hi).toBeGreaterThanOrEqual(d);
  expect(p).toBeGreaterThanOrEqual(0);
  expect(p).toBeLessThanOrEqual(1);
});
