/**
 * Properties that hold for every registered cell function, whatever the input (issue: "nothing wrong reaches a
 * cell"). The list of functions and their parameters come from dist/functions.json, the functions themselves
 * from dist/functions.js hosted bare, so each function that lands is covered as soon as it is built.
 *
 * - Never a raw exception: only the host's error type, with a code the host knows and a non-empty message that
 *   says what is wrong, not one of the cell layer's last-resort messages ("Covary could not compute this: ...",
 *   "the result is not a finite number ...") that mean a computation failed on input it had accepted.
 * - Never NaN or Infinity anywhere in an answer, and no null/undefined in a spilled array (Excel shows null as 0).
 * - Answers are a scalar or a rectangular 2-D array.
 * - Range checks per output (support/output-roles.ts): correlations in [-1, 1], p-values in [0, 1], intervals
 *   ordered and containing their estimate.
 *
 * Needs `npm run build` first.
 */
import fc from 'fast-check';
import { argsFor } from './support/cells';
import { OUTPUT_ROLES } from './support/output-roles';
import { callCell, describeOutcome, functionsMeta, HOST_ERROR_CODES, host } from './support/registry';

/** Violations of the properties every answer must have. */
function answerViolations(value: unknown): string[] {
  const out: string[] = [];
  const cell = (v: unknown, where: string) => {
    if (v === null || v === undefined) out.push(`${where} is ${String(v)} (shows as 0 in Excel)`);
    else if (typeof v === 'number' && !Number.isFinite(v)) out.push(`${where} is ${v}`);
    else if (typeof v !== 'number' && typeof v !== 'string' && typeof v !== 'boolean') out.push(`${where} is a ${typeof v}`);
  };
  if (Array.isArray(value)) {
    if (value.length === 0) out.push('empty array');
    const width = Array.isArray(value[0]) ? (value[0] as unknown[]).length : -1;
    if (width < 1) out.push('answer is not a 2-D array with at least one column');
    value.forEach((row, i) => {
      if (!Array.isArray(row)) out.push(`row ${i} is not an array`);
      else {
        if (row.length !== width) out.push(`row ${i} has ${row.length} cells, row 0 has ${width}`);
        row.forEach((v, j) => cell(v, `cell [${i}][${j}]`));
      }
    });
  } else cell(value, 'the answer');
  return out;
}

function errorViolations(code: string, message: string): string[] {
  const out: string[] = [];
  if (!HOST_ERROR_CODES.has(code)) out.push(`unknown error code ${code}`);
  if (typeof message !== 'string' || message.trim() === '') out.push('error without a message');
  // Both are last-resort messages of the cell layer (cells.ts): an internal exception, or NaN/Infinity computed
  // where the input had passed validation. Either means the function failed on input it accepted.
  if (/could not compute this/.test(message)) out.push(`an internal exception reached the cell: "${message}"`);
  if (/result is not a finite number/.test(message)) out.push(`the function computed NaN or Infinity: "${message}"`);
  return out;
}

const RUNS = Number(process.env.COVARY_PROPERTY_RUNS ?? 150);

describe('every registered function, hostile and well-formed input', () => {
  test('the bundle registers the functions of functions.json', () => {
    expect([...host.fns.keys()].sort()).toEqual(functionsMeta.map((f) => f.id).sort());
  });

  test.each(functionsMeta.map((f) => [f.id, f] as const))('%s: no raw exception, no NaN/Infinity, outputs in range', (id, f) => {
    const roles = OUTPUT_ROLES[id];
    fc.assert(
      fc.property(argsFor(f), (args) => {
        const outcome = callCell(id, args);
        let problems: string[];
        if (outcome.kind === 'raw-exception') problems = ['raw exception'];
        else if (outcome.kind === 'host-error') problems = errorViolations(outcome.code, outcome.message);
        else {
          problems = answerViolations(outcome.value);
          if (problems.length === 0 && roles) problems = roles(outcome.value, args);
        }
        if (problems.length) throw new Error(`${id} -> ${describeOutcome(outcome)}: ${problems.join('; ')}`);
      }),
      { numRuns: RUNS },
    );
    expect(host.touched).toEqual([]);
  });
});
