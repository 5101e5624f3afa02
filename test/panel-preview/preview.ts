/**
 * Preview page for the panel on an in-memory workbook (no Office, no workbench): used to take screenshots and
 * to time redraws. The scenario comes from the URL hash: #demo (default), #markup (a header holding markup),
 * #rows=100000 (a large column pair for timing), #empty (nothing picked yet), #constant (a column that does not vary),
 * #few (five rows), #null (48 rows with no relationship).
 *
 * Demo data: an invented chain of bakeries, "Juniper Lane Bakeries"; every number is generated here.
 */
import type { Method } from '../../src/stats/types';
import { mountPanel } from '../../taskpane/panel';
import { pairColumns, readNumericColumn } from '../../taskpane/pairs';
import { analyseRelationship } from '../../taskpane/relationship';
import { MemoryWorkbook } from './memory-workbook';

/** Small seeded generator (mulberry32) so every preview shows the same data. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normal(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(rand() + 1e-12)) * Math.cos(2 * Math.PI * rand());
}

function branchSheet(rand: () => number, rows: number, slope: number, outlier: boolean, xHeader = 'Oven hours'): unknown[][] {
  const grid: unknown[][] = [['Branch', xHeader, 'Loaves sold', 'Rating']];
  for (let i = 0; i < rows; i++) {
    const hours = Math.round(40 + 25 * rand());
    const loaves = Math.round(120 + slope * hours + 28 * normal(rand));
    const rating = Math.round((3.6 + 0.02 * (loaves - 220) / 10 + 0.4 * normal(rand)) * 10) / 10;
    grid.push([`Branch ${i + 1}`, hours, loaves, rating]);
  }
  if (outlier && grid.length > 12) grid[12][2] = 520;
  if (grid.length > 7) grid[7][3] = ''; // one missing rating: skipped pairwise
  return grid;
}

const wb = new MemoryWorkbook();
const hash = location.hash.slice(1);
// "#method=percentage_bend" shows the demo with that coefficient chosen.
const chosenMethod = /^method=([a-z_]+)$/.exec(hash)?.[1] as Method | undefined;
const root = document.getElementById('app') as HTMLElement;
const rand = seeded(20240501);

if (hash.startsWith('rows=')) {
  // "rows=100000" uses the workbook's numeric fast path; "rows=100000,plain" only readColumn.
  const [count, variant] = hash.slice(5).split(',');
  const n = Number(count);
  if (variant === 'plain') wb.readColumnNumbers = undefined;
  const grid: unknown[][] = [['Visits', 'Spend']];
  for (let i = 0; i < n; i++) {
    const x = 50 + 20 * normal(rand);
    grid.push([x, 10 + 0.8 * x + 15 * normal(rand)]);
  }
  grid[101][1] = 900;
  wb.sheets.set('Big', grid);
  wb.tables.push({ name: 'BigTable', sheet: 'Big', headerRow: 1, firstColumn: 1, columns: ['Visits', 'Spend'] });
  const handle = mountPanel(root, wb, {
    initial: { x: { kind: 'table', table: 'BigTable', column: 'Visits' }, y: { kind: 'table', table: 'BigTable', column: 'Spend' } },
    workerUrl: 'panel-worker.js',
  });
  (window as unknown as { previewEdit: (row: number, v: number) => void }).previewEdit = (row, v) => wb.set('Big', row, 2, v);
  // Best-of-k timings of the panel's own steps on these data, without drawing (to separate them from contention).
  (window as unknown as { previewTimeSteps: (k: number) => Promise<Record<string, number>> }).previewTimeSteps = async (k) => {
    const best: Record<string, number> = { read: Infinity, pair: Infinity, compute: Infinity };
    for (let i = 0; i < k; i++) {
      let t = performance.now();
      const reads = await Promise.all([readNumericColumn(wb, { kind: 'table', table: 'BigTable', column: 'Visits' }), readNumericColumn(wb, { kind: 'table', table: 'BigTable', column: 'Spend' })]);
      best.read = Math.min(best.read, performance.now() - t);
      t = performance.now();
      const p = pairColumns(reads[0], reads[1]);
      best.pair = Math.min(best.pair, performance.now() - t);
      t = performance.now();
      analyseRelationship(p, { method: 'pearson', level: 0.95, alpha: 0.05, drawLimit: 2000 });
      best.compute = Math.min(best.compute, performance.now() - t);
    }
    return best;
  };
  void handle;
} else if (hash === 'empty' || hash === 'constant') {
  const grid = branchSheet(rand, 20, 1.5, false);
  if (hash === 'constant') for (let i = 1; i < grid.length; i++) grid[i][2] = 200;
  wb.sheets.set('North', grid);
  wb.selection = hash === 'empty' ? 'North!A1' : 'North!B1:C21';
  mountPanel(root, wb, { workerUrl: 'panel-worker.js' });
} else {
  const markup = hash === 'markup';
  const north = hash === 'few' ? branchSheet(rand, 5, 1.9, false) : hash === 'null' ? branchSheet(rand, 48, 0, false) : branchSheet(rand, 40, 1.9, true, markup ? '<img src=x onerror=alert(1)>' : 'Oven hours');
  wb.sheets.set('North', north);
  wb.sheets.set('South', branchSheet(rand, 36, 1.2, false));
  wb.tables.push({ name: 'NorthBranches', sheet: 'North', headerRow: 1, firstColumn: 1, columns: wb.sheets.get('North')![0] as string[] });
  wb.tables.push({ name: 'SouthBranches', sheet: 'South', headerRow: 1, firstColumn: 1, columns: wb.sheets.get('South')![0] as string[] });
  wb.selection = `North!B1:C${north.length}`;
  mountPanel(root, wb, {
    initial: { x: { kind: 'table', table: 'NorthBranches', column: markup ? '<img src=x onerror=alert(1)>' : 'Oven hours' }, y: { kind: 'table', table: 'NorthBranches', column: 'Loaves sold' } },
    initialCompare: { x: { kind: 'range', address: 'South!B1:B37' }, y: { kind: 'range', address: 'South!C1:C37' } },
    workerUrl: 'panel-worker.js',
    method: chosenMethod,
  });
}
(window as unknown as { previewWorkbook: MemoryWorkbook }).previewWorkbook = wb;
