/* Child process of time-budget.test.ts: `node time-budget-child.js <functions.js> <functions.json> <rows>`.
 * Hosts the bundle with CustomFunctions as its only host global in a plain Node.js context (Jest's sandbox makes
 * every global lookup of the bundle far slower, which would measure the sandbox, not the function), then calls
 * every registered function on the cases the metadata implies:
 *  - every numeric argument at the edges: |r| within 1e-12 of 1, n at 4 and 10^9, power, alpha and level within
 *    1e-10 of 0 and 1, over a cartesian product of the numeric parameters (sampled when it is large);
 *  - every option word of every text parameter;
 *  - range arguments as fresh arrays of `rows` rows (ordinary data, and a near-perfect straight line);
 *  - the cases that once hung, written out.
 * With more than 10,000 rows only the range functions run, on ordinary data with every option word.
 * Each call is timed on its own with performance.now(). Prints one JSON object: every case with its time in ms
 * and what came out (value, host error with its message, or raw exception). */
'use strict';
const fs = require('fs');
const { performance } = require('perf_hooks');

const [bundle, metaFile, rowsArg] = process.argv.slice(2);
const ROWS = Number(rowsArg);
class HostError {
  constructor(code, message) {
    this.code = code;
    this.message = message || '';
  }
}
const fns = new Map();
globalThis.CustomFunctions = {
  associate: (id, fn) => fns.set(id, fn),
  Error: HostError,
  ErrorCode: { invalidValue: '#VALUE!', notAvailable: '#N/A', divisionByZero: '#DIV/0!', invalidNumber: '#NUM!', nullReference: '#NULL!' },
};
(0, eval)(fs.readFileSync(bundle, 'utf8'));
const meta = JSON.parse(fs.readFileSync(metaFile, 'utf8')).functions;

/** A small deterministic generator (an LCG), so the cases are the same on every run. */
let seed = 12345;
const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);

const EDGE = {
  correlation: [1 - 1e-12, -(1 - 1e-12), 0.9999999999, -0.9999999999, 0, 1e-12, 0.3],
  size: [4, 5, 1e9],
  probability: [1e-10, 1 - 1e-10, 0.5],
  other: [1e-12, 1 - 1e-12, 1e9, 4],
};

/** What kind of number a parameter takes, from its name (the metadata's own words). */
function kindOf(p) {
  if (/^r\d?$|^rel_/.test(p.name)) return 'correlation';
  if (/^n\d?$/.test(p.name)) return 'size';
  if (/^(power|alpha|level|prior_odds)$/.test(p.name)) return 'probability';
  return 'other';
}

/** Two columns of `rows` numbers built afresh, as the host hands them: ordinary data, or an almost exact line. */
function columns(rows, kind) {
  const x = new Array(rows);
  const y = new Array(rows);
  const z = new Array(rows);
  const w = new Array(rows);
  for (let i = 0; i < rows; i++) {
    const a = rand();
    x[i] = [a * 100];
    y[i] = [kind === 'line' ? a * 250 + 3 + (rand() - 0.5) * 1e-9 : a * 40 + rand() * 60];
    z[i] = [rand() * 10];
    w[i] = [rand() * 5 + a];
  }
  return { x, y, z, w };
}

function block(rows, width, kind) {
  const out = new Array(rows);
  for (let i = 0; i < rows; i++) {
    const a = rand();
    const row = new Array(width);
    for (let j = 0; j < width; j++) row[j] = kind === 'line' ? a * (j + 1) + (rand() - 0.5) * 1e-9 : a * 10 + rand() * 20;
    out[i] = row;
  }
  return out;
}

