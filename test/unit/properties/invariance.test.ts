/**
 * Invariances that any correct correlation must have, checked on the built functions (dist/functions.js hosted
 * bare) with random data:
 * - swapping x and y changes no coefficient, p-value or interval;
 * - a + b*x leaves Pearson's r unchanged for b > 0 and flips its sign for b < 0; rank coefficients likewise;
 * - shuffling the rows (the same permutation for every column of a call) changes no answer of the functions
 *   that treat rows as exchangeable;
 * - rescaling any column by a power of two (2^-900 to 2^900) changes no answer (exact in binary floating point, so
 *   any change is the function's own loss of accuracy at large or tiny magnitudes);
 * - duplicating every row leaves the coefficient unchanged (Pearson, Spearman and Kendall's tau-b alike).
 *
 * Tolerances: 1e-12 relative where the transformation is exact in floating point and the coefficient is a single
 * ratio of sums; 1e-9 relative (plus 1e-13 absolute, the rounding level of a value of order 1 summed over <= 40
 * rows) where summation order changes (shuffling, rescaling) or a p-value or bound is derived from r.
 * Needs `npm run build` first.
 */
import fc from 'fast-check';
import { answerDifferences, close } from './support/compare';
import { optionWords, takesBlock } from './support/cells';
import { cleanColumns, col, permutation } from './support/data';
import { callCell, describeOutcome, FunctionMeta, Outcome, requireFunction } from './support/registry';

const RUNS = Number(process.env.COVARY_PROPERTY_RUNS ?? 120);
const METHODS = ['pearson', 'spearman', 'kendall'] as const;
const TAILS = ['both', 'positive', 'negative'] as const;

/** Both calls answered and agree within tolerance, or both refused with the same error code. */
function sameOutcome(a: Outcome, b: Outcome, rel: number, abs: number): string[] {
  if (a.kind === 'value' && b.kind === 'value') return answerDifferences(a.value, b.value, rel, abs);
  if (a.kind === 'host-error' && b.kind === 'host-error' && a.code === b.code) return [];
  return [`${describeOutcome(a)} vs ${describeOutcome(b)}`];
}

function expectNone(problems: string[], context: string): void {
  if (problems.length) throw new Error(`${context}: ${problems.slice(0, 4).join('; ')}`);
}

describe('swapping x and y', () => {
  test('COEF, PVALUE and INTERVAL are unchanged, for every method, tail and level', () => {
    fc.assert(
      fc.property(cleanColumns(2, 3), fc.constantFrom(...METHODS), fc.constantFrom(...TAILS), fc.constantFrom(0.8, 0.95), ([x, y], method, tail, level) => {
        const X = col(x);
        const Y = col(y);
        expectNone(sameOutcome(callCell('COEF', [X, Y, method]), callCell('COEF', [Y, X, method]), 1e-12, 0), `COEF ${method}`);
        expectNone(sameOutcome(callCell('PVALUE', [X, Y, tail, method]), callCell('PVALUE', [Y, X, tail, method]), 1e-12, 0), `PVALUE ${tail} ${method}`);
        expectNone(sameOutcome(callCell('INTERVAL', [X, Y, level, method]), callCell('INTERVAL', [Y, X, level, method]), 1e-12, 0), `INTERVAL ${method}`);
      }),
      { numRuns: RUNS },
    );
  });
});

