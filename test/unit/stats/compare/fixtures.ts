/**
 * Typed access to the reference fixtures of the comparisons, partial correlation, matrix and planning:
 * compare-r.json: R 4.2.2 with psych 2.2.9 and pwr 1.3.0 (script compare-r.R beside it, exact calls inside).
 */
import rJson from '../../../fixtures/compare/compare-r.json';
import { Tail } from '../../../../src/stats/types';

export interface RTails {
  p_both: number;
  p_positive: number;
  p_negative: number;
  lower: number;
  upper: number;
  level: number;
}
export interface RIndependent extends RTails { r1: number; n1: number; r2: number; n2: number; z: number; zou_from_cor_test?: number[] }
export interface RShared extends RTails { rjk: number; rjh: number; rkh: number; n: number; t: number; df: number; c: number }
export interface RSeparate extends RTails {
  rjk: number; rhm: number; rjh: number; rjm: number; rkh: number; rkm: number; n: number; z: number; c: number;
}
export interface RPartial extends RTails {
  x: string; y: string; controls: string | string[]; n: number; k: number; r: number; r_psych: number; t: number; df: number;
}
export interface RMatrix {
  method: 'pearson' | 'spearman' | 'kendall';
  coef: number[][];
  p: (number | null)[][];
  holm: (number | null)[][];
  fdr: (number | null)[][];
  pairs: number[][];
}
export type Region = Record<'tenure' | 'test' | 'performance' | 'seniority' | 'training', (number | null)[]>;

export const R = rJson as unknown as {
  versions: Record<string, string>;
  published: Record<
    'fisher_a' | 'fisher_b' | 'zou_independent' | 'zou_independent_90' | 'steiger_a' | 'zou_shared' | 'steiger_b' | 'zou_separate',
    RIndependent & RShared & RSeparate
  >;
  data: { north: Region; south: Region };
  groups: RIndependent;
  shared: RShared;
  separate: RSeparate;
  partial: Record<'one' | 'two' | 'south_one', RPartial>;
  matrix: Record<'pearson' | 'spearman' | 'kendall', RMatrix>;
  padjust: { p: number[]; holm: number[]; BH: number[] };
  pwr: {
    power: { r: number; n: number; tail: Tail; power: number }[];
    n: { r: number; power: number; tail: Tail; n: number }[];
    r: { n: number; power: number; tail: Tail; r: number }[];
  };
};

/** |actual - expected| <= tol. */
export function expectAbs(actual: number, expected: number, tol: number, label = ''): void {
  const err = Math.abs(actual - expected);
  if (!(err <= tol)) throw new Error(`${label} expected ${expected}, got ${actual} (absolute error ${err.toExponential(2)} > ${tol})`);
}

/** A column of cells as Excel passes it; null in the data (R's NA) becomes a blank cell. */
export function cellColumn(v: (number | null)[]): unknown[][] {
  return v.map((a) => [a === null ? '' : a]);
}

/** Column values with NaN for blanks, as the core receives them. */
export function withNaN(v: (number | null)[]): Float64Array {
  return Float64Array.from(v, (a) => (a === null ? NaN : a));
}
