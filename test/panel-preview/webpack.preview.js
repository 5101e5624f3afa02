/* Builds the panel preview page into test-artifacts/preview/ (gitignored):
 *   npx webpack --config test/panel-preview/webpack.preview.js --mode development */
const path = require('path');
const HtmlWebpackPlugin = require('html-webpack-plugin');
const CopyWebpackPlugin = require('copy-webpack-plugin');

const root = path.resolve(__dirname, '../..');
module.exports = (_env, argv) => ({
  mode: (argv && argv.mode) || 'development',
  devtool: false,
  context: root,
  target: ['web', 'es2020'],
  entry: { preview: './test/panel-preview/preview.ts', 'panel-worker': './taskpane/panel-worker.ts' },
  output: { path: path.resolve(root, 'test-artifacts/preview'), filename: '[name].js', clean: true },
  resolve: { extensions: ['.ts', '.js'] },
  module: { rules: [{ test: /\.ts$/, exclude: /node_modules/, use: { loader: 'ts-loader', options: { configFile: 'tsconfig.json', onlyCompileBundledFiles: true, transpileOnly: true } } }] },
  optimization: { splitChunks: false, runtimeChunk: false },
  performance: { hints: false },
  plugins: [
    new HtmlWebpackPlugin({ filename: 'index.html', template: './test/panel-preview/preview.html', chunks: ['preview'], inject: 'body', scriptLoading: 'blocking' }),
    new CopyWebpackPlugin({ patterns: [{ from: 'taskpane/panel.css', to: 'panel.css' }, { from: 'assets', to: 'assets' }] }),
  ],
});
