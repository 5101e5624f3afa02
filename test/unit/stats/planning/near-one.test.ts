/**
 * The exact power near |rho| = 1, where the series for 2F1(1/2, 1/2; n - 1/2; x) converges slowly and POWER,
 * SAMPLE_SIZE and DETECTABLE used to take tens of seconds: against mpmath 1.2.1 at 40 digits
 * (test/fixtures/power/near-one-mpmath.py and its JSON; Hotelling's 1953 density integrated directly).
 */
import nearJson from '../../../fixtures/power/near-one-mpmath.json';
import { hypergeometricHalves } from '../../../../src/stats/distributions/r-distribution';
import { correlationPower, detectableCorrelation, sampleSizeForCorrelation } from '../../../../src/stats/planning/power';

const ref = nearJson as unknown as {
  hypergeometric: { n: number; x: number; value: number }[];
  power: { rho: number; n: number; alpha: number; power: number }[];
};

test.each(ref.hypergeometric.map((c) => [c.n, c.x, c] as const))('2F1(1/2, 1/2; n - 1/2; x), n = %d, x = %f (mpmath hyp2f1)', (_n, _x, c) => {
  expect(Math.abs(hypergeometricHalves(c.n - 0.5, c.x) - c.value) / c.value).toBeLessThan(1e-14);
});

test.each(ref.power.map((c) => [c.rho, c.n, c] as const))('power at rho = %f, n = %d (mpmath quad of the exact density)', (_r, _n, c) => {
  expect(Math.abs(correlationPower(c.rho, c.n, { alpha: c.alpha, tail: 'both' }).power - c.power)).toBeLessThan(1e-10);
});

test('the calls that hung answer: POWER, SAMPLE_SIZE and DETECTABLE at |r| within 1e-10 of 1', () => {
  // The power tends to 1 as rho tends to 1 at any n >= 4 (the distribution of r collapses on rho).
  expect(correlationPower(0.9999999999, 4, { alpha: 0.05, tail: 'both' }).power).toBeGreaterThan(1 - 1e-9);
  expect(correlationPower(-0.9999999999, 5, { alpha: 0.05, tail: 'both' }).power).toBeGreaterThan(1 - 1e-9);
  for (const power of [0.5, 0.8, 1e-10, 0.9999999999]) {
    expect(sampleSizeForCorrelation(0.999999999999, power, { alpha: 0.05, tail: 'both' }).n).toBe(4);
  }
  const d = detectableCorrelation(4, 0.9999999999, { alpha: 0.05, tail: 'both' }).rho;
  expect(d).toBeGreaterThan(0.99);
  expect(d).toBeLessThan(1);
});
