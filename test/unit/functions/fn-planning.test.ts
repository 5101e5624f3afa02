/**
 * The planning cell functions, called as Excel calls them (null for omitted arguments). Expected values: the
 * exact-power reference from mpmath 1.2.1 / scipy 1.10.1 (test/fixtures/compare/power-exact-mpmath.json) and
 * the test/references.md sample sizes.
 */
import { DETECTABLE, POWER, SAMPLE_SIZE } from '../../../src/functions/fn-planning';
import { expectRel } from '../../helpers/close';
import { expectAbs } from '../stats/compare/fixtures';
import { EXACT } from '../stats/compare/fixtures-exact';
import { cellError } from '../../helpers/cell-error';

const omit = null as unknown as number;
const omitText = null as unknown as string;

describe('answers', () => {
  test('POWER with defaults (alpha .05, both tails) and with a tail (mpmath)', () => {
    const both = EXACT.power.find((c) => c.r === 0.3 && c.n === 84)!;
    expectRel(POWER(0.3, 84), both.power, 1e-6);
    expectRel(POWER(0.3, 84, omit, omitText), both.power, 1e-6);
    const pos = EXACT.power.find((c) => c.r === 0.3 && c.n === 50 && c.tail === 'positive')!;
    expectRel(POWER(0.3, 50, 0.05, 'positive'), pos.power, 1e-6);
  });

  test('SAMPLE_SIZE: test/references.md 782, 84, 29 with defaults; one-sided from the mpmath scan', () => {
    expect(SAMPLE_SIZE(0.1)).toBe(782);
    expect(SAMPLE_SIZE(0.3, omit, omit, omitText)).toBe(84);
    expect(SAMPLE_SIZE(0.5, 0.8, 0.05, 'both')).toBe(29);
    expect(SAMPLE_SIZE(0.3, 0.9, omit, 'positive')).toBe(92);
    expect(SAMPLE_SIZE(-0.25, omit, omit, 'negative')).toBe(97);
  });

  test('DETECTABLE (mpmath root), negative for tail "negative"', () => {
    expectAbs(DETECTABLE(84), 0.2998783569766054, 1e-6);
    expectAbs(DETECTABLE(30, 0.8, 0.05, 'negative'), -0.4372700591545796, 1e-6);
  });
});

describe('bad input', () => {
  test('POWER', () => {
    expect(cellError(() => POWER(1, 50)).message).toMatch(/r must lie strictly between -1 and 1/);
    expect(cellError(() => POWER(0.3, 3)).message).toMatch(/n must be a whole number of rows from 4/);
    expect(cellError(() => POWER(0.3, 40.5)).message).toMatch(/whole number/);
    expect(cellError(() => POWER(0.3, 50, 0)).message).toMatch(/alpha must be between 0 and 1/);
    expect(cellError(() => POWER(0.3, 50, omit, 'greater')).message).toMatch(/tail must be one of/);
    expect(cellError(() => POWER('0.3' as unknown as number, 50)).message).toMatch(/r must be a number/);
    expect(cellError(() => POWER(omit, 50)).code).toBe('#VALUE!');
  });

  test('SAMPLE_SIZE', () => {
    expect(cellError(() => SAMPLE_SIZE(0)).message).toMatch(/r must not be 0/);
    expect(cellError(() => SAMPLE_SIZE(0.3, 1.2)).message).toMatch(/power must be between 0 and 1/);
    expect(cellError(() => SAMPLE_SIZE(0.3, omit, omit, 'negative')).message).toMatch(/test for a negative correlation cannot detect r = 0.3/);
    expect(cellError(() => SAMPLE_SIZE(1e-6)).message).toMatch(/more than 1,000,000,000 rows/);
    expect(cellError(() => SAMPLE_SIZE(0.3, 'high' as unknown as number)).message).toMatch(/power must be a number/);
  });

  test('DETECTABLE', () => {
    expect(cellError(() => DETECTABLE(2)).message).toMatch(/whole number of rows from 4/);
    expect(cellError(() => DETECTABLE(50, 0)).message).toMatch(/power must be between 0 and 1/);
    expect(cellError(() => DETECTABLE(50, 0.8, 1)).message).toMatch(/alpha must be between 0 and 1/);
  });
});
