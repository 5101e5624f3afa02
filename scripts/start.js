#!/usr/bin/env node
/* `npm start`: builds dist/ (webpack, production) unless it is newer than every source, serves it on
 * http://localhost:3000 (PORT overrides; PORT=0 picks a free port) and opens a browser on the workbench when one
 * is available and BROWSER is not "none". Never reaches past the loopback interface.
 *
 *   npm start                    build if needed, serve, open a browser
 *   PORT=8080 BROWSER=none npm start
 *   npm start -- --https         serve over HTTPS with the Office dev certificates (for Excel: see docs/workbench.md)
 *   npm start -- --no-build      serve dist/ as it is
 */
'use strict';
const fs = require('fs');
const os = require('os');
const path = require('path');
const { spawn, spawnSync } = require('child_process');
const { serveDist } = require('./serve-dist');

const root = path.resolve(__dirname, '..');
const dist = path.join(root, 'dist');
const stampFile = path.join(dist, '.build-stamp');

/** What a working dist/ must hold. */
const OUTPUTS = ['functions.js', 'functions.json', 'formula-worker.js', 'workbench.html', 'workbench.js', 'workbench.css', 'taskpane.html', 'taskpane.js', 'panel.css', 'panel-worker.js'];
/** What the build reads: a change to any of these makes dist/ stale. */
const SOURCE_DIRS = ['src', 'taskpane', 'workbench', 'assets'];
const SOURCE_FILES = ['webpack.config.js', 'webpack.ui.js', 'tsconfig.json', 'package.json', 'package-lock.json'];

function log(message) {
  process.stdout.write(`[covary] ${message}\n`);
}

function newestSourceTime() {
  let newest = 0;
  const visit = (p) => {
    let st;
    try {
      st = fs.statSync(p);
    } catch {
      return;
    }
    if (st.isDirectory()) {
      for (const name of fs.readdirSync(p)) if (name !== 'node_modules' && !name.startsWith('.')) visit(path.join(p, name));
    } else if (st.mtimeMs > newest) newest = st.mtimeMs;
  };
  for (const d of SOURCE_DIRS) visit(path.join(root, d));
  for (const f of SOURCE_FILES) visit(path.join(root, f));
  return newest;
}

/** When dist/ was last built: the stamp written by our build (webpack leaves unchanged files untouched, so their
 *  times say little), else the oldest output; 0 when an output is missing. */
function builtTime() {
  let oldest = Infinity;
  for (const f of OUTPUTS) {
    try {
      oldest = Math.min(oldest, fs.statSync(path.join(dist, f)).mtimeMs);
    } catch {
      return 0;
    }
  }
  try {
    return fs.statSync(stampFile).mtimeMs;
  } catch {
    return oldest;
  }
}

function build() {
  const started = new Date();
  log('building dist/ (webpack, production)…');
  const cli = require.resolve('webpack-cli/bin/cli.js', { paths: [root] });
  const r = spawnSync(process.execPath, [cli, '--mode', 'production'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) return false;
  fs.writeFileSync(stampFile, `built ${started.toISOString()}\n`);
  // The stamp carries the build's start time: a source saved during the build still counts as newer.
  fs.utimesSync(stampFile, started, started);
  return true;
}

function devCertificates() {
  const dir = path.join(os.homedir(), '.office-addin-dev-certs');
  const read = (name) => fs.readFileSync(path.join(dir, name));
  try {
    return { key: read('localhost.key'), cert: read('localhost.crt'), ca: read('ca.crt') };
  } catch {
    log(`no development certificates in ${dir}: run \`npx office-addin-dev-certs install\` first.`);
    process.exit(1);
    return undefined;
  }
}

function onPath(command) {
  return (process.env.PATH || '').split(path.delimiter).some((d) => {
    try {
      fs.accessSync(path.join(d, command), fs.constants.X_OK);
      return true;
    } catch {
      return false;
    }
  });
}

/** Opens the page in a browser when there is one to open; quietly does nothing otherwise. */
function openBrowser(url) {
  const choice = process.env.BROWSER;
  if (choice === 'none' || process.env.CI) return;
  let command;
  let args;
  if (choice) {
    command = choice;
    args = [url];
  } else if (process.platform === 'darwin') {
    command = 'open';
    args = [url];
  } else if (process.platform === 'win32') {
    command = 'cmd';
    args = ['/c', 'start', '""', url];
  } else if ((process.env.DISPLAY || process.env.WAYLAND_DISPLAY) && onPath('xdg-open')) {
    command = 'xdg-open';
    args = [url];
  } else {
    return;
  }
  try {
    const child = spawn(command, args, { stdio: 'ignore', detached: true });
    child.on('error', () => undefined);
    child.unref();
  } catch {
    // No browser after all: the URL is printed above.
  }
}

async function main() {
  const argv = process.argv.slice(2);
  const useTls = argv.includes('--https') || /^(1|true)$/i.test(process.env.HTTPS || '');
  const skipBuild = argv.includes('--no-build');
  const port = process.env.PORT !== undefined && process.env.PORT !== '' ? Number(process.env.PORT) : 3000;
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    log(`PORT must be a port number, got "${process.env.PORT}"`);
    process.exit(1);
  }

  if (!skipBuild) {
    const stale = builtTime() < newestSourceTime();
    if (stale && !build()) {
      if (builtTime() === 0) {
        log('the build failed and dist/ is incomplete: see the errors above.');
        process.exit(1);
      }
      log('the build failed: serving the previous build in dist/ (see the errors above).');
    } else if (!stale) {
      log('dist/ is up to date.');
    }
  }

  const tls = useTls ? devCertificates() : undefined;
  let server;
  try {
    server = await serveDist({ dist, port, tls });
  } catch (e) {
    log(e && e.code === 'EADDRINUSE' ? `port ${port} is in use: set PORT to another one (e.g. PORT=3001 npm start).` : `could not start the server: ${e && e.message}`);
    process.exit(1);
  }
  const running = server;
  const stop = () => {
    for (const s of running.servers) s.closeAllConnections?.();
    running.close().then(() => process.exit(0));
    setTimeout(() => process.exit(0), 2000).unref();
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
  const url = `${useTls ? 'https' : 'http'}://localhost:${server.port}/`;
  log(`workbench: ${url}`);
  log('press Ctrl+C to stop.');
  openBrowser(url);
}

main();