function optionWords(p) {
  return [...new Set([...(p.description || '').matchAll(/"([^"]+)"/g)].map((m) => m[1]))];
}
const takesBlock = (p) => /side by side|block of/i.test(p.description || '');

function product(lists, cap) {
  let out = [[]];
  for (const l of lists) out = out.flatMap((prefix) => l.map((v) => [...prefix, v]));
  if (out.length <= cap) return out;
  const picked = [];
  for (let i = 0; i < cap; i++) picked.push(out[Math.floor(rand() * out.length)]);
  return picked;
}

function call(id, args) {
  const fn = fns.get(id);
  const t0 = performance.now();
  let outcome;
  try {
    const value = fn(...args);
    outcome = { kind: 'value', value: Array.isArray(value) ? `${value.length} x ${value[0] && value[0].length}` : value };
  } catch (e) {
    if (e instanceof HostError) outcome = { kind: 'host-error', code: e.code, message: e.message };
    else outcome = { kind: 'raw-exception', message: String(e && e.stack ? e.stack : e) };
  }
  return { ms: performance.now() - t0, ...outcome };
}

const results = [];
const run = (id, label, args) => results.push({ id, label, ...call(id, args) });

for (const f of meta) {
  if (!fns.has(f.id)) continue;
  const params = f.parameters;
  const numeric = params.filter((p) => p.dimensionality !== 'matrix' && p.type === 'number');
  const ranges = params.filter((p) => p.dimensionality === 'matrix');
  // At sheet scale (more than 10,000 rows) the ranges carry the cost: ordinary data, every option word, the
  // numbers at their defaults; the numeric edges are covered by the small-data run.
  const large = ROWS > 10000;
  if (large && !ranges.length) continue;
  const dataKinds = large ? ['ordinary'] : ranges.length ? ['ordinary', 'line'] : ['none'];
  for (const kind of dataKinds) {
    // Fresh arrays for each function and data kind; a row-sized set of ranges is shared by that function's cases.
    const c = columns(ROWS, kind);
    const pool = [c.x, c.y, c.z, c.w];
    let next = 0;
    const rangeArgs = new Map(ranges.map((p) => [p.name, takesBlock(p) ? block(ROWS, p.name === 'data' ? 4 : 3, kind) : pool[next++ % pool.length]]));
    const build = (numbers, words) =>
      params.map((p) => {
        if (p.dimensionality === 'matrix') return rangeArgs.get(p.name);
        if (numbers.has(p.name)) return numbers.get(p.name);
        if (words.has(p.name)) return words.get(p.name);
        return null;
      });
    // The numeric edges, all combined (sampled past 150 combinations); on range functions, fewer (the data is
    // the costly part there).
    const combos = large ? [numeric.map(() => null)] : product(numeric.map((p) => EDGE[kindOf(p)]), ranges.length ? 12 : 150);
    for (const combo of combos) {
      const numbers = new Map(numeric.map((p, i) => [p.name, combo[i]]));
      run(f.id, `${kind}; ${[...numbers].map(([k, v]) => `${k}=${v}`).join(', ') || 'defaults'}`, build(numbers, new Map()));
    }
    // Every option word of every text parameter, the rest at their defaults.
    for (const p of params.filter((q) => q.dimensionality !== 'matrix' && q.type === 'string')) {
      for (const w of optionWords(p)) run(f.id, `${kind}; ${p.name}="${w}"`, build(new Map(), new Map([[p.name, w]])));
    }
  }
}

// The cases that once took from 20 s to forever, as they were reported.
const written = [
  ['POWER', [0.9999999999, 4, null, null]],
  ['POWER', [-0.9999999999, 5, null, null]],
  ['SAMPLE_SIZE', [0.999999999999, null, null, null]],
  ['SAMPLE_SIZE', [0.999999999999, 0.5, null, null]],
  ['SAMPLE_SIZE', [0.999999999999, 1e-10, null, null]],
  ['SAMPLE_SIZE', [0.999999999999, 0.9999999999, null, null]],
  ['DETECTABLE', [4, 0.9999999999, null, null]],
];
if (ROWS <= 10000) for (const [id, args] of written) run(id, `as reported: ${JSON.stringify(args)}`, args);

process.stdout.write(JSON.stringify({ rows: ROWS, results }));
