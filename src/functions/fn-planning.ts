/**
 * Cell functions for planning a study of a correlation: power, sample size and the smallest detectable
 * correlation, for the test of "no correlation". Thin adapter: read the arguments, call the core.
 */
import { correlationPower, detectableCorrelation, sampleSizeForCorrelation } from '../stats/planning/power';
import { optAlpha, optNumber, optTail, requiredNumber } from './args';
import { guard } from './errors';

/**
 * The chance that a study with n rows finds a significant correlation when the true correlation is r: its power. Useful before collecting data, to see whether the planned number of rows is enough. Assumes the two measures are roughly bell-shaped together; computed from the exact distribution of the correlation.
 * @customfunction POWER
 * @param r The true correlation you expect or want to be able to find, strictly between -1 and 1.
 * @param n The planned number of rows (pairs of values), a whole number of at least 4.
 * @param [alpha] The significance level, between 0 and 1, default 0.05.
 * @param [tail] "both" (default: a correlation of either sign counts), "positive" (only a positive correlation is tested for) or "negative".
 * @returns The power, between 0 and 1 (0.8 means 8 chances in 10 of a significant result).
 */
export function POWER(r: number, n: number, alpha?: number, tail?: string): number {
  return guard(() => correlationPower(requiredNumber(r, 'r'), requiredNumber(n, 'n'), { alpha: optAlpha(alpha), tail: optTail(tail) }).power);
}

/**
 * The smallest number of rows a study needs to find a true correlation of r with the chosen power. For planning data collection; assumes the two measures are roughly bell-shaped together; computed from the exact distribution of the correlation.
 * @customfunction SAMPLE_SIZE
 * @param r The true correlation you expect or want to be able to find, strictly between -1 and 1 and not 0.
 * @param [power] The chance of a significant result you want, between 0 and 1, default 0.8.
 * @param [alpha] The significance level, between 0 and 1, default 0.05.
 * @param [tail] "both" (default: a correlation of either sign counts), "positive" (only a positive correlation is tested for) or "negative".
 * @returns The number of rows (pairs of values), a whole number.
 */
export function SAMPLE_SIZE(r: number, power?: number, alpha?: number, tail?: string): number {
  return guard(
    () => sampleSizeForCorrelation(requiredNumber(r, 'r'), optNumber(power, 0.8, 'power'), { alpha: optAlpha(alpha), tail: optTail(tail) }).n,
  );
}

/**
 * The weakest true correlation a study with n rows finds with the chosen power: anything weaker is likely to be missed. Useful when the number of rows is already fixed. Assumes the two measures are roughly bell-shaped together; computed from the exact distribution of the correlation.
 * @customfunction DETECTABLE
 * @param n The number of rows (pairs of values), a whole number of at least 4.
 * @param [power] The chance of a significant result you want, between 0 and 1, default 0.8.
 * @param [alpha] The significance level, between 0 and 1, default 0.05.
 * @param [tail] "both" (default: a correlation of either sign counts), "positive" (only a positive correlation is tested for) or "negative" (the answer is then negative).
 * @returns The smallest correlation detectable, between 0 and 1 (between -1 and 0 for tail "negative").
 */
export function DETECTABLE(n: number, power?: number, alpha?: number, tail?: string): number {
  return guard(
    () => detectableCorrelation(requiredNumber(n, 'n'), optNumber(power, 0.8, 'power'), { alpha: optAlpha(alpha), tail: optTail(tail) }).rho,
  );
}
