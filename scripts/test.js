#!/usr/bin/env node
/* The one test command: typecheck (strict, plus the host-free core config), build dist/, then run the unit
 * tests and the browser tests (Debian's Chromium at /usr/bin/chromium, driven by playwright-core). */
const { spawnSync } = require('child_process');

function step(label, cmd, args) {
  process.stdout.write(`\n== ${label}: ${cmd} ${args.join(' ')}\n`);
  const r = spawnSync(cmd, args, { stdio: 'inherit', shell: false });
  if (r.status !== 0) {
    process.stdout.write(`\n== ${label} failed (exit ${r.status})\n`);
    process.exit(r.status || 1);
  }
}

const npx = process.platform === 'win32' ? 'npx.cmd' : 'npx';
step('typecheck', npx, ['tsc', '-p', 'tsconfig.json', '--noEmit']);
step('typecheck core (no host types)', npx, ['tsc', '-p', 'tsconfig.stats.json', '--noEmit']);
step('build', npx, ['webpack', '--mode', 'production']);
const only = process.argv.slice(2);
step('tests', npx, ['jest', '--ci', ...(only.length ? only : [])]);
