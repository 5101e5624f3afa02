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
const fs = require('fs');
const path = require('path');
const results = path.join(__dirname, '..', 'test-artifacts', 'jest-results.json');
fs.mkdirSync(path.dirname(results), { recursive: true });
const r = spawnSync(npx, ['jest', '--ci', '--json', `--outputFile=${results}`, ...only], { stdio: 'inherit' });
// A plain closing line, whatever the runner printed above.
try {
  const j = JSON.parse(fs.readFileSync(results, 'utf8'));
  process.stdout.write(`\ntests: ${j.numPassedTests} passed, ${j.numFailedTests} failed\n`);
  if (j.numTotalTests === 0) process.exit(1);
} catch {
  process.stdout.write('\ntests: the runner wrote no results\n');
  process.exit(1);
}
process.exit(r.status === 0 ? 0 : r.status || 1);
