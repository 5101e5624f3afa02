/**
 * Generators of what Excel can hand a custom function: cell values of every kind, single-column and single-row
 * ranges (and, sometimes, blocks of the wrong shape or length), scalars, and option words. Arguments are built
 * from each parameter's metadata (type, dimensionality, optional, and the quoted option words its description
 * lists), so a function that lands later gets sensible and hostile calls without new code here.
 */
import fc from 'fast-check';
import { FunctionMeta, ParamMeta } from './registry';

/** Markup and formula-like text that must stay inert wherever it ends up. */
export const HOSTILE_TEXT = [
  '<img src=x onerror=alert(1)>',
  '<script>alert(1)</script>',
  '"><svg onload=alert(1)>',
  "javascript:alert('x')",
  '=HYPERLINK("http://example.invalid","x")',
  '@SUM(A1)',
  '&lt;b&gt;',
  '\u202Ereversed',
  '',
  ' ',
  'NaN',
  'Infinity',
  '1e999',
  '1.5',
  '-0',
  '#N/A',
  '#VALUE!',
  'TRUE',
];

/**
 * Cell numbers are generated with magnitudes from 1e-300 to 1e300 (or 0): the range the functions promise to
 * handle. (Excel itself keeps no subnormal numbers at all.)
 */
export const noSubnormal = (v: number): number => (Math.abs(v) < 1e-300 ? 0 : Math.abs(v) > 1e300 ? Math.sign(v) * 1e300 : v);

/** A finite number of any magnitude, 1e-300 to 1e300, either sign, plus the small integers people type. */
export const anyMagnitude: fc.Arbitrary<number> = fc.oneof(
  fc.integer({ min: -1000, max: 1000 }),
  fc
    .tuple(fc.double({ min: 1, max: 10, noNaN: true }), fc.integer({ min: -300, max: 300 }), fc.boolean())
    .map(([m, e, neg]) => (neg ? -1 : 1) * m * Math.pow(10, e))
    .filter((v) => Number.isFinite(v)),
  fc.constantFrom(0, -0, 1e-300, -1e-300, 1e300, -1e300, 9.99e299, -9.99e299),
  fc.double({ noNaN: true, noDefaultInfinity: true }).map(noSubnormal),
);

/** Anything a cell can hold as Excel passes it (blank as null or "", text, booleans), plus non-finite numbers. */
export const anyCell: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: anyMagnitude },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(null, '', undefined) },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(...HOSTILE_TEXT) },
  { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(NaN, Infinity, -Infinity) },
);

export type Orientation = 'column' | 'row';

/** A list of cells laid out as a single column (n x 1) or a single row (1 x n). */
export function layout(cells: unknown[], orientation: Orientation): unknown[][] {
  return orientation === 'row' ? [cells.slice()] : cells.map((c) => [c]);
}

/**
 * `count` correlated numeric columns of one random length: a shared component plus noise, each column scaled to
 * its own random magnitude (10^-300 to 10^300) and sign.
 */
export function numericColumns(count: number, minRows = 3, maxRows = 40): fc.Arbitrary<number[][]> {
  return fc.integer({ min: minRows, max: maxRows }).chain((n) =>
    fc
      .tuple(
        fc.array(fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n, maxLength: n }), {
          minLength: count + 1,
          maxLength: count + 1,
        }),
        fc.array(fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.integer({ min: -300, max: 300 })), {
          minLength: count,
          maxLength: count,
        }),
      )
      .map(([noise, shape]) =>
        shape.map(([weight, exponent], j) =>
          noise[0].map((common, i) => (weight * common + noise[j + 1][i]) * Math.pow(10, exponent)).map((v) => (Number.isFinite(v) ? noSubnormal(v) : 0)),
        ),
      ),
  );
}

/** True for a range parameter that takes a block of columns side by side (MATRIX's data, PARTIAL's controls). */
export function takesBlock(p: ParamMeta): boolean {
  return /side by side|block of/i.test(p.description ?? '');
}