describe('a + b*x', () => {
  // Integers |x| <= 2^20, integer a with |a| <= 2^20 and b = +/-2^k, |k| <= 8: every a + b*x is exact in binary.
  const affineCase = fc.tuple(
    fc.integer({ min: 4, max: 40 }).chain((n) =>
      fc.tuple(
        fc.array(fc.integer({ min: -(2 ** 20), max: 2 ** 20 }), { minLength: n, maxLength: n }),
        fc.array(fc.noBias(fc.double({ min: -1000, max: 1000, noNaN: true })), { minLength: n, maxLength: n }),
      ),
    ),
    fc.integer({ min: -(2 ** 20), max: 2 ** 20 }),
    fc.integer({ min: -8, max: 8 }),
    fc.constantFrom(1, -1),
  );

  test('b > 0 leaves Pearson r, its p-value and interval unchanged; b < 0 flips the sign, the tails and the interval', () => {
    fc.assert(
      fc.property(affineCase, ([[x, y], a, k, sign]) => {
        const b = sign * 2 ** k;
        const moved = x.map((v) => a + b * v);
        const before = callCell('COEF', [col(x), col(y), 'pearson']);
        const after = callCell('COEF', [col(moved), col(y), 'pearson']);
        if (before.kind !== 'value' || after.kind !== 'value') {
          expectNone(sameOutcome(before, after, 0, 0), 'COEF refused one of the two');
          return;
        }
        const r0 = before.value as number;
        const r1 = after.value as number;
        // 1e-12 relative, plus n * 2^-52 absolute: the rounding left in the co-moment sums is at most about n units
        // of 2^-53 of sum |dx dy| <= sqrt(Sxx Syy) (Cauchy-Schwarz), whatever r is, so a tiny r is only good to that.
        expectNone(answerDifferences(r1, sign * r0, 1e-12, x.length * 2 ** -52), `r(a + b x) with a = ${a}, b = ${b}`);

        const mirror = (t: string) => (sign > 0 ? t : t === 'positive' ? 'negative' : t === 'negative' ? 'positive' : t);
        for (const tail of TAILS) {
          const p0 = callCell('PVALUE', [col(x), col(y), tail, 'pearson']);
          const p1 = callCell('PVALUE', [col(moved), col(y), mirror(tail), 'pearson']);
          expectNone(sameOutcome(p0, p1, 1e-9, 0), `p-value, tail ${tail}`);
        }
        const i0 = callCell('INTERVAL', [col(x), col(y), 0.95, 'pearson']);
        const i1 = callCell('INTERVAL', [col(moved), col(y), 0.95, 'pearson']);
        if (i0.kind === 'value' && i1.kind === 'value') {
          const [[lo, hi]] = i0.value as number[][];
          const expected = sign > 0 ? [[lo, hi]] : [[-hi, -lo]];
          expectNone(answerDifferences(i1.value, expected, 1e-9, 1e-13), 'interval');
        } else expectNone(sameOutcome(i0, i1, 0, 0), 'interval');
      }),
      { numRuns: RUNS },
    );
  });

  test('Spearman and Kendall are exactly unchanged (b > 0) or negated (b < 0)', () => {
    fc.assert(
      fc.property(affineCase, fc.constantFrom('spearman', 'kendall'), ([[x, y], a, k, sign], method) => {
        const moved = x.map((v) => a + sign * 2 ** k * v);
        const before = callCell('COEF', [col(x), col(y), method]);
        const after = callCell('COEF', [col(moved), col(y), method]);
        if (before.kind === 'value' && after.kind === 'value') {
          // Exact: the ranks are identical (or reversed), so the same arithmetic runs on the same numbers.
          expect((after.value as number) + 0).toBe(sign * (before.value as number) + 0);
        } else expectNone(sameOutcome(before, after, 0, 0), method);
      }),
      { numRuns: RUNS },
    );
  });
});

/**
 * Functions whose answer does not depend on the order of the rows. Functions that name rows (FLAGS, REPORT) or
 * test row order (CHECKS' Durbin-Watson row) are not listed; CHECKS and REPORT have their own test in
 * checks-row-order.test.ts.
 */
const ROW_EXCHANGEABLE = ['COEF', 'INTERVAL', 'PVALUE', 'PAIRS', 'DIFF_GROUPS', 'DIFF_SHARED', 'DIFF_SEPARATE', 'PARTIAL', 'MATRIX'];
/** Functions whose answer does not depend on the unit of any column (REPORT prints the slope: it does). */
const UNIT_FREE = [...ROW_EXCHANGEABLE, 'CHECKS', 'FLAGS'];

