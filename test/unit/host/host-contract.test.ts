/**
 * The host contract: dist/functions.js, loaded in a bare context whose only host global is CustomFunctions,
 * registers every function of dist/functions.json and answers without touching Office, window or document.
 * Needs `npm run build` first (npm test does it).
 */
import * as fs from 'fs';
import { distFile, loadBundle } from '../../helpers/bare-host';

// Hollander & Wolfe (1973) data, as in R's ?cor.test example [printed: R stats documentation, test/references.md].
const HW_X = [44.4, 45.9, 41.9, 53.3, 44.7, 44.1, 50.7, 45.2, 60.1];
const HW_Y = [2.6, 3.1, 2.5, 5.0, 3.6, 4.0, 5.2, 2.8, 3.8];
const col = (v: unknown[]) => v.map((a) => [a]);

if (!fs.existsSync(distFile('functions.js')) || !fs.existsSync(distFile('functions.json'))) {
  throw new Error('dist/functions.js is missing: run `npm run build` first (npm test does)');
}

describe('bare-context host contract', () => {
  const host = loadBundle();
  const meta = JSON.parse(fs.readFileSync(distFile('functions.json'), 'utf8')) as { functions: { id: string; name: string }[] };

  test('every function in functions.json is associated, and nothing else', () => {
    const ids = meta.functions.map((f) => f.id).sort();
    expect([...host.fns.keys()].sort()).toEqual(ids);
    expect(ids.length).toBeGreaterThanOrEqual(5);
    for (const f of meta.functions) expect(f.id).toBe(f.name);
  });

  test('loading touched no Office, window or document', () => {
    expect(host.touched).toEqual([]);
  });

  test('COEF answers in the bare context (R cor.test example: r = 0.5711816)', () => {
    const r = host.fns.get('COEF')!(col(HW_X), col(HW_Y), null) as number;
    expect(r).toBeCloseTo(0.5711816, 7);
    expect(host.touched).toEqual([]);
  });

  test('a bad input throws the host error type with a message', () => {
    let caught: unknown;
    try {
      host.fns.get('COEF')!(col([1, 2, 3]), col([5, 5, 5]), null);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(host.HostError);
    expect((caught as { code: string }).code).toBe('#VALUE!');
    expect((caught as { message: string }).message).toMatch(/y is constant/);
  });

  test('every registered function answers some call without a raw exception', () => {
    for (const [id, fn] of host.fns) {
      let out: unknown;
      try {
        out = fn(col(HW_X), col(HW_Y), null, null, null, null);
      } catch (e) {
        // Functions whose arguments are not (x, y) reject this call, but only with the host's error type.
        expect(e).toBeInstanceOf(host.HostError);
        continue;
      }
      expect(out).toBeDefined();
      void id;
    }
    expect(host.touched).toEqual([]);
  });
});
