/* Child process of recalculation-memory.test.ts, run as `node --expose-gc recalculate.js <functions.js> <count>`.
 * Hosts the bundle as Excel does (a context whose only host global is CustomFunctions), then recalculates a
 * small sheet `count` times with changing data: every recalculation calls COEF, INTERVAL, PVALUE, PAIRS, MATRIX,
 * PARTIAL and DIFF_SHARED on new columns, and every 50th also the assumption checks (FLAGS, CHECKS, REPORT share
 * one computation, about 30 ms on 40 rows: calling them every time would make the test minutes long). Prints one
 * JSON line: heapUsed (after a full garbage collection) at checkpoints. */
'use strict';
const fs = require('fs');
const vm = require('vm');

const [file, countText] = process.argv.slice(2);
const count = Number(countText);
if (typeof global.gc !== 'function') throw new Error('run with --expose-gc');

class HostError {
  constructor(code, message) {
    this.code = code;
    this.message = message || '';
  }
}
const fns = new Map();
const context = {
  CustomFunctions: {
    associate: (id, fn) => fns.set(id, fn),
    Error: HostError,
    ErrorCode: { invalidValue: '#VALUE!', notAvailable: '#N/A', divisionByZero: '#DIV/0!', invalidNumber: '#NUM!', nullReference: '#NULL!' },
  },
};
vm.createContext(context);
vm.runInContext(fs.readFileSync(file, 'utf8'), context, { filename: 'functions.js' });

// A small deterministic generator (xorshift32) so that every run sees the same sequence of sheets.
let seed = 2463534242;
function random() {
  seed ^= seed << 13;
  seed ^= seed >>> 17;
  seed ^= seed << 5;
  return (seed >>> 0) / 4294967296;
}
const ROWS = 40;
const invocation = { parameterAddresses: [`Sheet1!B2:B${ROWS + 1}`, `Sheet1!C2:C${ROWS + 1}`, null, null, null], address: 'Sheet1!E2' };

let answered = 0;
let refused = 0;
function call(id, ...args) {
  const fn = fns.get(id);
  if (!fn) return;
  try {
    fn(...args);
    answered++;
  } catch (e) {
    if (!(e instanceof HostError)) throw e;
    refused++;
  }
}

function recalculate(i) {
  const x = [];
  const y = [];
  const z = [];
  for (let r = 0; r < ROWS; r++) {
    const a = Math.round(random() * 1000) / 10;
    x.push([a]);
    y.push([Math.round((a * 0.5 + random() * 40) * 100) / 100]);
    z.push([Math.round(random() * 100)]);
  }
  call('COEF', x, y, null);
  call('INTERVAL', x, y, null, null);
  call('PVALUE', x, y, null, null);
  call('PAIRS', x, y);
  call('MATRIX', x.map((row, r) => [row[0], y[r][0], z[r][0]]), null, null, null);
  call('PARTIAL', x, y, z, null, null);
  call('DIFF_SHARED', z, x, y, null, null);
  if (i % 50 === 0) {
    call('FLAGS', x, y, null, invocation);
    call('CHECKS', x, y, null, invocation);
    call('REPORT', x, y, null, null, invocation);
  }
}

function heap() {
  global.gc();
  global.gc();
  return process.memoryUsage().heapUsed;
}

const checkpoints = [];
const warmup = Math.min(2000, Math.floor(count / 5));
for (let i = 0; i < count; i++) {
  recalculate(i);
  if (i + 1 === warmup || (i + 1) % 2000 === 0 || i + 1 === count) checkpoints.push({ after: i + 1, heapUsed: heap() });
}
process.stdout.write(JSON.stringify({ checkpoints, answered, refused, functions: [...fns.keys()].length }) + '\n');
