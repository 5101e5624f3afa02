/**
 * The check report of prepared pairs, computed once and kept on them: the cell functions (CHECKS, FLAGS, REPORT on
 * the same cells share one, through their content cache) and the panel (one per redraw) both come here. Its
 * per-point columns are handed back with the pairs' own work arrays when the owner releases the pairs.
 */
import { PreparedPairs } from '../correlation/prepared';
import { CheckReport } from './check-report';
import { runChecks } from './run-checks';

/** How pairs are named in the checks' messages ("row 12"); `key` tells reports with different names apart. */
export interface PairNames {
  key: string;
  name: (i: number) => string;
}

/** runChecks on the prepared pairs at `alpha`, memoised on them per alpha and naming. */
export function checksOf(prepared: PreparedPairs, alpha: number, names: PairNames): CheckReport {
  return prepared.memo(`checks|${alpha}|${names.key}`, () => {
    const report = runChecks(prepared.x, prepared.y, { alpha, pointName: names.name });
    const p = report.points;
    prepared.adopt(p.fitted, p.residuals, p.studentized, p.leverage, p.cooksDistance);
    return report;
  });
}
