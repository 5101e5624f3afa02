/**
 * Fits the 1,048,576-row cases of large.test.ts in a plain Node.js process: inside Jest's sandbox every global
 * lookup (Math.exp, Math.log, ...) is much slower, which makes a million-row pass about twenty times longer.
 * The TypeScript sources are transpiled on require (typescript's transpileModule, no type checking: the tests and
 * `tsc` check types). Usage: node large-child.js <polycor-r.json>; prints the fits as JSON.
 */
const fs = require('fs');
const path = require('path');
const ts = require('typescript');

require.extensions['.ts'] = (module, filename) => {
  const source = fs.readFileSync(filename, 'utf8');
  const out = ts.transpileModule(source, {
    compilerOptions: { module: ts.ModuleKind.CommonJS, target: ts.ScriptTarget.ES2020, esModuleInterop: true },
    fileName: filename,
  });
  module._compile(out.outputText, filename);
};

const src = path.resolve(__dirname, '../../../../../src/stats/ordinal');
const { polychoric } = require(path.join(src, 'polychoric.ts'));
const { polyserial } = require(path.join(src, 'polyserial.ts'));

const fixture = JSON.parse(fs.readFileSync(process.argv[2], 'utf8'));

/** The base rows repeated `repeats` times, into one Float64Array (as a sheet column would arrive). */
function repeated(values, repeats) {
  const out = new Float64Array(values.length * repeats);
  for (let r = 0; r < repeats; r++) out.set(values, r * values.length);
  return out;
}

const results = {};
for (const [kind, fit] of [['polychoric', polychoric], ['polyserial', polyserial]]) {
  const c = fixture.large[kind];
  const x = repeated(c.x, c.repeats);
  const y = repeated(c.y, c.repeats);
  results[kind] = {};
  for (const estimator of ['two-step', 'ml']) {
    const started = Date.now();
    const f = fit(x, y, { estimator });
    results[kind][estimator] = { ...f, ms: Date.now() - started, rows: x.length };
  }
}
process.stdout.write(JSON.stringify(results));
