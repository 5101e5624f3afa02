#!/usr/bin/env node
/*
 * npm run bench — how Covary's cell functions scale, measured as the host calls them (2-D arrays in, the bundle
 * dist/functions.js hosted in a bare context exactly as Excel hosts it), and how they compare with peers on the
 * same data in the same run: jstat and simple-statistics (their correlation functions), and, where Debian's
 * python3-scipy / python3-statsmodels are installed, scipy's pearsonr / spearmanr / kendalltau and a statsmodels
 * diagnostics pipeline. Results are ratios (project / peer), never absolute claims. Each timed call's answer is
 * checked against the peer's so a fast wrong answer cannot pass as a win. scipy is timed twice: on ready numpy
 * arrays (its best case) and on the data as a spreadsheet hands them over (a list of one-cell rows, converted
 * inside the timed call), because Covary's times always include reading the host's cells.
 *
 * The data come in three kinds, as sheets hold them: "full" (full-precision doubles, what every computed column
 * holds: =A2*1.07, =RAND(), a lookup), "cents" (typed to two decimals: money) and "ties" (whole numbers 1 to 7
 * with many ties: ratings). By default the host's row arrays are built afresh for every call, as Excel
 * deserializes them; --arrays kept reuses one set (edited in one cell per call), the older, kinder measure.
 * Each kind reports its ratios; the first call of each function is reported apart from the median.
 *
 * "read cells only" times reading the host's two columns into numbers and nothing else: the floor under every
 * cell function, reported beside scipy on numpy arrays so a ratio target below it shows as such.
 *
 * Options: --sizes 1e3,1e4,1e5,1e6   --runs 3   --kinds full,cents,ties   --arrays fresh|kept   --json out.json
 */
const fs = require('fs');
const os = require('os');
const path = require('path');
const { spawnSync } = require('child_process');

const args = process.argv.slice(2);
const opt = (name, dflt) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : dflt;
};
const SIZES = opt('sizes', '1e3,1e4,1e5,1e6').split(',').map(Number);
const RUNS = Number(opt('runs', '3'));
const KINDS = opt('kinds', 'full,cents,ties').split(',');
const FRESH_ARRAYS = opt('arrays', 'fresh') !== 'kept';
const root = path.resolve(__dirname, '..');
const dist = path.join(root, 'dist');

if (!fs.existsSync(path.join(dist, 'functions.js'))) {
  console.error('dist/functions.js is missing: run `npm run build` first');
  process.exit(1);
}

// ---- host the bundle bare, as Excel does: its only host object is CustomFunctions. The bundle runs as a
// function of CustomFunctions in this isolate rather than in a vm context: Node's vm contexts route every
// global lookup (Math, Float64Array, ...) through an interceptor that makes numeric code 10-100x slower than any
// browser or Excel runtime, which would measure Node's vm, not Covary. The host-contract test still uses a vm
// context, for isolation rather than speed.
function loadBundle() {
  const fns = new Map();
  class HostError { constructor(code, message) { this.code = code; this.message = message || ''; } }
  const CustomFunctions = { associate: (id, fn) => fns.set(id, fn), Error: HostError, ErrorCode: { invalidValue: '#VALUE!', notAvailable: '#N/A' } };
  new Function('CustomFunctions', fs.readFileSync(path.join(dist, 'functions.js'), 'utf8'))(CustomFunctions);
  return fns;
}
const fns = loadBundle();
const { jStat } = require('jstat');
const ss = require('simple-statistics');

// ---- deterministic data: y = 0.5 x + noise (Box-Muller on a small LCG), in one of the kinds above (six-decimal
// values when no kind is given: the fixed-size checks further down)
function makeData(n, seed, kind) {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
    const b = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
    if (kind === 'full') {
      x[i] = 50 + 10 * a;
      y[i] = 0.5 * x[i] + 8 * b;
    } else if (kind === 'cents') {
      x[i] = Math.round((500 + 100 * a) * 100) / 100;
      y[i] = Math.round((0.5 * x[i] + 80 * b) * 100) / 100;
    } else if (kind === 'ties') {
      x[i] = Math.min(7, Math.max(1, Math.round(4 + 1.3 * a)));
      y[i] = Math.min(7, Math.max(1, Math.round(4 + 0.6 * (x[i] - 4) + 1.1 * b)));
    } else {
      x[i] = Math.round((50 + 10 * a) * 1e6) / 1e6;
      y[i] = Math.round((0.5 * x[i] + 8 * b) * 1e6) / 1e6;
    }
  }
  return { x, y };
}
const toCol = (v) => Array.from(v, (a) => [a]);

