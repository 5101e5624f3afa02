/**
 * The functions as Excel sees them: the metadata the build wrote (dist/functions.json) and the bundle
 * (dist/functions.js) hosted in a bare context. Property tests iterate over this list, so a function that lands
 * later is covered without touching the tests. Needs `npm run build` first.
 */
import * as fs from 'fs';
import { BareHost, distFile, HostError, loadBundle } from '../../../helpers/bare-host';

export type { FunctionMeta, ParameterMeta as ParamMeta } from '../../../../workbench/function-metadata';
import type { FunctionMeta } from '../../../../workbench/function-metadata';

if (!fs.existsSync(distFile('functions.js')) || !fs.existsSync(distFile('functions.json'))) {
  throw new Error('dist/functions.js is missing: run `npm run build` first (npm test does)');
}

export const host: BareHost = loadBundle();
export const functionsMeta: FunctionMeta[] = (
  JSON.parse(fs.readFileSync(distFile('functions.json'), 'utf8')) as { functions: FunctionMeta[] }
).functions;

export function metaOf(id: string): FunctionMeta | undefined {
  return functionsMeta.find((f) => f.id === id);
}

/**
 * Every function the add-in must offer. Written out, not read from the build, so a function that goes missing
 * fails test/unit/functions/registration.test.ts instead of dropping out of the property tests unnoticed; a new
 * function is added here when it lands.
 */
export const EXPECTED_FUNCTIONS = [
  'COEF', 'INTERVAL', 'PVALUE', 'PAIRS', 'REPORTED',
  'CHECKS', 'FLAGS', 'REPORT', 'SENSITIVITY',
  'NEGLIGIBLE', 'BAYES', 'BAYES_REPORTED', 'CORRECTED',
  'DIFF_GROUPS', 'DIFF_SHARED', 'DIFF_SEPARATE', 'DIFF_REPORTED', 'PARTIAL', 'MATRIX',
  'POWER', 'SAMPLE_SIZE', 'DETECTABLE',
  'RESIDUALS',
] as const;

/** The metadata of a function that must be registered; throws (failing the test that asked) when it is not. */
export function requireFunction(id: string): FunctionMeta {
  const meta = metaOf(id);
  if (!meta || !host.fns.has(id)) throw new Error(`${id} is not registered by dist/functions.js`);
  return meta;
}

/** The outcome of one call, sorted into what a cell would show. */
export type Outcome =
  | { kind: 'value'; value: unknown }
  | { kind: 'host-error'; code: string; message: string }
  | { kind: 'raw-exception'; error: unknown };

/** Error codes a custom function may throw (the host's ErrorCode values). */
export const HOST_ERROR_CODES = new Set(['#VALUE!', '#N/A', '#DIV/0!', '#NUM!', '#NULL!']);

/** Calls a registered function as Excel would and says what came out; never throws. */
export function callCell(id: string, args: unknown[]): Outcome {
  const fn = host.fns.get(id);
  if (!fn) throw new Error(`${id} is not registered by dist/functions.js`);
  try {
    return { kind: 'value', value: fn(...args) };
  } catch (e) {
    if (e instanceof host.HostError) {
      const he = e as HostError;
      return { kind: 'host-error', code: he.code, message: he.message };
    }
    return { kind: 'raw-exception', error: e };
  }
}

/** The value of a call that must succeed; throws with the host message otherwise (for invariance tests). */
export function valueOf(id: string, args: unknown[]): unknown {
  const out = callCell(id, args);
  if (out.kind === 'value') return out.value;
  if (out.kind === 'host-error') throw new Error(`${id} answered ${out.code} "${out.message}"`);
  throw out.error;
}

/** Describes an outcome in one line for failure messages. */
export function describeOutcome(o: Outcome): string {
  if (o.kind === 'value') return `value ${JSON.stringify(o.value)}`;
  if (o.kind === 'host-error') return `${o.code} "${o.message}"`;
  const e = o.error;
  return `raw exception ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`;
}
