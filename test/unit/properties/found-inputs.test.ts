/**
 * Inputs the property tests found, kept as fixed cases so they stay fixed. Each is a call a user can make; the
 * expected answer comes from outside the project (R), or from an exact invariance (power-of-two scaling).
 * Runs on the built bundle; needs `npm run build` first.
 */
import rRef from '../../fixtures/stress/stress-r.json';
import { expectRel } from '../../helpers/close';
import { callCell, describeOutcome, isRegistered } from './support/registry';

const col = (v: number[]) => v.map((a) => [a]);
const scaled = (v: number[], s: number) => v.map((a) => a * s);

(isRegistered('PARTIAL') ? describe : describe.skip)('PARTIAL at tiny and huge magnitudes (R: cor of lm residuals)', () => {
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