/**
 * CHECKS under rescaling: its statistics, p-values and verdicts. The "What it means" text prints numbers such as
 * a skewness of 1e-17 (rounding noise around 0) whose digits may differ, so it is not compared. The outlier row
 * reports the largest studentized residual with its sign: with two residuals of exactly equal size and opposite
 * sign either is the largest, so only its size is compared.
 */
function checksDifferences(a: unknown, b: unknown): string[] {
  const ra = a as unknown[][];
  const rb = b as unknown[][];
  if (ra.length !== rb.length) return [`${ra.length} rows vs ${rb.length}`];
  const out: string[] = [];
  ra.forEach((row, i) => {
    if (i === 0) return;
    const signless = /outlier/i.test(String(row[0]));
    for (const c of [2, 3]) {
      let u = row[c];
      let v = rb[i][c];
      if (signless && typeof u === 'number' && typeof v === 'number') [u, v] = [Math.abs(u), Math.abs(v)];
      // A studentized residual above 1,000 comes from a leave-one-out spread computed as a difference of nearly
      // equal sums (the other rows on a line to rounding): good to about 1e-7 (fixed case in found-inputs.test.ts).
      const rel = signless && typeof u === 'number' && typeof v === 'number' && Math.max(Math.abs(u), Math.abs(v)) > 1000 ? 1e-6 : 1e-9;
      out.push(...answerDifferences(u, v, rel, 1e-13).map((d) => `${String(row[0])} column ${c}: ${d}`));
    }
    const nearAlpha = typeof row[3] === 'number' && Math.abs(row[3] - 0.05) < 1e-9;
    if (row[4] !== rb[i][4] && !nearAlpha) out.push(`${String(row[0])} verdict ${String(row[4])} vs ${String(rb[i][4])}`);
  });
  return out;
}

/** Per-function comparison where the default (every cell within tolerance) does not apply. */
const COMPARE: Record<string, (a: unknown, b: unknown) => string[]> = { CHECKS: checksDifferences };

interface CleanCall {
  args: unknown[];
  /** Per matrix argument, its columns (each a list of numbers), in the order they were laid out. */
  columns: number[][][];
}

/** A well-formed call of f from metadata: clean numeric columns of one length, option words or omitted scalars. */
function cleanCall(f: FunctionMeta): fc.Arbitrary<CleanCall> {
  // @requiresParameterAddresses: Excel appends the Invocation; the ranges start in row 2 of Sheet1.
  const invocation = f.options?.requiresParameterAddresses ? [{ parameterAddresses: f.parameters.map(() => 'Sheet1!B2:B41'), address: 'Sheet1!H2' }] : [];
  const matrix = f.parameters.filter((p) => p.dimensionality === 'matrix');
  const widths = matrix.map((p) => (takesBlock(p) ? 2 : 1));
  const total = widths.reduce((s, w) => s + w, 0);
  const scalars = fc.tuple(
    ...f.parameters.map((p) => {
      if (p.dimensionality === 'matrix') return fc.constant(null);
      const words = optionWords(p);
      if (p.type === 'boolean') return fc.constant(null);
      if (p.type === 'number') return fc.constantFrom(null, 0.9, 0.95);
      return words.length ? fc.constantFrom<unknown>(null, ...words) : fc.constant(null);
    }),
  );
  return fc.tuple(cleanColumns(total, 6, 40), scalars).map(([columns, sc]) => {
    let next = 0;
    let m = 0;
    const perParam: number[][][] = [];
    const args = f.parameters.map((p, i) => {
      if (p.dimensionality !== 'matrix') return sc[i];
      const mine = columns.slice(next, next + widths[m]);
      next += widths[m++];
      perParam.push(mine);
      return mine[0].map((_, r) => mine.map((c) => c[r]));
    });
    return { args: [...args, ...invocation], columns: perParam };
  });
}

