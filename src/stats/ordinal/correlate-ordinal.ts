import { PreparedPairs } from '../correlation/prepared';
import { pFromZ } from '../correlation/fisher';
import { CorrelationResult, IntervalMethod, OrdinalMethod, StatsInputError, Tail } from '../types';
import { distinctCount } from './categories';
import { ordinalInterval, OrdinalFit, polychoric } from './polychoric';
import { polyserial } from './polyserial';

export interface OrdinalOptions {
  method: OrdinalMethod;
  tail: Tail;
  level: number;
  interval?: IntervalMethod | 'none';
}

/**
 * The polychoric or polyserial correlation as a correlation result: the maximum-likelihood estimate (Olsson 1979;
 * Olsson, Drasgow & Dorans 1982), its likelihood-ratio test of rho = 0 (one-sided tails from the signed root),
 * and the Wald interval on Fisher's z scale from the estimate's standard error.
 * For polyserial the column with fewer distinct values is taken as the ordered one.
 * @throws StatsInputError for a bootstrap interval (not offered for these), too many categories, a constant column.
 */
export function correlateOrdinal(prep: PreparedPairs, opts: OrdinalOptions): CorrelationResult {
  const { method, tail, level } = opts;
  if (opts.interval === 'percentile' || opts.interval === 'bca') {
    throw new StatsInputError('bad-option', `the ${method} correlation's interval comes from its likelihood: ask for the default interval`);
  }
  const n = prep.n;
  if (n < 3) throw new StatsInputError('too-few', `only ${n} usable pairs: at least 3 are needed`);
  let fit: OrdinalFit;
  if (method === 'polychoric') {
    fit = polychoric(prep.x, prep.y, { estimator: 'two-step' });
  } else {
    const xOrdinal = distinctCount(prep.x) <= distinctCount(prep.y);
    fit = xOrdinal ? polyserial(prep.y, prep.x, { estimator: 'two-step' }) : polyserial(prep.x, prep.y, { estimator: 'two-step' });
  }
  const p = tail === 'both' ? fit.pValue : pFromZ(fit.signedZ, tail);
  const interval = ordinalInterval(fit.rho, fit.se, level);
  return {
    method, name: method, statistic: fit.rho, pValue: p, tail, interval: { ...interval, note: interval.note ?? fit.note }, n,
    test: { name: 'z', value: fit.signedZ },
    pMethod: `likelihood-ratio test of rho = 0 (G^2 = ${fit.lrStatistic.toPrecision(4)}, 1 df)`,
    note: fit.note,
  };
}
