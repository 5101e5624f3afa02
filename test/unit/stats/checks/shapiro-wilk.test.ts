/**
 * Shapiro-Wilk (Royston 1995, AS R94) against R 4.2.2's shapiro.test (fixture checks-r.json, script checks-r.R)
 * and the scipy test-suite example quoted in test/references.md.
 */
import { shapiroWilk } from '../../../../src/stats/checks/shapiro-wilk';
import { StatsInputError } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import { R } from './fixtures';
import { normals } from './simulated-data';

describe('Shapiro-Wilk W and p', () => {
  test('scipy test data (test/references.md): W = 0.90047299861907959, p = 0.042089745402336121', () => {
    const d = [0.11, 7.87, 4.61, 10.14, 7.95, 3.14, 0.46, 4.43, 0.21, 4.75, 0.71, 1.52, 3.24, 0.93, 0.42, 4.97, 9.53, 4.55, 0.47, 6.66];
    const r = shapiroWilk(d);
    // scipy's swilk works in single precision, so its W carries about 7 digits and its p about 5 (R, in double
    // precision, gives W = 0.900472879317561, p = 0.0420895752222572, checked below).
    expectRel(r.statistic, 0.90047299861907959, 1e-6, 'W (scipy)');
    expectRel(r.pValue, 0.042089745402336121, 1e-4, 'p (scipy)');
    expectRel(r.statistic, 0.900472879317561, 1e-12, 'W (R)');
    expectRel(r.pValue, 0.0420895752222572, 1e-10, 'p (R)');
  });

  test.each(R.shapiro.filter((s) => s.name !== 'offset50').map((s) => [s.name, s] as const))('R shapiro.test, sample %s', (_name, s) => {
    const r = shapiroWilk(s.x);
    expectRel(r.statistic, s.W, 1e-12, 'W');
    expectRel(r.pValue, s.p, 1e-9, 'p');
  });

  test('a large offset costs no digits (R: shapiro.test on the data less the offset)', () => {
    const withOffset = R.shapiro.find((s) => s.name === 'offset50')!;
    const shifted = R.shapiro.find((s) => s.name === 'offset50_shifted')!;
    // Regenerated rather than read from the fixture, whose 15 printed digits would round the offset data.
    const r = shapiroWilk(normals(50, 50).map((z) => 1e7 + z));
    expectRel(r.statistic, shifted.W, 1e-12, 'W');
    expectRel(r.pValue, shifted.p, 1e-9, 'p');
    // R on the offset data itself divides by the range before centring and keeps about 9 digits.
    expectRel(r.statistic, withOffset.W, 1e-8, 'W (R, offset data)');
  });

  test.each(R.shapiro_generated.map((g) => [g.n, g] as const))('R shapiro.test, simulated n = %d', (_n, g) => {
    const z = normals(g.seed, g.n);
    if (g.transform === 'cube') for (let i = 0; i < z.length; i++) z[i] = z[i] + (z[i] * z[i] * z[i]) / 10;
    const r = shapiroWilk(z);
    expectRel(r.statistic, g.W, 1e-12, 'W');
    expectRel(r.pValue, g.p, 1e-8, 'p');
  });

  test('the order of the data does not matter', () => {
    const a = shapiroWilk([3, 1, 4, 1, 5, 9, 2, 6, 5, 3, 5]);
    const b = shapiroWilk([1, 1, 2, 3, 3, 4, 5, 5, 5, 6, 9]);
    expect(a.statistic).toBe(b.statistic);
  });

  test('refuses n < 3, n > 5000 and constant data', () => {
    expect(() => shapiroWilk([1, 2])).toThrow(StatsInputError);
    expect(() => shapiroWilk(new Float64Array(5001).map((_, i) => i))).toThrow(/5000/);
    expect(() => shapiroWilk([2, 2, 2, 2])).toThrow(/equal/);
  });
});
