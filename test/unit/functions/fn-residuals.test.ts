/**
 * RESIDUALS called as Excel calls it (2-D arrays; an invocation with the argument addresses, as
 * @requiresParameterAddresses makes Excel pass). Fitted values and residuals are held to R's lm(y ~ x),
 * fitted() and resid(), and the pairs used to R's as.integer(names(resid(fit))) (fixture and script:
 * test/fixtures/regression/residuals-r.json and residuals-r.R; R version in the fixture), at 1e-9 relative:
 * fitted values against their own size, residuals against the largest residual. Data invented.
 */
import { RESIDUALS } from '../../../src/functions/fn-residuals';
import { clearSharedPairs } from '../../../src/functions/shared-pairs';
import { cellError } from '../../helpers/cell-error';
import { R_RESIDUALS, referenceOf, residualCase, worstDifferences } from '../stats/correlation/residuals-fixture';

const col = (v: unknown[]) => v.map((a) => [a]);
const row = (v: unknown[]) => [v];
const at = (x: string, y: string) => ({ parameterAddresses: [x, y] }) as unknown as CustomFunctions.Invocation;
/** The sheet's cells for a case: R's NA as a blank, or as text in every other gap (both are skipped). */
const cells = (v: (number | null)[]) => v.map((a, i) => (a === null ? (i % 2 === 0 ? null : 'n/a') : a));
const columnOf = (t: number[][], j: number) => t.map((r) => r[j]);

beforeEach(() => clearSharedPairs());

describe(`RESIDUALS agrees with R lm(y ~ x) (${R_RESIDUALS.R})`, () => {
  test.each(R_RESIDUALS.cases.map((c) => [c.name, c] as const))('%s, a column from B5: sheet rows, fitted values, residuals', (_name, c) => {
    const n = c.x.length;
    const t = RESIDUALS(col(cells(c.x)), col(cells(c.y)), at(`Data!B5:B${4 + n}`, `Data!C5:C${4 + n}`));
    expect(t.map((r) => r.length)).toEqual(c.positions.map(() => 3));
    // Source: R as.integer(names(resid(fit))), the positions lm used, as sheet rows from row 5.
    expect(columnOf(t, 0)).toEqual(c.positions.map((p) => 4 + p));
    const worst = worstDifferences(columnOf(t, 1), columnOf(t, 2), referenceOf(c)); // source: R, see referenceOf
    expect(worst.fitted).toBeLessThanOrEqual(1e-9);
    expect(worst.residuals).toBeLessThanOrEqual(1e-9);
  });

  test('kiln-gaps as a row from C2: the first column holds sheet column numbers', () => {
    const c = residualCase('kiln-gaps');
    const t = RESIDUALS(row(cells(c.x)), row(cells(c.y)), at('Data!C2:P2', 'Data!C3:P3'));
    expect(columnOf(t, 0)).toEqual(c.positions.map((p) => 2 + p)); // source: R positions; column C is 3
    const worst = worstDifferences(columnOf(t, 1), columnOf(t, 2), referenceOf(c));
    expect(worst.residuals).toBeLessThanOrEqual(1e-9);
  });
});

describe('where each pair sits', () => {
  const c = residualCase('kiln-gaps');
  const x = col(cells(c.x));
  const y = col(cells(c.y));

  test('without an address: the 1-based position in x (R positions)', () => {
    expect(columnOf(RESIDUALS(x, y), 0)).toEqual(c.positions);
  });

  test('an address that does not describe x (another size) is not trusted: positions', () => {
    expect(columnOf(RESIDUALS(x, y, at('Data!B5:B40', 'Data!C5:C40')), 0)).toEqual(c.positions);
    expect(columnOf(RESIDUALS(x, y, at('not an address', '')), 0)).toEqual(c.positions);
  });

  test('a whole column (B:B, 1,048,576 cells) gives sheet rows from row 1', () => {
    const full = (v: (number | null)[]) => {
      const out: unknown[][] = new Array(1048576);
      for (let i = 0; i < out.length; i++) out[i] = [i === 0 ? 'header' : i <= v.length ? cells(v)[i - 1] : null];
      return out;
    };
    const t = RESIDUALS(full(c.x), full(c.y), at('Data!B:B', 'Data!C:C'));
    expect(columnOf(t, 0)).toEqual(c.positions.map((p) => 1 + p)); // data from row 2, under the header
  });
});

describe('refusals, with a message', () => {
  test('fewer than 3 pairs: #N/A', () => {
    const e = cellError(() => RESIDUALS(col([1, 'x', 3, null]), col([2, 5, 4, 7])));
    expect([e.code, e.message]).toEqual(['#N/A', 'only 2 usable pairs of numbers: at least 3 are needed (blank, text and TRUE/FALSE cells are skipped)']);
  });
  test('a constant x: #VALUE!', () => {
    const e = cellError(() => RESIDUALS(col([4, 4, 4, 4]), col([1, 2, 3, 5])));
    expect([e.code, e.message]).toEqual(['#VALUE!', 'x is constant: a straight line through the points needs x to vary']);
  });
  test('ranges of different sizes: #VALUE!', () => {
    expect(cellError(() => RESIDUALS(col([1, 2, 3, 4]), col([1, 2, 3]))).message).toMatch(/same number of cells/);
  });
});
