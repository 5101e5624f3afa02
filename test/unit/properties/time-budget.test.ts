/**
 * A time budget for every cell function: each registered function, driven from functions.json with every numeric
 * argument at its edges (|r| within 1e-12 of 1, n at 4 and 10^9, power, alpha and level within 1e-10 of 0 and 1),
 * every option word, and fresh range arrays, answers or refuses with a message within the deadline, measured per
 * call. Desktop Excel restarts an add-in that stays unresponsive for about 5 s (the figure in the issue that asked
 * for this), so the budget is 1 s; the deadline asserted here is several times that so CI noise cannot fail it —
 * the cases are the point: before the fixes, POWER(0.9999999999, 4) took 26.9 s and SAMPLE_SIZE(0.999999999999)
 * never came back. The calls run in a child Node.js process (support/time-budget-child.js), outside Jest's
 * sandbox, which slows every global lookup of the bundle. Needs `npm run build` first.
 */
import { spawnSync } from 'child_process';
import * as path from 'path';
import { distFile } from '../../helpers/bare-host';

interface Timed {
  id: string;
  label: string;
  ms: number;
  kind: 'value' | 'host-error' | 'raw-exception';
  value?: unknown;
  code?: string;
  message?: string;
}

/** Generous against the 1 s budget: the slowest call at 30 rows took about 0.8 s on the project's machine. */
const DEADLINE_MS = 5000;
/** At 100,000 rows (the panel's everyday scale) the same generous margin over the budget. */
const LARGE_ROWS = 100000;

function runChild(rows: number): { rows: number; results: Timed[] } {
  const child = spawnSync(
    process.execPath,
    ['--max-old-space-size=4096', path.join(__dirname, 'support/time-budget-child.js'), distFile('functions.js'), distFile('functions.json'), String(rows)],
    { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024, timeout: 600000 },
  );
  if (child.status !== 0) throw new Error(`time-budget-child.js failed (${child.status ?? child.signal}): ${child.stderr}`);
  return JSON.parse(child.stdout) as { rows: number; results: Timed[] };
}

function slowest(results: Timed[], k: number): string {
  return [...results]
    .sort((a, b) => b.ms - a.ms)
    .slice(0, k)
    .map((r) => `${r.ms.toFixed(0)} ms ${r.id} (${r.label})`)
    .join('\n');
}

function late(results: Timed[]): string[] {
  return results.filter((r) => r.ms > DEADLINE_MS).map((r) => `${r.id} (${r.label}) took ${r.ms.toFixed(0)} ms`);
}

function badOutcomes(results: Timed[]): string[] {
  return results
    .filter((r) => r.kind === 'raw-exception' || (r.kind === 'host-error' && !(r.message ?? '').trim()))
    .map((r) => `${r.id} (${r.label}): ${r.kind} ${r.message ?? ''}`);
}

describe('every function answers or refuses within the deadline', () => {
  const small = runChild(30);
  afterAll(() => process.stdout.write(`time budget, 30 rows, slowest calls:\n${slowest(small.results, 5)}\n`));

  test('the run covers every registered function', () => {
    const ids = new Set(small.results.map((r) => r.id));
    expect(ids.size).toBe(23);
    expect(small.results.length).toBeGreaterThan(800);
  });

  test('numeric edges, option words and 30-row ranges: no call over the deadline', () => {
    expect(late(small.results)).toEqual([]);
  });

  test('every answer is a value or a host error with a message, never a raw exception', () => {
    expect(badOutcomes(small.results)).toEqual([]);
  });

  test('the calls that once hung answer now', () => {
    const reported = small.results.filter((r) => r.label.startsWith('as reported'));
    expect(reported.map((r) => r.id)).toEqual(['POWER', 'POWER', 'SAMPLE_SIZE', 'SAMPLE_SIZE', 'SAMPLE_SIZE', 'SAMPLE_SIZE', 'DETECTABLE']);
    for (const r of reported) expect(r.ms).toBeLessThan(DEADLINE_MS);
    expect(badOutcomes(reported)).toEqual([]);
  });
});

describe(`the range functions at ${LARGE_ROWS.toLocaleString('en-US')} rows`, () => {
  const large = runChild(LARGE_ROWS);
  afterAll(() => process.stdout.write(`time budget, ${LARGE_ROWS} rows, slowest calls:\n${slowest(large.results, 5)}\n`));

  test('every option word of every range function: no call over the deadline, no raw exception', () => {
    expect(new Set(large.results.map((r) => r.id)).size).toBe(16);
    expect(late(large.results)).toEqual([]);
    expect(badOutcomes(large.results)).toEqual([]);
  });
});
