/* Child process of large-ranges.test.ts: `node large-ranges-child.js <functions.js> <large-scipy.json>`.
 * Hosts the bundle with CustomFunctions as its only host global, in a plain Node.js context (a vm or Jest sandbox
 * makes every global lookup of the bundle ~10x slower, which turns a 1,048,576-row call into seconds), builds
 * whole-column ranges (1,048,576 rows) around the fixture's 1,000 rows and calls every function on the whole
 * column and on the 1,000 rows alone. Prints one JSON object: for each case, both outcomes. */
'use strict';
const fs = require('fs');

const [bundle, fixture] = process.argv.slice(2);
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

const EXCEL_ROWS = 1048576;
const large = JSON.parse(fs.readFileSync(fixture, 'utf8'));
const n = large.x.length;
const z = large.x.map((_, i) => ((i * 37) % 101) + (i % 7) / 10); // an invented third column (shift number)

function wholeColumn(values, blank, start) {
  const out = new Array(EXCEL_ROWS);
  for (let r = 0; r < EXCEL_ROWS; r++) out[r] = [blank];
  values.forEach((v, i) => (out[start + i] = [v]));
  return out;
}
const col = (v) => v.map((a) => [a]);

function call(id, args) {
  const fn = fns.get(id);
  if (!fn) return { kind: 'missing' };
  try {
    return { kind: 'value', value: fn(...args) };
  } catch (e) {
    if (e instanceof HostError) return { kind: 'host-error', code: e.code, message: e.message };
    return { kind: 'raw-exception', message: String(e && e.stack ? e.stack : e) };
  }
}

const results = {};
// Every function with blanks as null; a few with blanks as "" and with the data at the bottom of the column.
const FEW = ['PAIRS', 'COEF pearson', 'COEF kendall', 'PVALUE spearman', 'MATRIX', 'CHECKS'];
const variants = [
  { name: 'blanks null', blank: null, start: 0, only: null },
  { name: 'blanks ""', blank: '', start: 0, only: FEW },
  { name: 'blanks null, data at the bottom', blank: null, start: EXCEL_ROWS - n, only: FEW },
];
for (const v of variants) {
  const X = wholeColumn(large.x, v.blank, v.start);
  const Y = wholeColumn(large.y, v.blank, v.start);
  const Z = wholeColumn(z, v.blank, v.start);
  const xs = col(large.x);
  const ys = col(large.y);
  const zs = col(z);
  const invBig = { parameterAddresses: [`Sheet1!B1:B${EXCEL_ROWS}`, `Sheet1!C1:C${EXCEL_ROWS}`, null], address: 'Sheet1!E1' };
  const invSmall = { parameterAddresses: [`Sheet1!B${v.start + 1}:B${v.start + n}`, `Sheet1!C${v.start + 1}:C${v.start + n}`, null], address: 'Sheet1!E1' };
  const block = (a, b, c) => a.map((row, r) => [row[0], b[r][0], c[r][0]]);
  const cases = [
    ['PAIRS', [X, Y], [xs, ys]],
    ['COEF pearson', [X, Y, null], [xs, ys, null]],
    ['COEF spearman', [X, Y, 'spearman'], [xs, ys, 'spearman']],
    ['COEF kendall', [X, Y, 'kendall'], [xs, ys, 'kendall']],
    ['PVALUE pearson', [X, Y, null, null], [xs, ys, null, null]],
    ['PVALUE spearman', [X, Y, null, 'spearman'], [xs, ys, null, 'spearman']],
    ['PVALUE kendall', [X, Y, null, 'kendall'], [xs, ys, null, 'kendall']],
    ['INTERVAL', [X, Y, null, null], [xs, ys, null, null]],
    ['PARTIAL', [X, Y, Z, null, null], [xs, ys, zs, null, null]],
    ['DIFF_SHARED', [Z, X, Y, null, null], [zs, xs, ys, null, null]],
    ['DIFF_SEPARATE', [X, Y, Z, Y, null, null], [xs, ys, zs, ys, null, null]],
    ['DIFF_GROUPS', [X, Y, Z, Y, null, null], [xs, ys, zs, ys, null, null]],
    ['MATRIX', [block(X, Y, Z), null, null, null], [block(xs, ys, zs), null, null, null]],
    ['MATRIX pairs', [block(X, Y, Z), null, 'pairs', null], [block(xs, ys, zs), null, 'pairs', null]],
    ['CHECKS', [X, Y, null, invBig], [xs, ys, null, invSmall]],
    ['FLAGS', [X, Y, null, invBig], [xs, ys, null, invSmall]],
    ['REPORT', [X, Y, null, null, null, invBig], [xs, ys, null, null, null, invSmall]],
  ];
  results[v.name] = {};
  for (const [label, big, small] of cases) {
    if (v.only && !v.only.includes(label)) continue;
    const id = label.split(' ')[0];
    results[v.name][label] = { big: call(id, big), small: call(id, small) };
  }
}
// The same column with its blanks passed as 0, as some desktop builds of Excel do.
const X0 = wholeColumn(large.x, 0, 0);
const Y0 = wholeColumn(large.y, 0, 0);
results['blanks as 0'] = { COEF: { big: call('COEF', [X0, Y0, null]) }, PAIRS: { big: call('PAIRS', [X0, Y0]) } };
process.stdout.write(JSON.stringify(results));
