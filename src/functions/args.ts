/**
 * The optional and required arguments of the cell functions, as Excel passes them: an omitted argument arrives as
 * null (or "" from an empty referenced cell), words are matched case-insensitively. The ranges of allowed values
 * are the core's (src/stats/options.ts), so a cell and any other caller meet one rule.
 */
import { validAlpha, validLevel } from '../stats/options';
import { CLASSICAL_METHODS, ClassicalMethod, INTERVAL_METHODS, IntervalMethod, Method, METHODS, StatsInputError, Tail, TAILS } from '../stats/types';

/** True when an optional argument was omitted (Excel passes null; an empty referenced cell may give ""; 0 is a value). */
export function omitted(v: unknown): boolean {
  return v === null || v === undefined || v === '';
}

/** An optional text option, matched case-insensitively against the allowed words. */
export function optionWord<T extends string>(v: unknown, allowed: readonly T[], fallback: T, argName: string): T {
  if (omitted(v)) return fallback;
  const s = typeof v === 'string' ? v.trim().toLowerCase() : String(v);
  const hit = allowed.find((a) => a === s);
  if (hit === undefined) {
    throw new StatsInputError('bad-option', `${argName} must be one of ${allowed.map((a) => `"${a}"`).join(', ')} (got "${String(v)}")`);
  }
  return hit;
}

export function optTail(v: unknown): Tail {
  return optionWord(v, TAILS, 'both', 'tail');
}

export function optMethod(v: unknown): Method {
  return optionWord(v, METHODS, 'pearson', 'method');
}

/** A coefficient whose test needs only r and n (a reported correlation, an equivalence test). */
export function optClassicalMethod(v: unknown): ClassicalMethod {
  return optionWord(v, CLASSICAL_METHODS, 'pearson', 'method');
}

/** How the interval is made; omitted leaves the coefficient's own default (Fisher z, or the percentile bootstrap). */
export function optInterval(v: unknown): IntervalMethod | undefined {
  return omitted(v) ? undefined : optionWord(v, INTERVAL_METHODS, 'fisher', 'interval');
}

/** An optional number argument. */
export function optNumber(v: unknown, fallback: number, argName: string): number {
  if (omitted(v)) return fallback;
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new StatsInputError('bad-option', `${argName} must be a number`);
  return v;
}

/** The confidence level: strictly between 0 and 1, default 0.95. */
export function optLevel(v: unknown): number {
  return validLevel(optNumber(v, 0.95, 'level'));
}

/** The significance level alpha: strictly between 0 and 1, default 0.05. */
export function optAlpha(v: unknown): number {
  return validAlpha(optNumber(v, 0.05, 'alpha'));
}

/** A required number argument. */
export function requiredNumber(v: unknown, argName: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new StatsInputError('bad-option', `${argName} must be a number`);
  return v;
}

/** TRUE/FALSE argument; omitted means FALSE. */
export function optFlag(v: unknown, argName: string): boolean {
  if (omitted(v)) return false;
  if (typeof v === 'boolean') return v;
  throw new StatsInputError('bad-option', `${argName} must be TRUE or FALSE`);
}
