/**
 * A 10,000-column MATRIX request is refused at once, from the size of its range alone, with a message that says
 * the limit: no cell is read (counted through a Proxy on each row), so no time is spent on a table that could not
 * be shown. Runs on the built bundle; needs `npm run build` first.
 */
import { callCell } from '../properties/support/registry';

describe('a 10,000-column MATRIX request', () => {
  test.each([2, 100])('with %d rows: refused before any cell is read, with the limit in the message', (rows) => {
    let reads = 0;
    const row = () =>
      new Proxy(new Array(10_000).fill(1), {
        get(target, key) {
          if (typeof key === 'string' && /^\d+$/.test(key)) reads++;
          return Reflect.get(target, key);
        },
      });
    for (const headers of [null, true]) {
      reads = 0;
      const out = callCell('MATRIX', [Array.from({ length: rows }, row), null, null, headers]);
      expect(out.kind).toBe('host-error');
      if (out.kind === 'host-error') {
        expect(out.code).toBe('#VALUE!');
        expect(out.message).toMatch(/10,000 columns/);
        expect(out.message).toMatch(/at most \d+/);
      }
      expect(reads).toBe(0);
    }
  });
});
