/* Builds three things into dist/:
 *  - functions.js + functions.json: the custom functions. functions.json is generated from JSDoc by
 *    custom-functions-metadata-plugin (never hand-edited). functions.js must load in a bare JavaScript context
 *    whose only host global is CustomFunctions, so it is a single self-contained script with no chunk loading
 *    and globalThis as its global object.
 *  - taskpane.html + taskpane.js: the side panel (shared runtime: the page also loads functions.js).
 *  - workbench.html + workbench.js: the Office-free workbench that hosts the real panel and functions.js.
 */
const path = require('path');
const fs = require('fs');
const CustomFunctionsMetadataPlugin = require('custom-functions-metadata-plugin');

const dist = path.resolve(__dirname, 'dist');
// The one list of cell-function modules is the imports of src/functions/functions.ts: the bundle is built from it,
// and the metadata plugin reads the same files (test/unit/functions/registration.test.ts holds the two together).
const functionSources = fs
  .readFileSync(path.resolve(__dirname, 'src/functions/functions.ts'), 'utf8')
  .split('\n')
  .map((line) => /^import '\.\/(fn-[a-z-]+)';$/.exec(line.trim()))
  .filter(Boolean)
  .map((m) => `./src/functions/${m[1]}.ts`);
if (functionSources.length === 0) throw new Error('src/functions/functions.ts imports no fn-*.ts module');

const common = (mode) => ({
  mode,
  devtool: false,
  target: ['web', 'es2020'],
  resolve: { extensions: ['.ts', '.js'] },
  module: {
    rules: [{ test: /\.ts$/, exclude: /node_modules/, use: { loader: 'ts-loader', options: { configFile: 'tsconfig.json', onlyCompileBundledFiles: true } } }],
  },
  performance: { hints: false },
});

module.exports = (_env, argv) => {
  const mode = argv && argv.mode ? argv.mode : 'production';
  const configs = [
    {
      ...common(mode),
      name: 'functions',
      entry: { functions: './src/functions/functions.ts' },
      output: { path: dist, filename: '[name].js', globalObject: 'globalThis', iife: true, clean: false },
      optimization: { splitChunks: false, runtimeChunk: false },
      plugins: [new CustomFunctionsMetadataPlugin({ output: 'functions.json', input: functionSources })],
    },
  ];
  const extra = path.resolve(__dirname, 'webpack.ui.js');
  if (fs.existsSync(extra)) configs.push(...require(extra)(mode, common));
  return configs;
};
