/**
 * The Compare section's numbers: two correlations of the coefficient chosen in the Relationship section, each with
 * its own interval, and their difference with the interval and p-value of the test that fits the design (Zou's
 * 2007 interval for Pearson and the rank coefficients between groups; a seeded bootstrap otherwise). The statistics are the core's
 * (src/stats/compare-*.ts); this module only lines up the columns for the chosen design. Pure.
 */
import { formatBlock } from '../src/sheet/a1';
import { compareIndependentSamples } from '../src/stats/compare/independent';
import { compareSeparateSamples } from '../src/stats/compare/separate';
import { compareSharedSamples } from '../src/stats/compare/shared';
import { ComparisonResult } from '../src/stats/compare/comparison';
import { correlate, correlationInterval } from '../src/stats/correlation/correlate';
import { Interval, isClassical, Method, StatsInputError } from '../src/stats/types';
import { Design, DESIGN_LABELS, DesignDetection } from './design';
import { completeRows, dataBlock, pairColumns, PairedRows, PairingError } from './pairs';
import type { NumericColumnRead } from './workbook';

export interface CompareView {
  design: Design;
  result: ComparisonResult;
  /** Interval of each correlation on its own (Fisher z), at the same level. */
  interval1: Interval;
  interval2: Interval;
  labels: { a: string; b: string };
  /** Where each pair's first column sits, e.g. "North!B2:B41". */
  where: { a: string; b: string };
  /** Rows dropped because a cell was not a number (per group for independent groups). */
  skipped: number;
  /** Reasons to doubt that the comparison asks a sensible question (see comparisonCautions). */
  cautions: string[];
}

/** What each design assumes about how the rows were collected. */
const ASSUMES: Record<Design, string> = {
  independent: 'the two pairs come from different people or rows',
  shared: 'both pairs are measured on the same rows and share one column',
  separate: 'all four columns are measured on the same rows',
};

const sameMeasure = (p: NumericColumnRead, q: NumericColumnRead) => p.header.trim().toLowerCase() === q.header.trim().toLowerCase();

/**
 * Cautions for a comparison: two groups compared on different measures (a groups test asks whether the same
 * relationship differs between groups; "floor area with rent" against "mechanics with repairs" is not that
 * question), and a design chosen against what the addresses show (its test then assumes something the rows may
 * not satisfy).
 */
export function comparisonCautions(a: [NumericColumnRead, NumericColumnRead], b: [NumericColumnRead, NumericColumnRead], design: Design, detection: DesignDetection): string[] {
  const out: string[] = [];
  if (design === 'independent' && !(sameMeasure(a[0], b[0]) && sameMeasure(a[1], b[1]))) {
    out.push(
      `Pair A (${a[0].header} with ${a[1].header}) and pair B (${b[0].header} with ${b[1].header}) are not the same measures: ` +
        'a comparison of two groups asks whether one relationship differs between them, so here it compares unlike things. Pick the same two columns in each group.',
    );
  }
  if (detection.design && detection.design !== design) {
    out.push(
      `The addresses suggest “${DESIGN_LABELS[detection.design].toLowerCase()}”, but “${DESIGN_LABELS[design].toLowerCase()}” is chosen: ` +
        `its test assumes ${ASSUMES[design]}. If that is not how the rows were collected, its interval and p-value do not hold.`,
    );
  }
  return out;
}

export interface CompareFailure {
  error: string;
}

export function isCompareFailure(v: CompareView | CompareFailure): v is CompareFailure {
  return (v as CompareFailure).error !== undefined;
}

/**
 * Compares pair A = (a[0], a[1]) with pair B = (b[0], b[1]) under `design`; for "shared", `detection.common`
 * says which column is in both pairs.
 * @param pairedA pair A's complete pairs when the caller has them already (the panel pairs A once per refresh)
 */
export function computeComparison(
  a: [NumericColumnRead, NumericColumnRead],
  b: [NumericColumnRead, NumericColumnRead],
  design: Design,
  detection: DesignDetection,
  level: number,
  pairedA?: PairedRows,
  method: Method = 'pearson',
): CompareView | CompareFailure {
  const opts = { tail: 'both' as const, level, method };
  const own: [ArrayLike<number>, ArrayLike<number>][] = [];
  const labels = { a: `${a[1].header} with ${a[0].header}`, b: `${b[1].header} with ${b[0].header}` };
  try {
    let result: ComparisonResult;
    let skipped = 0;
    if (design === 'independent') {
      const pa = pairedA ?? pairColumns(a[0], a[1]);
      const pb = pairColumns(b[0], b[1]);
      skipped = pa.skipped + pb.skipped;
      result = compareIndependentSamples(pa.x, pa.y, pb.x, pb.y, opts);
      own.push([pa.x, pa.y], [pb.x, pb.y]);
    } else if (design === 'shared') {
      if (!detection.common) return { error: 'Pick pairs that share exactly one column for this design.' };
      const ia = detection.common.a;
      const ib = detection.common.b;
      const cols = completeRows([a[ia].numbers, a[1 - ia].numbers, b[1 - ib].numbers]);
      skipped = cols.skipped;
      const [common, otherA, otherB] = cols.columns;
      result = compareSharedSamples(common, otherA, otherB, opts);
      own.push([common, otherA], [common, otherB]);
    } else {
      const cols = completeRows([a[0].numbers, a[1].numbers, b[0].numbers, b[1].numbers]);
      skipped = cols.skipped;
      const [a0, a1, b0, b1] = cols.columns;
      result = compareSeparateSamples(a0, a1, b0, b1, opts);
      own.push([a0, a1], [b0, b1]);
    }
    return {
      design,
      result,
      interval1: ownInterval(method, result.r1, own[0], level),
      interval2: ownInterval(method, result.r2, own[1], level),
      labels,
      where: { a: formatBlock(dataBlock(a[0])), b: formatBlock(dataBlock(b[0])) },
      skipped,
      cautions: comparisonCautions(a, b, design, detection),
    };
  } catch (e) {
    if (e instanceof StatsInputError || e instanceof PairingError) return { error: e.message };
    throw e;
  }
}

/** One correlation's own interval: Fisher z for the classical coefficients, else the coefficient's bootstrap. */
function ownInterval(method: Method, r: number, [x, y]: [ArrayLike<number>, ArrayLike<number>], level: number): Interval {
  if (isClassical(method)) return correlationInterval(method, r, x.length, level);
  return correlate(x, y, { method, tail: 'both', level }).interval;
}
