/**
 * The polychoric and polyserial correlations as the cell functions and the panel ask for them (correlate with
 * method "polychoric" / "polyserial": the two-step estimate, its likelihood-ratio p-value and Wald interval on
 * Fisher's z), against the tight re-maximisation of polycor's likelihood in R 4.2.2 with polycor 0.8.1
 * (test/fixtures/ordinal/polycor-r.R; see test/references.md).
 */
import polyJson from '../../../fixtures/ordinal/polycor-r.json';
import { correlate } from '../../../../src/stats/correlation/correlate';

interface Tight { rho: number; se: number; ci95: [number, number]; pValue: number }
interface Case { name: string; x: number[]; y: number[]; tight: { twostep: Tight } }
const ref = polyJson as unknown as { polychoric: Case[]; polyserial: Case[] };

describe.each([['polychoric', ref.polychoric], ['polyserial', ref.polyserial]] as const)('%s', (method, cases) => {
  test.each(cases.map((c) => [c.name, c] as const))('%s: estimate, p-value and 95% interval (tight R re-maximisation)', (_n, c) => {
    const t = c.tight.twostep;
    const res = correlate(c.x, c.y, { method, tail: 'both', level: 0.95 });
    expect(Math.abs(res.statistic - t.rho)).toBeLessThan(1e-9);
    if (Number.isFinite(t.pValue) && t.pValue > 1e-300) expect(Math.abs(res.pValue - t.pValue) / t.pValue).toBeLessThan(1e-8);
    if (Number.isFinite(t.se)) {
      expect(Math.abs(res.interval.lower - t.ci95[0])).toBeLessThan(1e-7);
      expect(Math.abs(res.interval.upper - t.ci95[1])).toBeLessThan(1e-7);
    }
    // Swapping the columns names the same coefficient (polyserial finds its ordered column itself).
    expect(Math.abs(correlate(c.y, c.x, { method, tail: 'both', level: 0.95 }).statistic - res.statistic)).toBeLessThan(1e-9);
  });
});

test('one-sided p-values come from the signed root of the likelihood ratio; a bootstrap interval is refused', () => {
  const c = ref.polychoric[0];
  const both = correlate(c.x, c.y, { method: 'polychoric', tail: 'both', level: 0.95 });
  const pos = correlate(c.x, c.y, { method: 'polychoric', tail: 'positive', level: 0.95 });
  const neg = correlate(c.x, c.y, { method: 'polychoric', tail: 'negative', level: 0.95 });
  expect(Math.abs(pos.pValue - both.pValue / 2)).toBeLessThan(1e-15);
  expect(Math.abs(neg.pValue - (1 - both.pValue / 2))).toBeLessThan(1e-12);
  expect(() => correlate(c.x, c.y, { method: 'polychoric', tail: 'both', level: 0.95, interval: 'bca' })).toThrow(/comes from its likelihood/);
  expect(() => correlate(c.x.map((v, i) => v + i / 1000), c.y, { method: 'polychoric', tail: 'both', level: 0.95 })).toThrow(/at most 10 are allowed/);
});
