/**
 * Shuffling rows changes nothing in CHECKS but the row-order check (Durbin-Watson): the statistics and p-values
 * of the other rows (normality, straight line, even spread, outliers, influence) do not depend on the order of the
 * rows, so they must agree to 1e-9 relative (summation order differs). The "What it means" text names sheet rows,
 * which move with the data, so it is not compared; the verdicts must agree except where a p-value sits within
 * rounding of alpha. REPORT's numbers other than its flags (which name rows) are compared the same way.
 * Runs on the built bundle; needs `npm run build` first.
 */
import fc from 'fast-check';
import { close } from './support/compare';
import { cleanColumns, col, permutation } from './support/data';
import { callCell, describeOutcome } from './support/registry';

const RUNS = Number(process.env.COVARY_PROPERTY_RUNS ?? 80);
const ROW_ORDER = /row order|durbin|watson/i;
const invocation = (n: number) => ({ parameterAddresses: [`Sheet1!B2:B${n + 1}`, `Sheet1!C2:C${n + 1}`, null], address: 'Sheet1!E2' });

/**
 * 1e-9 relative, except for a studentized residual above 1,000: the other rows then lie on a line to within
 * rounding, and the leave-one-out spread behind the statistic is a difference of nearly equal sums, good to about
 * 1e-7 (a fixed case in found-inputs.test.ts holds the accurate value).
 */
function tolerance(label: string, u: number, v: number): number {
  return /outlier/i.test(label) && Math.max(Math.abs(u), Math.abs(v)) > 1000 ? 1e-6 : 1e-9;
}

const shuffledCase = cleanColumns(2, 6, 40).chain(([x, y]) => fc.tuple(fc.constant([x, y] as const), permutation(x.length)));

describe('CHECKS under a shuffle of the rows', () => {
  test('every row but the row-order check keeps its statistic, p-value and verdict', () => {
    fc.assert(
      fc.property(shuffledCase, ([[x, y], perm]) => {
        const n = x.length;
        const a = callCell('CHECKS', [col(x), col(y), null, invocation(n)]);
        const b = callCell('CHECKS', [col(perm.map((k) => x[k])), col(perm.map((k) => y[k])), null, invocation(n)]);
        if (a.kind !== 'value' || b.kind !== 'value') {
          if (a.kind === 'host-error' && b.kind === 'host-error' && a.code === b.code) return;
          throw new Error(`${describeOutcome(a)} vs ${describeOutcome(b)}`);
        }
        // An exact straight line leaves residuals of rounding size only, whose pattern depends on summation order:
        // that case is a fixed input in found-inputs.test.ts rather than left to chance here.
        const r = callCell('COEF', [col(x), col(y), null]);
        if (r.kind === 'value' && Math.abs(r.value as number) > 1 - 1e-6) return;
        const ra = a.value as unknown[][];
        const rb = b.value as unknown[][];
        expect(rb.map((r) => r[0])).toEqual(ra.map((r) => r[0]));
        const problems: string[] = [];
        let orderRows = 0;
        ra.slice(1).forEach((row, i) => {
          const other = rb[i + 1];
          if (ROW_ORDER.test(`${row[0]} ${row[1]}`)) {
            orderRows++;
            return;
          }
          // The outlier row reports the largest studentized residual with its sign; with two residuals of exactly
          // equal size and opposite sign either is the largest, and the first in row order is taken: compare sizes.
          const signless = /outlier/i.test(String(row[0]));
          for (const c of [2, 3]) {
            let u = row[c];
            let v = other[c];
            if (signless && typeof u === 'number' && typeof v === 'number') [u, v] = [Math.abs(u), Math.abs(v)];
            const same = typeof u === 'number' && typeof v === 'number' ? close(u, v, tolerance(String(row[0]), u, v), 1e-13) : u === v;
            if (!same) problems.push(`${row[0]} column ${c}: ${String(u)} vs ${String(v)}`);
          }
          const p = row[3];
          const nearAlpha = typeof p === 'number' && Math.abs(p - 0.05) < 1e-9;
          if (row[5] !== other[5] && !nearAlpha) problems.push(`${row[0]} verdict ${String(row[5])} vs ${String(other[5])}`);
        });
        expect(orderRows).toBe(1);
        if (problems.length) throw new Error(`rows ${JSON.stringify(perm)}: ${problems.join('; ')}`);
      }),
      { numRuns: RUNS },
    );
  });
});

describe('REPORT under a shuffle of the rows', () => {
  test('every number is unchanged (the flags and advice, which name rows, are not compared)', () => {
    fc.assert(
      fc.property(shuffledCase, ([[x, y], perm]) => {
        const n = x.length;
        const r = callCell('COEF', [col(x), col(y), null]);
        if (r.kind === 'value' && Math.abs(r.value as number) > 1 - 1e-6) return; // exact fits: see the CHECKS test
        const a = callCell('REPORT', [col(x), col(y), null, null, null, invocation(n)]);
        const b = callCell('REPORT', [col(perm.map((k) => x[k])), col(perm.map((k) => y[k])), null, null, null, invocation(n)]);
        if (a.kind !== 'value' || b.kind !== 'value') {
          if (a.kind === 'host-error' && b.kind === 'host-error' && a.code === b.code) return;
          throw new Error(`${describeOutcome(a)} vs ${describeOutcome(b)}`);
        }
        const ra = a.value as unknown[][];
        const rb = b.value as unknown[][];
        ra.forEach((row, i) => {
          const u = row[1];
          const v = rb[i]?.[1];
          if (typeof u === 'number' && !(typeof v === 'number' && close(u, v, 1e-9, 1e-13))) {
            throw new Error(`rows ${JSON.stringify(perm)}: ${String(row[0])}: ${u} vs ${String(v)}`);
          }
        });
      }),
      { numRuns: RUNS },
    );
  });
});