/** Valid option words a parameter lists in quotes in its description, e.g. "pearson", "both". */
export function optionWords(p: ParamMeta): string[] {
  const words = [...(p.description ?? '').matchAll(/"([^"]+)"/g)].map((m) => m[1]);
  return [...new Set(words)];
}

/** Numbers a scalar parameter accepts, from what its description says about it. */
const CORRELATIONS = [-0.8, -0.3, 0.1, 0.3, 0.42, 0.5, 0.9];
const PROBABILITIES = [0.8, 0.9, 0.95, 0.99, 0.05, 0.01, 0.5];
const SIZES = [4, 5, 10, 30, 38, 84, 100, 1000];
const PLAUSIBLE_NUMBERS = [...CORRELATIONS, ...PROBABILITIES, ...SIZES];

function plausibleNumbers(p: ParamMeta): number[] {
  const d = p.description ?? '';
  if (/between -1 and 1/.test(d)) return CORRELATIONS;
  if (/between 0 and 1/.test(d)) return PROBABILITIES;
  if (/whole number|at least/.test(d)) return SIZES;
  return PLAUSIBLE_NUMBERS;
}
const HOSTILE_NUMBERS = [0, 1, -1, 2, -2, 1.5, 3, 1e-300, -1e-300, 1e300, -1e300, 1e9, 2 ** 31, 0.999999999999, -0.999999999999, 5e-300];

function scalarArb(p: ParamMeta, hostile: boolean): fc.Arbitrary<unknown> {
  const words = optionWords(p);
  const omitted = fc.constantFrom<unknown>(null);
  const wrongType = fc.oneof(fc.constantFrom<unknown>(...HOSTILE_TEXT), fc.boolean(), fc.constantFrom<unknown>(null, '', NaN, Infinity));
  let typed: fc.Arbitrary<unknown>;
  switch (p.type) {
    case 'number':
      typed = hostile
        ? fc.oneof(fc.constantFrom(...PLAUSIBLE_NUMBERS, ...HOSTILE_NUMBERS), anyMagnitude)
        : fc.constantFrom(...plausibleNumbers(p));
      break;
    case 'boolean':
      typed = fc.boolean();
      break;
    case 'string':
    default: {
      const valid = words.length > 0 ? fc.constantFrom(...words) : fc.constantFrom('');
      const cased = valid.chain((w) => fc.constantFrom(w, w.toUpperCase(), ` ${w} `, w.charAt(0).toUpperCase() + w.slice(1)));
      typed = hostile
        ? fc.oneof(cased, fc.constantFrom<unknown>(...HOSTILE_TEXT), fc.string({ maxLength: 10 }), fc.constantFrom<unknown>('pearsonn', 'both sides', 'kendal'))
        : p.type === 'string' || words.length > 0
          ? cased
          : fc.oneof(fc.constantFrom(...PLAUSIBLE_NUMBERS), cased);
    }
  }
  const parts: fc.Arbitrary<unknown>[] = [typed];
  if (p.optional) parts.push(omitted);
  if (hostile) parts.push(wrongType);
  return fc.oneof(...parts);
}

/** A range argument of any shape and content, including the wrong shape (m x k blocks) and empty rows. */
const hostileRange: fc.Arbitrary<unknown[][]> = fc.oneof(
  { weight: 4, arbitrary: fc.tuple(fc.array(anyCell, { minLength: 0, maxLength: 50 }), fc.constantFrom<Orientation>('column', 'row')).map(([c, o]) => layout(c, o)) },
  {
    weight: 1,
    arbitrary: fc
      .tuple(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 6 }))
      .chain(([r, c]) => fc.array(fc.array(anyCell, { minLength: c, maxLength: c }), { minLength: r, maxLength: r })),
  },
  { weight: 1, arbitrary: fc.constantFrom<unknown[][]>([[]], [[null]], [['']], [[1]]) },
);

/**
 * Arguments for one call of `f`, as Excel passes them: matrix parameters as 2-D arrays, omitted optionals as null.
 * Half the calls are well-formed (numeric columns of one length, blocks of 2-5 columns where a parameter takes a
 * block, option words from the metadata, plausible numbers), so that answers, not only refusals, are exercised;
 * the other half are hostile in every parameter.
 */
