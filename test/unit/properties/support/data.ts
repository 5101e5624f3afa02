/**
 * Clean paired data for invariance properties: columns of one length, values 0 or of magnitude 1e-3 to 200 (so
 * that power-of-two rescaling by up to 2^±900 stays in the normal floating-point range), sometimes on a coarse grid
 * so that ties occur (ranks and Kendall's tau-b with ties are exercised too).
 *
 * The values are drawn without fast-check's bias towards edge values (0, ±1, tiny numbers), which otherwise makes
 * columns of mostly zeros: data lying on a line to within rounding, where an answer is only as accurate as the
 * problem is well-conditioned, not to the 1e-9 these properties ask. Such data are kept as fixed cases with their
 * own expectations (found-inputs.test.ts).
 */
import fc from 'fast-check';

/** `count` correlated columns of n rows, n in [minRows, maxRows]. */
export function cleanColumns(count: number, minRows = 4, maxRows = 40): fc.Arbitrary<number[][]> {
  return fc
    .tuple(
      fc.integer({ min: minRows, max: maxRows }),
      fc.boolean(), // coarse grid: ties
      fc.array(fc.noBias(fc.double({ min: -1, max: 1, noNaN: true })), { minLength: count, maxLength: count }),
    )
    .chain(([n, grid, weights]) =>
      fc
        .array(fc.array(fc.noBias(fc.double({ min: -1, max: 1, noNaN: true })), { minLength: n, maxLength: n }), {
          minLength: count + 1,
          maxLength: count + 1,
        })
        .map((noise) =>
          weights.map((w, j) =>
            noise[0].map((common, i) => {
              const v = 100 * (w * common + noise[j + 1][i]);
              // Zero or |v| >= 1e-3: never subnormal, even after rescaling by 2^-900.
              return grid ? Math.round(v / 25) : Math.abs(v) < 1e-3 ? 0 : v;
            }),
          ),
        ),
    );
}

/** A permutation of 0..n-1 (Fisher-Yates driven by fast-check's random numbers). */
export function permutation(n: number): fc.Arbitrary<number[]> {
  return fc.array(fc.nat(), { minLength: n, maxLength: n }).map((r) => {
    const p = Array.from({ length: n }, (_, i) => i);
    for (let i = n - 1; i > 0; i--) {
      const j = r[i] % (i + 1);
      [p[i], p[j]] = [p[j], p[i]];
    }
    return p;
  });
}

export const col = (v: unknown[]): unknown[][] => v.map((a) => [a]);
export const row = (v: unknown[]): unknown[][] => [v.slice()];