function median(a) {
  const b = [...a].sort((p, q) => p - q);
  return b[Math.floor(b.length / 2)];
}

/**
 * Times fn over RUNS runs after one untimed first call; `fresh(k)` gives run k's arguments (a changed cell each
 * run: no cache hits). The first call is returned apart (`first`): it also pays for compiling the code and for
 * mapping the pages of the work arrays the later calls reuse (src/stats/internal/scratch.ts), so it shows what the first
 * recalculation after opening a workbook costs, and the median shows every recalculation after it.
 */
function time(fresh, fn) {
  const times = [];
  let out;
  const a0 = fresh(-1);
  const t00 = process.hrtime.bigint();
  fn(...a0);
  const first = Number(process.hrtime.bigint() - t00) / 1e6;
  for (let k = 0; k < RUNS; k++) {
    const a = fresh(k);
    const t0 = process.hrtime.bigint();
    out = fn(...a);
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  return { ms: median(times), first, max: Math.max(...times), out };
}

// ---- python peers
const PY = fs.existsSync('/usr/bin/python3') ? '/usr/bin/python3' : null;
function pythonHas(mod) {
  if (!PY) return false;
  return spawnSync(PY, ['-c', `import ${mod}`]).status === 0;
}
const hasScipy = pythonHas('scipy');
const hasStatsmodels = pythonHas('statsmodels');
const PY_BENCH = `
import sys, json, time, numpy as np
from scipy import stats
n = int(sys.argv[2]); runs = int(sys.argv[3]); sm = sys.argv[4] == '1'
d = np.fromfile(sys.argv[1], dtype='<f8'); x = d[:n].copy(); y = d[n:].copy()
def t(f):
    ts = []
    for k in range(runs):
        yy = y.copy(); yy[0] += k * 1e-6
        t0 = time.perf_counter(); out = f(x, yy); ts.append((time.perf_counter() - t0) * 1000)
    return sorted(ts)[len(ts)//2], out
res = {}
ms, out = t(lambda a, b: stats.pearsonr(a, b)); res['pearsonr'] = [ms, float(out[0])]
ms, out = t(lambda a, b: stats.spearmanr(a, b)); res['spearmanr'] = [ms, float(out[0])]
ms, out = t(lambda a, b: stats.kendalltau(a, b)); res['kendalltau'] = [ms, float(out[0])]
# The same call when the data arrive as a spreadsheet bridge hands them over: a column as a list of one-cell
# rows, converted to an array inside the timed call (what any Python add-in pays per call).
xl = [[v] for v in x.tolist()]
def host(f):
    def g(a, b):
        yl = [[v] for v in b.tolist()]
        t0 = time.perf_counter()
        out = f(np.asarray(xl, dtype=float).ravel(), np.asarray(yl, dtype=float).ravel())
        return out, (time.perf_counter() - t0) * 1000
    ts = []
    for k in range(runs):
        yy = y.copy(); yy[0] += k * 1e-6
        out, ms = g(x, yy); ts.append(ms)
    return sorted(ts)[len(ts)//2]
res['pearsonr_host'] = host(stats.pearsonr)
res['spearmanr_host'] = host(stats.spearmanr)
res['kendalltau_host'] = host(stats.kendalltau)
if sm:
    import statsmodels.api as smapi
    from statsmodels.stats.diagnostic import het_breuschpagan, linear_reset
    from statsmodels.stats.stattools import durbin_watson
    from statsmodels.stats.outliers_influence import OLSInfluence
    def pipeline(a, b):
        X = smapi.add_constant(a)
        fit = smapi.OLS(b, X).fit()
        e = fit.resid
        nt = [stats.shapiro(v) if len(v) <= 5000 else stats.normaltest(v) for v in (a, b, e)]
        X2 = np.column_stack([X, a * a]); f2 = smapi.OLS(b, X2).fit(); lin = fit.compare_f_test(f2)
        bp = het_breuschpagan(e, X)
        inf = OLSInfluence(fit); cd = inf.cooks_distance[0]; h = inf.hat_matrix_diag
        # statsmodels 0.13's resid_studentized_external refits n times (O(n^2): ~110 s at n = 20,000), so the
        # pipeline uses the standard closed form (Belsley, Kuh & Welsch 1980) on statsmodels' hat values instead.
        s2i = (fit.ssr - e**2 / (1 - h)) / (fit.nobs - 3); rs = e / np.sqrt(s2i * (1 - h))
        dw = durbin_watson(e)
        return float(dw)
    ms, out = t(pipeline); res['statsmodels_checks'] = [ms, out]
print(json.dumps(res))
`;

function pythonPeers(x, y) {
  if (!hasScipy) return null;
  const file = path.join(os.tmpdir(), `covary-bench-${process.pid}.f64`);
  const buf = new Float64Array(x.length * 2);
  buf.set(x, 0);
  buf.set(y, x.length);
  fs.writeFileSync(file, Buffer.from(buf.buffer));
  const r = spawnSync(PY, ['-c', PY_BENCH, file, String(x.length), String(RUNS), hasStatsmodels ? '1' : '0'], { encoding: 'utf8', maxBuffer: 1e7 });
  fs.unlinkSync(file);
  if (r.status !== 0) {
    console.error(r.stderr);
    return null;
  }
  return JSON.parse(r.stdout);
}

// ---- run
const rows = [];
const ratios = [];
let salt = 0;
const fmt = (v) => (v === undefined || v === null ? '—' : v < 10 ? v.toFixed(2) : v.toFixed(0));
const call = (id) => fns.get(id);

console.log(`Covary bench on ${os.cpus()[0].model.trim()} (${os.cpus().length} cores), Node ${process.version}; median of ${RUNS} runs, times in ms`);
console.log(`peers: jstat ${require('jstat/package.json').version}, simple-statistics ${require('simple-statistics/package.json').version}` +
  (hasScipy ? `, scipy (Debian python3-scipy)${hasStatsmodels ? ' and statsmodels' : ' (statsmodels missing: python3-statsmodels not installed)'}` : ', scipy/statsmodels missing: install python3-scipy python3-statsmodels for those ratios'));

console.log(`data kinds: ${KINDS.join(', ')}; host arrays ${FRESH_ARRAYS ? 'built afresh for every call (as Excel passes them)' : 'kept between calls, one cell edited per call'}`);
for (const kind of KINDS) for (const n of SIZES) {
  const { x, y } = makeData(n, 12345 + n, kind);
  const X = toCol(x);
  const Y = toCol(y);
  // With kept arrays, settle the heap once the data are built, as in a workbook that has been open a while
  // (run with --expose-gc, as `npm run bench` does). With fresh arrays the collections they cause are part of
  // every call, as in Excel.
  if (!FRESH_ARRAYS && typeof global.gc === 'function') global.gc();
  const fresh = () => {
    // An edit per call (one cell, a value never used before), so the content cache can never answer from an
    // earlier call: every time is a cold computation. The arrays are the host's shape: one array per row.
    // The edit keeps the column's kind: a whole number 1-7 for ties, a new amount to the cent for two decimals
    // (adding 1e-6 there would make the column a six-decimal one), a new six-decimal value otherwise.
    ++salt;
    const y0 = kind === 'cents' ? Math.round((y[0] + salt * 0.01) * 100) / 100 : y[0] + (kind === 'ties' ? 0 : salt * 1e-6);
    if (FRESH_ARRAYS) {
      const Yf = toCol(y);
      Yf[0] = [kind === 'ties' ? ((salt % 7) + 1) : y0];
      return [toCol(x), Yf];
    }
    Y[0] = [kind === 'ties' ? ((salt % 7) + 1) : y0];
    return [X, Y];
  };
  const row = { n, kind };
  for (const [label, id, extra] of [
    ['COEF pearson', 'COEF', ['pearson']],
    ['COEF spearman', 'COEF', ['spearman']],
    ['COEF kendall', 'COEF', ['kendall']],
    ['INTERVAL', 'INTERVAL', [null, null]],
    ['PVALUE', 'PVALUE', [null, null]],
    ['FLAGS', 'FLAGS', [null]],
    ['CHECKS', 'CHECKS', [null]],
    ['REPORT', 'REPORT', [null, null]],
  ]) {
    if (!call(id)) continue;
    try {
      const r = time(fresh, (a, b) => call(id)(a, b, ...extra));
      row[label] = r.ms;
      row[label + ':first'] = r.first;
      row[label + ':max'] = r.max;
      row[label + ':out'] = r.out;
    } catch (e) {
      row[label] = null;
      row[label + ':err'] = e && e.message;
    }
  }
  // one recalculation: five functions on the same data share the work
  if (call('FLAGS') && call('CHECKS')) {
    row['recalc (5 fns)'] = time(fresh, (a, b) => {
      call('COEF')(a, b, null); call('INTERVAL')(a, b, null, null); call('PVALUE')(a, b, null, null);
      call('FLAGS')(a, b, null); return call('CHECKS')(a, b, null);
    }).ms;
  }
  // The floor: reading the host's cells alone into two Float64Arrays (a type test per cell, NaN for the rest, as
  // the functions read them), no statistics. Whatever a cell function does costs at least this.
  row['read cells only'] = time(fresh, (a, b) => {
    const u = new Float64Array(a.length);
    const w = new Float64Array(b.length);
    for (let i = 0; i < a.length; i++) { const v = a[i][0]; u[i] = typeof v === 'number' ? v : NaN; }
    for (let i = 0; i < b.length; i++) { const v = b[i][0]; w[i] = typeof v === 'number' ? v : NaN; }
    return u[0] + w[0];
  }).ms;
  const xs = Array.from(x);
  const ysA = Array.from(y);
  row['jstat corrcoeff'] = time(() => [xs, ysA], (a, b) => jStat.corrcoeff(a, b)).ms;
  row['jstat spearmancoeff'] = n <= 1e5 ? time(() => [xs, ysA], (a, b) => jStat.spearmancoeff(a, b)).ms : null;
  row['ss sampleCorrelation'] = time(() => [xs, ysA], (a, b) => ss.sampleCorrelation(a, b)).ms;
  // The peers see the same numbers the functions were given (the first y cell as the last run left it).
  const yPeer = Float64Array.from(y);
  yPeer[0] = fresh(-2)[1][0][0];
  const py = pythonPeers(x, yPeer);
  if (py) {
    row['scipy pearsonr'] = py.pearsonr[0];
    row['scipy spearmanr'] = py.spearmanr[0];
    row['scipy kendalltau'] = py.kendalltau[0];
    row['scipy pearsonr (cells)'] = py.pearsonr_host;
    row['scipy spearmanr (cells)'] = py.spearmanr_host;
    row['scipy kendalltau (cells)'] = py.kendalltau_host;
    if (py.statsmodels_checks) row['statsmodels checks'] = py.statsmodels_checks[0];
    // answers must agree before a ratio means anything
    for (const [ours, theirs] of [['COEF pearson', py.pearsonr[1]], ['COEF spearman', py.spearmanr[1]], ['COEF kendall', py.kendalltau[1]]]) {
      const v = row[ours + ':out'];
      if (typeof v === 'number' && Math.abs(v - theirs) > 1e-6 * Math.max(1, Math.abs(theirs))) {
        console.error(`n=${n}: ${ours} = ${v} disagrees with scipy ${theirs}`);
        process.exitCode = 1;
      }
    }
  }
  rows.push(row);
}

const cols = ['read cells only', 'COEF pearson', 'COEF spearman', 'COEF kendall', 'INTERVAL', 'PVALUE', 'FLAGS', 'CHECKS', 'REPORT', 'recalc (5 fns)',
  'jstat corrcoeff', 'jstat spearmancoeff', 'ss sampleCorrelation', 'scipy pearsonr', 'scipy spearmanr', 'scipy kendalltau', 'scipy pearsonr (cells)', 'scipy spearmanr (cells)', 'scipy kendalltau (cells)', 'statsmodels checks'];
const present = cols.filter((c) => rows.some((r) => r[c] !== undefined));
console.log('\nTime per call (ms, median; the first call apart below) by data kind and number of complete pairs n:');
console.log(['kind'.padEnd(6), 'n'.padStart(9), ...present.map((c) => c.padStart(Math.max(9, c.length)))].join(' '));
for (const r of rows) console.log([r.kind.padEnd(6), String(r.n).padStart(9), ...present.map((c) => fmt(r[c]).padStart(Math.max(9, c.length)))].join(' '));
console.log('\nFirst call (ms): what the first recalculation after opening a workbook costs:');
for (const r of rows) console.log([r.kind.padEnd(6), String(r.n).padStart(9), ...['COEF pearson', 'COEF spearman', 'COEF kendall', 'CHECKS', 'REPORT'].map((c) => `${c} ${fmt(r[c + ':first'])}`)].join('  '));

console.log('\nRatios project / peer (below 1: Covary is faster):');
const pairsOfInterest = [
  ['COEF pearson', 'scipy pearsonr', 0.5], ['COEF spearman', 'scipy spearmanr', 0.5], ['COEF kendall', 'scipy kendalltau', 0.5],
  ['COEF pearson', 'scipy pearsonr (cells)'], ['COEF spearman', 'scipy spearmanr (cells)'], ['COEF kendall', 'scipy kendalltau (cells)'],
  ['CHECKS', 'statsmodels checks', 0.5], ['read cells only', 'scipy pearsonr'], ['COEF pearson', 'read cells only'], ['COEF pearson', 'jstat corrcoeff'], ['COEF spearman', 'jstat spearmancoeff'], ['COEF pearson', 'ss sampleCorrelation'],
];
for (const r of rows) {
  for (const [ours, peer, target] of pairsOfInterest) {
    if (typeof r[ours] !== 'number' || typeof r[peer] !== 'number') continue;
    const ratio = r[ours] / r[peer];
    const verdict = target === undefined ? '' : ratio <= target ? `  (target <= ${target}: met)` : `  (target <= ${target}: NOT met)`;
    ratios.push({ kind: r.kind, n: r.n, ours, peer, ratio });
    console.log(`  ${r.kind.padEnd(5)} n=${String(r.n).padEnd(8)} ${ours.padEnd(14)} / ${peer.padEnd(22)} = ${ratio.toFixed(2)}${verdict}`);
  }
}

// The host must not be blocked for more than 1 s by any one call at the largest size: the first call and the
// slowest timed call of each function.
{
  for (const big of rows.filter((r) => r.n === Math.max(...SIZES) && r.n >= 1e6)) {
    console.log(`\nLongest single call at n=${big.n}, ${big.kind} (target: no call blocks the host for more than 1 s):`);
    for (const label of ['COEF pearson', 'COEF spearman', 'COEF kendall', 'INTERVAL', 'PVALUE', 'FLAGS', 'CHECKS', 'REPORT']) {
      if (typeof big[label] !== 'number') continue;
      const worst = Math.max(big[label + ':first'], big[label + ':max']);
      console.log(`  ${label.padEnd(14)} first call ${fmt(big[label + ':first']).padStart(6)} ms, slowest later call ${fmt(big[label + ':max']).padStart(6)} ms${worst > 1000 ? '  (over 1 s)' : ''}`);
    }
  }
}

// whole-column reference: 1,048,576 rows, 1,000 filled, the rest blank (null, as Excel on the web passes them)
{
  const N = 1048576;
  const { x, y } = makeData(1000, 777);
  // Built once; each run edits the first y cell to a new value, so the cache cannot answer from memory. (Building
  // two fresh million-row arrays per run would leave their garbage to be collected inside the timed call.)
  const X = new Array(N);
  const Y = new Array(N);
  for (let i = 0; i < N; i++) {
    X[i] = [i < 1000 ? x[i] : null];
    Y[i] = [i < 1000 ? y[i] : null];
  }
  const fresh = () => {
    Y[0] = [y[0] + ++salt * 1e-6];
    return [X, Y];
  };
  call('COEF')(...fresh(), null); // warm-up
  const ms = time(fresh, (a, b) => call('COEF')(a, b, null)).ms;
  console.log(`\nWhole-column reference (1,048,576 rows, 1,000 filled) through COEF: ${ms.toFixed(1)} ms (target < 50 ms: ${ms < 50 ? 'met' : 'NOT met'})`);
}

// ---- the outlier-resisting and rating-scale coefficients, bootstrap intervals and robust comparisons: each call as a
// cell makes it (interval included), at the sizes people have, against the Pearson call in the same run. Target:
// every one within 1 s at 100,000 rows. Rating-scale data: two five-point items cut from correlated normals.
{
  const NEW_SIZES = opt('new-sizes', '1e4,1e5').split(',').map(Number);
  const cases = [
    ['INTERVAL fisher (pearson)', 'INTERVAL', [null, 'pearson', null], 'numbers'],
    ['INTERVAL bca (pearson)', 'INTERVAL', [null, 'pearson', 'bca'], 'numbers'],
    ['INTERVAL bca (spearman)', 'INTERVAL', [null, 'spearman', 'bca'], 'numbers'],
    ['INTERVAL percentage_bend', 'INTERVAL', [null, 'percentage_bend', null], 'numbers'],
    ['INTERVAL winsorized', 'INTERVAL', [null, 'winsorized', null], 'numbers'],
    ['INTERVAL biweight', 'INTERVAL', [null, 'biweight', null], 'numbers'],
    ['INTERVAL skipped', 'INTERVAL', [null, 'skipped', null], 'numbers'],
    ['INTERVAL polychoric', 'INTERVAL', [null, 'polychoric', null], 'ratings'],
    ['INTERVAL polyserial', 'INTERVAL', [null, 'polyserial', null], 'mixed'],
    ['DIFF_SHARED spearman', 'DIFF_SHARED', [null, null, 'spearman'], 'three'],
    ['REPORT percentage_bend', 'REPORT', [null, 'percentage_bend', null], 'numbers'],
  ];
  const cut = (v) => (v < 40 ? 1 : v < 46 ? 2 : v < 54 ? 3 : v < 60 ? 4 : 5);
  console.log('\nNew coefficients, bootstrap intervals and comparisons (median of runs, ms; ratio to INTERVAL fisher (pearson) in the same run):');
  for (const n of NEW_SIZES) {
    const { x, y } = makeData(n, 4242 + n);
    const z = Float64Array.from(x, (v, i) => v + 0.3 * y[i]);
    const shapes = {
      numbers: [toCol(x), toCol(y)],
      ratings: [toCol(Array.from(x, cut)), toCol(Array.from(y, (v) => cut(v + 25)))],
      mixed: [toCol(x), toCol(Array.from(y, (v) => cut(v + 25)))],
      three: [toCol(x), toCol(y), toCol(z)],
    };
    if (typeof global.gc === 'function') global.gc();
    let base = null;
    for (const [label, id, extra, shape] of cases) {
      const cols = shapes[shape];
      const fresh = () => {
        // A new value in one cell per call: nothing is answered from the cache (and the bootstrap's seed changes).
        // Rating items take the next of their five categories instead, so they stay ratings.
        cols[1][0] = [shape === 'ratings' || shape === 'mixed' ? 1 + (++salt % 5) : cols[1][0][0] + ++salt * 1e-6];
        return cols;
      };
      try {
        const r = time(fresh, (...a) => call(id)(...a, ...extra));
        const out = r.out;
        // The answer must be a value, not an error, and an interval must hold its coefficient's neighbourhood.
        if (!Array.isArray(out) || !Array.isArray(out[0])) throw new Error(`answered ${JSON.stringify(out)}`);
        if (base === null) base = r.ms;
        const worst = Math.max(r.first, r.max);
        console.log(`  n=${String(n).padEnd(8)} ${label.padEnd(26)} ${fmt(r.ms).padStart(8)} ms  x${(r.ms / base).toFixed(1).padStart(6)}  slowest ${fmt(worst)} ms${n >= 1e5 && n <= 1.1e5 ? (worst <= 1000 ? '  (target <= 1 s: met)' : '  (target <= 1 s: NOT met)') : ''}`);
        ratios.push({ n, ours: label, peer: 'INTERVAL fisher (pearson)', ratio: r.ms / base });
      } catch (e) {
        console.log(`  n=${String(n).padEnd(8)} ${label.padEnd(26)} error: ${e && e.message}`);
        process.exitCode = 1;
      }
    }
  }
}

console.log('\nBundle sizes:');
for (const f of ['functions.js', 'taskpane.js', 'workbench.js', 'formula-worker.js']) {
  const p = path.join(dist, f);
  if (fs.existsSync(p)) console.log(`  ${f.padEnd(18)} ${(fs.statSync(p).size / 1024).toFixed(1)} KiB`);
}
const jsonOut = opt('json', null);
if (jsonOut) fs.writeFileSync(jsonOut, JSON.stringify({ rows, ratios }, null, 1));