export function argsFor(f: FunctionMeta): fc.Arbitrary<unknown[]> {
  const matrixParams = f.parameters.filter((p) => p.dimensionality === 'matrix');
  const wellFormed = fc
    .tuple(
      fc.array(fc.integer({ min: 2, max: 5 }), { minLength: matrixParams.length, maxLength: matrixParams.length }),
      // One orientation for all ranges of a call, or (one call in five) each its own: a row pairs with a column.
      fc.oneof(
        { weight: 4, arbitrary: fc.constantFrom<Orientation>('column', 'row').map((o) => matrixParams.map(() => o)) },
        { weight: 1, arbitrary: fc.array(fc.constantFrom<Orientation>('column', 'row'), { minLength: matrixParams.length, maxLength: matrixParams.length }) },
      ),
      fc.tuple(...f.parameters.map((p) => (p.dimensionality === 'matrix' ? fc.constant(null) : scalarArb(p, false)))),
      // A few cells blanked or turned to text in otherwise clean columns.
      fc.array(fc.tuple(fc.nat(), fc.nat(), fc.constantFrom<unknown>(null, '', 'n/a', true)), { maxLength: 3 }),
    )
    .chain(([blockWidths, orientations, scalars, holes]) => {
      const widths = matrixParams.map((p, m) => (takesBlock(p) ? blockWidths[m] : 1));
      const total = widths.reduce((s, w) => s + w, 0);
      return (total > 0 ? numericColumns(total) : fc.constant<number[][]>([])).map((columns) => {
        const cellColumns = columns.map((c) => c.slice() as unknown[]);
        for (const [which, row, value] of holes) {
          const c = cellColumns[which % Math.max(1, cellColumns.length)];
          if (c && c.length > 0) c[row % c.length] = value;
        }
        let m = 0;
        let next = 0;
        return f.parameters.map((p, i) => {
          if (p.dimensionality !== 'matrix') return scalars[i];
          const w = widths[m];
          const mine = cellColumns.slice(next, next + w);
          next += w;
          const orientation = orientations[m++];
          if (w === 1) return layout(mine[0], orientation);
          // A block: columns side by side (or, for row-oriented calls, rows one above the other).
          return orientation === 'row' ? mine : mine[0].map((_, r) => mine.map((col) => col[r]));
        });
      });
    });
  const hostile = fc.tuple(...f.parameters.map((p) => (p.dimensionality === 'matrix' ? hostileRange : scalarArb(p, true))));
  const args = fc.oneof(wellFormed, hostile) as fc.Arbitrary<unknown[]>;
  if (!f.options?.requiresParameterAddresses) return args;
  // @requiresParameterAddresses: Excel appends an Invocation whose parameterAddresses name each argument's range.
  return fc.tuple(args, invocationArb(f.parameters.length)).map(([a, inv]) => [...a, inv]);
}

/** Addresses as Excel writes them, plus ones that do not match the range or carry markup in the sheet name. */
const addressArb: fc.Arbitrary<unknown> = fc.oneof(
  fc
    .tuple(fc.constantFrom('Sheet1', "'Q3 data'", "'<img src=x onerror=alert(1)>'", 'Data'), fc.constantFrom('B', 'C', 'XFD', 'AA'), fc.integer({ min: 1, max: 1048576 }), fc.integer({ min: 0, max: 60 }))
    .map(([sheet, column, start, rows]) => `${sheet}!${column}${start}:${column}${Math.min(1048576, start + rows)}`),
  fc.constantFrom<unknown>('Sheet1!B2', 'Sheet1!B2:AO2', 'Sheet1!$B$2:$B$40', '', 'not an address', null, undefined, 42),
);

function invocationArb(parameters: number): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 4, arbitrary: fc.array(addressArb, { minLength: parameters, maxLength: parameters }).map((parameterAddresses) => ({ parameterAddresses, address: 'Sheet1!H2' })) },
    { weight: 1, arbitrary: fc.constantFrom<unknown>(undefined, null, {}, { parameterAddresses: null }, { parameterAddresses: [] }) },
  );
}