/** The same call with each matrix argument rebuilt from transformed columns. */
function rebuild(f: FunctionMeta, call: CleanCall, transform: (column: number[], param: number, index: number) => number[]): unknown[] {
  let m = 0;
  const rebuilt = f.parameters.map((p, i) => {
    if (p.dimensionality !== 'matrix') return call.args[i];
    const cols = call.columns[m].map((c, j) => transform(c, m, j));
    m++;
    return cols[0].map((_, r) => cols.map((c) => c[r]));
  });
  return [...rebuilt, ...call.args.slice(f.parameters.length)];
}

/** Differences between two outcomes of `id`, with the function's own comparison where it has one. */
function outcomeDifferences(id: string, a: Outcome, b: Outcome, rel: number, abs: number): string[] {
  const compare = COMPARE[id];
  if (compare && a.kind === 'value' && b.kind === 'value') return compare(a.value, b.value);
  return sameOutcome(a, b, rel, abs);
}

const present = (ids: string[]) => ids.map((id) => [id, requireFunction(id)] as const);

describe('shuffling rows', () => {
  test.each(present(ROW_EXCHANGEABLE))('%s: the same permutation of every column changes no answer', (id, f) => {
    fc.assert(
      fc.property(
        cleanCall(f).chain((call) => fc.tuple(fc.constant(call), permutation(call.columns[0][0].length))),
        ([call, perm]) => {
          const shuffled = rebuild(f, call, (c) => perm.map((k) => c[k]));
          expectNone(sameOutcome(callCell(id, call.args), callCell(id, shuffled), 1e-9, 1e-13), `${id} rows ${JSON.stringify(perm)}`);
        },
      ),
      { numRuns: Math.ceil(RUNS / 2) },
    );
  });
});

/**
 * Exponents k for each column: a common base in [-600, 600] plus a spread in [-300, 300], so |k| <= 900 and two
 * columns differ by at most 2^600 (a slope of y on x then stays far inside the range of doubles; units that differ
 * by 1e308 are a separate, fixed case in found-inputs.test.ts).
 */
function exponentsFor(columns: number): fc.Arbitrary<number[]> {
  return fc
    .tuple(fc.integer({ min: -600, max: 600 }), fc.array(fc.integer({ min: -300, max: 300 }), { minLength: columns, maxLength: columns }))
    .map(([base, spread]) => spread.map((d) => base + d));
}

describe('rescaling a column by a power of two', () => {
  test.each(present(UNIT_FREE))('%s: multiplying each column by its own 2^k, |k| <= 900, changes no answer', (id, f) => {
    const columnCount = f.parameters.filter((p) => p.dimensionality === 'matrix').reduce((s, p) => s + (takesBlock(p) ? 2 : 1), 0);
    fc.assert(
      fc.property(cleanCall(f), exponentsFor(columnCount), (call, exponents) => {
        let k = 0;
        const flat: number[] = [];
        call.columns.forEach((cols) => cols.forEach(() => flat.push(exponents[k++])));
        let index = 0;
        const scaled = rebuild(f, call, (c) => {
          const s = 2 ** flat[index++];
          return c.map((v) => v * s);
        });
        expectNone(outcomeDifferences(id, callCell(id, call.args), callCell(id, scaled), 1e-9, 1e-13), `${id} scaled by 2^${JSON.stringify(flat)}`);
      }),
      { numRuns: Math.ceil(RUNS / 2) },
    );
  });
});

/**
 * RESIDUALS names each pair's sheet row and carries y's unit, so it is in neither list above; its own forms of the
 * same properties: a shuffle of the rows moves each pair's fitted value and residual with it (the sheet rows stay
 * in order), and x * 2^a, y * 2^b multiply every fitted value and residual by 2^b exactly. Tolerance 1e-9
 * relative, plus 1e-12 of the largest |y| (a residual of an exact line is rounding noise around 0).
 */
