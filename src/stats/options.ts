/**
 * The one check of the options every statistic takes: the confidence level, the significance level alpha, the
 * tail (and a power, for planning). Every entry point of the core calls these, so a caller that is not a cell
 * function (the panel, a test) meets the same rule and the same message as a cell.
 */
import { StatsInputError, Tail, TAILS } from './types';

/** A probability strictly between 0 and 1, with a message that names it and shows a usual value. */
export function assertOpenProbability(v: number, name: string, usual: string): number {
  if (!(v > 0 && v < 1)) throw new StatsInputError('out-of-range', `${name} must be between 0 and 1, e.g. ${usual} (got ${v})`);
  return v;
}

/** The confidence level of a two-sided interval: strictly between 0 and 1. */
export function validLevel(level: number): number {
  return assertOpenProbability(level, 'level', '0.95');
}

/** The significance level of a test: strictly between 0 and 1. */
export function validAlpha(alpha: number): number {
  return assertOpenProbability(alpha, 'alpha', '0.05');
}

/** The power a study aims for: strictly between 0 and 1. */
export function validPower(power: number): number {
  return assertOpenProbability(power, 'power', '0.8');
}

/** One of the tails "both", "positive", "negative". */
export function validTail(tail: Tail): Tail {
  if (!TAILS.includes(tail)) throw new StatsInputError('bad-option', `tail must be one of ${TAILS.map((t) => `"${t}"`).join(', ')} (got "${String(tail)}")`);
  return tail;
}

/** Checks { level, tail } together (the options of every interval-and-test entry point). */
export function validTestOptions<T extends { level: number; tail: Tail }>(opts: T): T {
  validLevel(opts.level);
  validTail(opts.tail);
  return opts;
}
