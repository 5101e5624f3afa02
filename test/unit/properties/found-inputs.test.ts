/**
 * Inputs the property tests found, kept as fixed cases so they stay fixed. Each is a call a user can make; the
 * expected answer comes from outside the project (R), or from an exact invariance (power-of-two scaling).
 * Runs on the built bundle; needs `npm run build` first.
 */
import rRef from '../../fixtures/stress/stress-r.json';
import { expectRel } from '../../helpers/close';
import { callCell, describeOutcome } from './support/registry';

const col = (v: number[]) => v.map((a) => [a]);
const scaled = (v: number[], s: number) => v.map((a) => a * s);

describe('PARTIAL at tiny and huge magnitudes (R: cor of lm residuals)', () => {
  // R 4.2.2 on the unscaled data: cor(resid(lm(x ~ z)), resid(lm(y ~ z))) (test/fixtures/stress/make-stress.R).
  // Multiplying every column by the same factor does not change a partial correlation. 1e-160 and 1e160 are
  // typical of measurements in other units (e.g. probabilities of rare events, or amounts in tiny units); squared
  // they leave the normal range of doubles, which the answer must not notice.
  test.each([1, 1e-100, 1e-160, 1e-200, 1e-300, 1e100, 1e160, 1e200, 1e300])('x, y and z all multiplied by %p', (s) => {
    const out = callCell('PARTIAL', [col(scaled(rRef.x, s)), col(scaled(rRef.y, s)), col(scaled(rRef.z, s)), null, null]);
    if (out.kind !== 'value') throw new Error(`PARTIAL refused: ${describeOutcome(out)}`);
    const [[r, lower, upper, p]] = out.value as number[][];
    expectRel(r, rRef.partial.r, 1e-12, `r at scale ${s}`);
    expectRel(p, rRef.partial.p, 1e-9, `p at scale ${s}`);
    expectRel(lower, rRef.partial.lower, 1e-9, `lower at scale ${s}`);
    expectRel(upper, rRef.partial.upper, 1e-9, `upper at scale ${s}`);
  });
});

describe('absurd sizes get a message that says what is wrong', () => {
  // REPORTED(0.99, 1e300): n far beyond any sheet. Either an answer or a refusal naming n, not the cell layer's
  // last-resort "the result is not a finite number".
  test.each([
    ['REPORTED', [0.99, 1e300, null, null, null]],
    ['REPORTED', [0.5, 1e300, null, null, null]],
  ] as const)('%s%j', (id, args) => {
    const out = callCell(id, [...args]);
    if (out.kind === 'raw-exception') throw out.error;
    if (out.kind === 'host-error') expect(out.message).not.toMatch(/not a finite number|could not compute/);
  });
});

describe('units that differ by about 1e308 between x and y (each value within 1e-300 .. 1e300)', () => {
  // Hollander & Wolfe data (R's ?cor.test example). Every check of CHECKS is unit-free (Shapiro-Wilk W, RESET F,
  // Koenker's n R^2, studentized residuals, Cook's distance, Durbin-Watson), so rescaling x by 2^-705 (~2e-212) and
  // y by 2^319 (~1e96) must not change them; only the slope in y-units-per-x-unit (2^1024 times larger) leaves the
  // range of doubles, and no check needs it in those units.
  const inv = { parameterAddresses: ['Sheet1!B2:B10', 'Sheet1!C2:C10', null], address: 'Sheet1!E2' };
  // Label, statistic, p-value, verdict (the effect's words hold figures rounded for reading, compared apart).
  const statisticsOf = (v: unknown) => (v as unknown[][]).slice(1).map((r) => [r[0], r[2], r[3], r[5]]);

  test('CHECKS(x * 2^-705, y * 2^319) = CHECKS(x, y) in every statistic, p-value and verdict', () => {
    const plain = callCell('CHECKS', [col(rRef.x), col(rRef.y), null, inv]);
    const rescaled = callCell('CHECKS', [col(scaled(rRef.x, 2 ** -705)), col(scaled(rRef.y, 2 ** 319)), null, inv]);
    if (plain.kind !== 'value' || rescaled.kind !== 'value') throw new Error(`${describeOutcome(plain)} vs ${describeOutcome(rescaled)}`);
    const a = statisticsOf(plain.value);
    const b = statisticsOf(rescaled.value);
    a.forEach((row, i) => {
      expect(b[i][0]).toBe(row[0]);
      expect(b[i][3]).toBe(row[3]);
      for (const c of [1, 2]) {
        if (typeof row[c] === 'number') expectRel(b[i][c] as number, row[c] as number, 1e-9, `${String(row[0])} column ${c}`);
        else expect(b[i][c]).toBe(row[c]);
      }
    });
  });

  test('REPORT(x * 1e-300, y * 1e300) answers: the coefficient rows as for (x, y), the slope shown or left out', () => {
    const out = callCell('REPORT', [col(scaled(rRef.x, 1e-300)), col(scaled(rRef.y, 1e300)), null, null, null, inv]);
    if (out.kind !== 'value') throw new Error(`REPORT refused: ${describeOutcome(out)}`);
    const r = (out.value as unknown[][]).find((row) => row[0] === 'r')?.[1] as number;
    expectRel(r, rRef.pearson[2].r, 1e-12, 'r (R cor.test)');
  });
});

