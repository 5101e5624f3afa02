/**
 * 10,000 recalculations with changing data leave no growing memory behind: the functions keep caches (prepared
 * columns shared between functions, memoised checks), and those must stay bounded however many different sheets
 * pass through. A child Node.js process started with --expose-gc (support/recalculate.js) hosts
 * dist/functions.js as Excel does, recalculates a small sheet 10,000 times with new numbers each time, and reports
 * the heap in use after a full garbage collection every 2,000 recalculations. After the first 2,000 (caches full),
 * the heap may not grow by more than 4 MB: a leak of 500 bytes per recalculation would exceed that.
 * Needs `npm run build` first.
 */
import { spawnSync } from 'child_process';
import * as path from 'path';
import { distFile } from '../../helpers/bare-host';

const RECALCULATIONS = 10_000;
const ALLOWED_GROWTH = 4 * 1024 * 1024;

test(`heap after ${RECALCULATIONS.toLocaleString('en-US')} recalculations stays within 4 MB of the heap after 2,000`, () => {
  const child = spawnSync(process.execPath, ['--expose-gc', path.join(__dirname, 'support/recalculate.js'), distFile('functions.js'), String(RECALCULATIONS)], {
    encoding: 'utf8',
    timeout: 240_000,
  });
  if (child.status !== 0) throw new Error(`recalculate.js failed (${child.status}): ${child.stderr}`);
  const report = JSON.parse(child.stdout) as { checkpoints: { after: number; heapUsed: number }[]; answered: number; refused: number };
  const [first, ...rest] = report.checkpoints;
  expect(first.after).toBe(2000);
  expect(rest[rest.length - 1].after).toBe(RECALCULATIONS);
  // Most calls answer (a sheet of real numbers); refusals would mean the loop was not exercising the functions.
  expect(report.answered).toBeGreaterThan(report.refused * 10);
  const worst = Math.max(...rest.map((c) => c.heapUsed - first.heapUsed));
  if (worst >= ALLOWED_GROWTH) throw new Error(`heap grew by ${worst} bytes: ${JSON.stringify(report.checkpoints)}`);
}, 300_000);
