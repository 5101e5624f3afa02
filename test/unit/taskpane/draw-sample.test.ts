/** The drawing sample: properties that must hold whatever the data (no outside reference needed: these are
 * set-membership and size rules, checked exhaustively on small cases and by property on large ones). */
import fc from 'fast-check';
import { drawSample, positionHash } from '../../../taskpane/draw-sample';

function isSortedUnique(a: Int32Array): boolean {
  for (let i = 1; i < a.length; i++) if (a[i] <= a[i - 1]) return false;
  return true;
}

describe('drawSample', () => {
  test('everything is drawn when n is within the limit', () => {
    expect(Array.from(drawSample(5, [3], 10))).toEqual([0, 1, 2, 3, 4]);
    expect(drawSample(0, [], 10).length).toBe(0);
  });

  test('at most `limit` points, sorted, unique, in range, every flagged point included', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 20000 }),
        fc.integer({ min: 1, max: 3000 }),
        fc.array(fc.nat(), { maxLength: 50 }),
        (n, limit, raw) => {
          const flagged = raw.map((v) => v % n);
          const s = drawSample(n, flagged, limit);
          expect(s.length).toBe(Math.min(n, limit));
          expect(isSortedUnique(s)).toBe(true);
          expect(s[0]).toBeGreaterThanOrEqual(0);
          expect(s[s.length - 1]).toBeLessThan(n);
          const set = new Set(s);
          const distinct = [...new Set(flagged)].sort((a, b) => a - b);
          for (const f of distinct.slice(0, limit)) expect(set.has(f)).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });

  test('deterministic', () => {
    expect(Array.from(drawSample(100000, [5, 99999], 2000))).toEqual(Array.from(drawSample(100000, [5, 99999], 2000)));
  });

  test('appending rows keeps almost the whole drawing in place', () => {
    const before = new Set(drawSample(100000, [], 2000));
    const after = drawSample(101000, [], 2000);
    let kept = 0;
    for (const i of after) if (before.has(i)) kept++;
    expect(kept / 2000).toBeGreaterThan(0.97);
  });

  test('spread over the rows: each tenth of 100,000 rows gets 10% +/- 3% of the drawing', () => {
    const s = drawSample(100000, [], 2000);
    const counts = new Array(10).fill(0);
    for (const i of s) counts[Math.floor(i / 10000)]++;
    for (const c of counts) expect(Math.abs(c - 200)).toBeLessThan(60);
  });

  test('the position hash is one-to-one on a range of positions', () => {
    const seen = new Set<number>();
    for (let i = 0; i < 200000; i++) seen.add(positionHash(i));
    expect(seen.size).toBe(200000);
  });
});