describe('CHECKS on data that lie exactly on a line: the same answer in any row order', () => {
  // Residuals of an exact fit are rounding noise; their size and pattern depend on the order of the sums. The
  // residual checks (normal residuals, even spread, outliers, influence) must not report that noise as a
  // finding, and must say the same thing whatever the row order: both orders "not testable", or the same numbers.
  const inv = (n: number) => ({ parameterAddresses: [`Sheet1!B2:B${n + 1}`, `Sheet1!C2:C${n + 1}`, null], address: 'Sheet1!E2' });
  const cases: [string, number[], number[], number[]][] = [
    [
      'one non-zero row among 20 (x = -0.0010005807767220715, y = 0.0010000000001434122 in row 18)',
      [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, -0.0010005807767220715, 0, 0],
      [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0.0010000000001434122, 0, 0],
      [17, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 18, 1, 19, 0],
    ],
    [
      'three distinct points on y = 1039.33 x among 10 rows',
      [0, 0.0038145924060169916, 0.005008808778732074, 0, 0, 0, 0, 0, 0, 0],
      [0, 3.964623709047827, 5.205809671021407, 0, 0, 0, 0, 0, 0, 0],
      [1, 2, 3, 4, 5, 6, 7, 8, 9, 0],
    ],
  ];
  test.each(cases)('%s', (_label, x, y, perm) => {
    const a = callCell('CHECKS', [col(x), col(y), null, inv(x.length)]);
    const b = callCell('CHECKS', [col(perm.map((k) => x[k])), col(perm.map((k) => y[k])), null, inv(x.length)]);
    if (a.kind !== 'value' || b.kind !== 'value') throw new Error(`${describeOutcome(a)} vs ${describeOutcome(b)}`);
    const rows = (v: unknown) => (v as unknown[][]).slice(1).filter((r) => !/row order/i.test(String(r[0])));
    const ra = rows(a.value);
    const rb = rows(b.value);
    ra.forEach((row, i) => {
      expect([row[0], rb[i][5]]).toEqual([row[0], row[5]]); // the verdict
      for (const c of [2, 3]) {
        if (typeof row[c] === 'number') expectRel(rb[i][c] as number, row[c] as number, 1e-9, `${String(row[0])} column ${c}`);
        else expect([row[0], c, rb[i][c]]).toEqual([row[0], c, row[c]]);
      }
    });
  });
});

describe('CHECKS: a huge studentized residual does not depend on row order', () => {
  // 18 rows, all 0 but x = 0.046122331575141125 in row 8 and y = 33.63497555062446 in row 7 and -0.0010070694050302589
  // in row 17: the other rows lie exactly on a line, so one row's externally studentized residual is about 1.3e5.
  // Its leave-one-out spread must be computed without cancellation: the same value (to 1e-9) in any row order.
  const x = [0, 0, 0, 0, 0, 0, 0, 0.046122331575141125, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];
  const y = [0, 0, 0, 0, 0, 0, 33.63497555062446, 0, 0, 0, 0, 0, 0, 0, 0, 0, -0.0010070694050302589, 0];
  const perm = [13, 2, 3, 4, 5, 12, 7, 8, 9, 10, 11, 16, 6, 14, 15, 1, 17, 0];
  const inv = { parameterAddresses: ['Sheet1!B2:B19', 'Sheet1!C2:C19', null], address: 'Sheet1!E2' };
  test('the outlier statistic agrees to 1e-9 between the two orders', () => {
    const a = callCell('CHECKS', [col(x), col(y), null, inv]);
    const b = callCell('CHECKS', [col(perm.map((k) => x[k])), col(perm.map((k) => y[k])), null, inv]);
    if (a.kind !== 'value' || b.kind !== 'value') throw new Error(`${describeOutcome(a)} vs ${describeOutcome(b)}`);
    const outlier = (v: unknown) => (v as unknown[][]).find((r) => /outlier/i.test(String(r[0])))!;
    const [sa, sb] = [outlier(a.value)[2], outlier(b.value)[2]];
    expect(typeof sa).toBe('number');
    expectRel(Math.abs(sb as number), Math.abs(sa as number), 1e-9, 'largest studentized residual');
  });
});