describe('RESIDUALS', () => {
  requireFunction('RESIDUALS');
  const at = (n: number) => ({ parameterAddresses: [`Sheet1!B2:B${n + 1}`, `Sheet1!C2:C${n + 1}`], address: 'Sheet1!H2' });
  const block = (o: Outcome): number[][] | null => (o.kind === 'value' ? (o.value as number[][]) : null);
  /** Differences between `got` and `want`, row by row: the sheet row exactly, fitted and residual within tolerance. */
  function rowDifferences(got: number[][], want: number[][], yScale: number): string[] {
    if (got.length !== want.length) return [`${got.length} rows vs ${want.length}`];
    const out: string[] = [];
    got.forEach((r, i) => {
      if (r[0] !== want[i][0]) out.push(`row ${i}: sheet row ${r[0]} vs ${want[i][0]}`);
      for (const j of [1, 2]) if (!close(r[j], want[i][j], 1e-9, 1e-12 * yScale)) out.push(`row ${i} column ${j}: ${r[j]} vs ${want[i][j]}`);
    });
    return out;
  }
  const top = (y: number[]) => Math.max(...y.map(Math.abs));

  test('a shuffle of the rows moves each fitted value and residual with its pair', () => {
    fc.assert(
      fc.property(cleanColumns(2, 6, 40).chain(([x, y]) => fc.tuple(fc.constant([x, y] as const), permutation(x.length))), ([[x, y], perm]) => {
        const n = x.length;
        const a = callCell('RESIDUALS', [col(x), col(y), at(n)]);
        const b = callCell('RESIDUALS', [col(perm.map((k) => x[k])), col(perm.map((k) => y[k])), at(n)]);
        const ra = block(a);
        const rb = block(b);
        if (!ra || !rb) return expectNone(sameOutcome(a, b, 0, 0), 'RESIDUALS refusals');
        const moved = perm.map((k, i) => [ra[i][0], ra[k][1], ra[k][2]]);
        expectNone(rowDifferences(rb, moved, top(y)), `RESIDUALS rows ${JSON.stringify(perm)}`);
      }),
      { numRuns: Math.ceil(RUNS / 2) },
    );
  });

  test('x * 2^a and y * 2^b, |a|, |b| <= 900: every fitted value and residual times 2^b', () => {
    fc.assert(
      fc.property(cleanColumns(2, 6, 40), exponentsFor(2), ([x, y], [ka, kb]) => {
        const n = x.length;
        const a = callCell('RESIDUALS', [col(x), col(y), at(n)]);
        const b = callCell('RESIDUALS', [col(x.map((v) => v * 2 ** ka)), col(y.map((v) => v * 2 ** kb)), at(n)]);
        const ra = block(a);
        const rb = block(b);
        if (!ra || !rb) return expectNone(sameOutcome(a, b, 0, 0), 'RESIDUALS refusals');
        const s = 2 ** kb;
        expectNone(rowDifferences(rb, ra.map((r) => [r[0], r[1] * s, r[2] * s]), top(y) * s), `RESIDUALS scaled by 2^${ka}, 2^${kb}`);
      }),
      { numRuns: Math.ceil(RUNS / 2) },
    );
  });
});

describe('duplicating every row', () => {
  test('leaves the coefficient unchanged for every method', () => {
    fc.assert(
      fc.property(cleanColumns(2, 3), fc.constantFrom(...METHODS), ([x, y], method) => {
        const once = callCell('COEF', [col(x), col(y), method]);
        const twice = callCell('COEF', [col([...x, ...x]), col([...y, ...y]), method]);
        // A refusal (a constant column, say) must be refused the same way twice over; an answer must stay the same.
        if (once.kind === 'value') expectNone(sameOutcome(once, twice, 1e-12, 1e-15), `COEF ${method} of duplicated rows`);
        else expect([once.kind, twice.kind, once.kind === 'host-error' && twice.kind === 'host-error' && once.code === twice.code]).toEqual(['host-error', 'host-error', true]);
      }),
      { numRuns: RUNS },
    );
  });
});
