/**
 * The panel's plain-language reading of one correlation: strength, direction, what the interval and the
 * p-value say (and what the p-value does not say). Short sentences naming the columns; the strength words and
 * their convention are the core's (src/stats/checks/advice.ts), so the panel and COVARY.REPORT use the same
 * words. Pure.
 */
import { STRENGTH_CONVENTION, strengthWord, tauOnRScale } from '../src/stats/checks/advice';
import { formatCount, formatPValue, formatR } from '../src/stats/format';
import type { CorrelationResult } from '../src/stats/types';

/**
 * Two or three short sentences: the strength and direction, the interval, the p-value.
 * @example readCorrelation(res, 'Visits', 'Sales')[0] // "Medium positive correlation by Cohen's (1988) convention ..."
 */
export function readCorrelation(res: CorrelationResult, xName: string, yName: string): string[] {
  const r = res.statistic;
  // Kendall's tau runs smaller than r for the same association: its strength word is read on the scale of r.
  const strength = strengthWord(res.method === 'kendall' ? tauOnRScale(r) : r);
  const lines: string[] = [];
  if (r === 0) {
    lines.push(`No ${res.method === 'pearson' ? 'straight-line ' : ''}association between ${xName} and ${yName} in these ${formatCount(res.n)} rows.`);
  } else {
    const direction = r > 0 ? 'higher' : 'lower';
    lines.push(
      `${strength[0].toUpperCase()}${strength.slice(1)} ${r > 0 ? 'positive' : 'negative'} correlation by ${STRENGTH_CONVENTION}: higher ${xName} tends to go with ${direction} ${yName}.`,
    );
  }
  const pct = `${Math.round(res.interval.level * 100)}%`;
  if (Number.isFinite(res.interval.lower)) {
    const crosses = res.interval.lower < 0 && res.interval.upper > 0;
    lines.push(
      `The ${pct} interval, ${formatR(res.interval.lower)} to ${formatR(res.interval.upper)}, holds the correlations these data are consistent with${crosses ? '; it includes zero' : ''}.`,
    );
  }
  const p = formatPValue(res.pValue);
  lines.push(
    `p ${p.startsWith('<') ? p : `= ${p}`} is how often data at least this far from zero correlation would turn up if there were none; it is not the chance that there is none.`,
  );
  return lines;
}
