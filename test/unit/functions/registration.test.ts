/**
 * Registration: the cell functions the add-in must offer are all in the build, nothing else is, and the one list
 * of function modules (src/functions/functions.ts) names every fn-*.ts module there is. A missing function fails
 * here rather than dropping out of the property tests, which iterate over what the build registered.
 */
import * as fs from 'fs';
import * as path from 'path';
import { EXPECTED_FUNCTIONS, functionsMeta, host } from '../properties/support/registry';

const FUNCTIONS_DIR = path.resolve(__dirname, '../../../src/functions');

test('dist/functions.json and the bundle hold exactly the expected functions', () => {
  const expected = [...EXPECTED_FUNCTIONS].sort();
  expect(functionsMeta.map((f) => f.id).sort()).toEqual(expected);
  expect([...host.fns.keys()].sort()).toEqual(expected);
});

test('functions.ts imports every fn-*.ts module, once, and nothing that is not one', () => {
  const onDisk = fs.readdirSync(FUNCTIONS_DIR).filter((f) => /^fn-.*\.ts$/.test(f)).map((f) => f.replace(/\.ts$/, '')).sort();
  const listed = fs.readFileSync(path.join(FUNCTIONS_DIR, 'functions.ts'), 'utf8')
    .split('\n')
    .map((line) => /^import '\.\/([^']+)';$/.exec(line.trim()))
    .filter((m): m is RegExpExecArray => m !== null)
    .map((m) => m[1]);
  expect(listed.length).toBeGreaterThan(0);
  expect([...listed].sort()).toEqual(onDisk);
  expect(new Set(listed).size).toBe(listed.length);
});

test('every function has a description and a description for each parameter (the tooltips Excel shows)', () => {
  for (const f of functionsMeta) {
    expect([f.id, (f.description ?? '').length > 20]).toEqual([f.id, true]);
    for (const p of f.parameters) expect([f.id, p.name, (p.description ?? '').length > 3]).toEqual([f.id, p.name, true]);
  }
});
