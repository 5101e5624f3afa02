/* The two pages: the task pane (inside Excel, shared runtime with functions.js) and the Office-free workbench.
 * Both carry a strict Content-Security-Policy in their HTML templates. */
const path = require('path');
const HtmlWebpackPlugin = require('html-webpack-plugin');
const CopyWebpackPlugin = require('copy-webpack-plugin');

module.exports = (mode, common) => [
  {
    ...common(mode),
    name: 'pages',
    entry: {
      taskpane: './taskpane/taskpane.ts',
      // The panel's background thread for very large inputs (taskpane/compute-client.ts).
      'panel-worker': './taskpane/panel-worker.ts',
      workbench: './workbench/workbench.ts',
      'formula-worker': './workbench/formula-worker.ts',
    },
    output: { path: path.resolve(__dirname, 'dist'), filename: '[name].js', clean: false },
    optimization: { splitChunks: false, runtimeChunk: false },
    plugins: [
      new HtmlWebpackPlugin({ filename: 'taskpane.html', template: './taskpane/taskpane.html', chunks: ['taskpane'], inject: 'body', scriptLoading: 'blocking' }),
      // The panel's stylesheet and the add-in icons are plain files (no CSS loader; the pages allow styles from
      // their own server only). Both the task pane and the workbench load dist/panel.css.
      new CopyWebpackPlugin({ patterns: [{ from: 'taskpane/panel.css', to: 'panel.css' }, { from: 'assets', to: 'assets' }] }),
      new HtmlWebpackPlugin({ filename: 'workbench.html', template: './workbench/workbench.html', chunks: ['workbench'], inject: 'body', scriptLoading: 'blocking' }),
      // The workbench's stylesheet is a plain file: the page's policy allows styles from this server only.
      new CopyWebpackPlugin({ patterns: [{ from: 'workbench/workbench.css', to: 'workbench.css' }] }),
    ],
  },
];
