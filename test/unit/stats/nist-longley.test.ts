/**
 * NIST StRD Longley (higher difficulty), where Covary's model applies.
 *
 * Covary fits no multi-predictor regression, so the certified R^2 and residual SD of Longley's 6-predictor model
 * have no Covary counterpart, and no function answers y on a single predictor (which NIST does not certify).
 * What does apply: PARTIAL(y, x_j, other five predictors) is the partial correlation of y and x_j given the
 * others, and in least squares that is a function of the certified coefficient B_j and its standard error:
 *   r_j = t_j / sqrt(t_j^2 + df), t_j = B_j / SE(B_j), df = n - 7 = 9
 * (Frisch-Waugh-Lovell: B_j and its t equal those of the regression of y's residuals on x_j's residuals after the
 * other predictors, and that t is r_j sqrt(df / (1 - r_j^2)); textbook result, e.g. Greene, Econometric Analysis,
 * ch. 3 [recalled from memory: longley.R confirms it numerically]). The p-value of that partial correlation (df = 9)
 * is the p-value of t_j, computed from the certified t_j with R's pt (fixture note, longley.R).
 * longley.R also cross-checks the identity against R's lm residuals and the data against datasets::longley.
 *
 * Accuracy as LRE (McCullough 1998): at least 12 correct digits for r_j, 1e-6 relative for the p-values.
 * Runs on the built bundle (PARTIAL lives in the cell layer); needs `npm run build` first.
 */
import * as fs from 'fs';
import { distFile, loadBundle } from '../../helpers/bare-host';
import { expectRel, logRelativeError } from '../../helpers/close';
import longley from '../../fixtures/nist/longley.json';

if (!fs.existsSync(distFile('functions.js'))) throw new Error('dist/functions.js is missing: run `npm run build` first (npm test does)');
const partial = loadBundle().fns.get('PARTIAL');
if (!partial) throw new Error('PARTIAL is not registered by dist/functions.js');
const col = (v: number[]) => v.map((a) => [a]);
const predictors = [longley.x1, longley.x2, longley.x3, longley.x4, longley.x5, longley.x6];
const df = longley.y.length - 7;

describe('NIST StRD Longley: partial correlation of y and each predictor given the other five', () => {
  test.each([1, 2, 3, 4, 5, 6])('x%d: r from the certified B and SE to 12+ digits, p-value to 1e-6', (j) => {
    const t = longley.certified.coefficients[j] / longley.certified.standardErrors[j];
    const certifiedR = t / Math.sqrt(t * t + df);
    const others = predictors.filter((_, i) => i !== j - 1);
    const controls = longley.y.map((_, row) => others.map((c) => c[row]));
    const [[r, lower, upper, p]] = partial(col(longley.y), col(predictors[j - 1]), controls, null, null) as number[][];
    expect(logRelativeError(r, certifiedR)).toBeGreaterThanOrEqual(12);
    expectRel(p, longley.certifiedTwoSidedP.values[j - 1], 1e-6, `p of x${j}`);
    expect(lower).toBeLessThanOrEqual(r);
    expect(upper).toBeGreaterThanOrEqual(r);
  });
});

test('Longley fixture: certified values present (model applies only through PARTIAL; see the note above)', () => {
  expect(longley.certified.coefficients).toHaveLength(7);
});
