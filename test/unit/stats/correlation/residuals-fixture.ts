/**
 * Typed access to R's residuals of the least-squares line (fixture and script: test/fixtures/regression/
 * residuals-r.json and residuals-r.R; R version in the fixture), and the comparison both residual tests use.
 */
import * as fs from 'fs';
import * as path from 'path';

export interface ResidualCase {
  name: string;
  call: string;
  /** The cells as a sheet holds them; null where the sheet has a blank or text cell (NA in R). */
  x: (number | null)[];
  y: (number | null)[];
  /** 1-based positions in x of the pairs lm used: as.integer(names(resid(fit))). */
  positions: number[];
  /** lm's intercept and slope; the slope is null where lm found x collinear with the intercept. */
  coefficients: [number, number | null];
  fitted: number[];
  residuals: number[];
  /** The offset cases: the same fit on the typed decimals with the offset left out (see the script). */
  offset?: number;
  centred_call?: string;
  centred_fitted?: number[];
  centred_residuals?: number[];
  centred_slope?: number;
}

export const R_RESIDUALS = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../fixtures/regression/residuals-r.json'), 'utf8'),
) as { R: string; script: string; cases: ResidualCase[] };

export const residualCase = (name: string): ResidualCase => {
  const c = R_RESIDUALS.cases.find((k) => k.name === name);
  if (!c) throw new Error(`no case ${name} in residuals-r.json`);
  return c;
};

/** The reference a case is held to: the centred fit where there is one (offset cases), else lm(y ~ x). */
export function referenceOf(c: ResidualCase): { fitted: number[]; residuals: number[]; call: string } {
  if (c.centred_fitted && c.centred_residuals && c.centred_call) return { fitted: c.centred_fitted, residuals: c.centred_residuals, call: c.centred_call };
  return { fitted: c.fitted, residuals: c.residuals, call: c.call };
}

/**
 * The largest relative differences: fitted values each against its own size, residuals against the largest
 * residual of the case (a residual near 0 has no relative accuracy of its own to keep); 0 when a set is exactly 0
 * on both sides.
 */
export function worstDifferences(fitted: ArrayLike<number>, residuals: ArrayLike<number>, ref: { fitted: number[]; residuals: number[] }): { fitted: number; residuals: number } {
  if (fitted.length !== ref.fitted.length || residuals.length !== ref.residuals.length) {
    throw new Error(`got ${fitted.length} fitted values and ${residuals.length} residuals, R has ${ref.fitted.length} and ${ref.residuals.length}`);
  }
  const scale = Math.max(...ref.residuals.map(Math.abs));
  let f = 0;
  let e = 0;
  for (let i = 0; i < ref.fitted.length; i++) {
    f = Math.max(f, Math.abs(fitted[i] - ref.fitted[i]) / Math.max(Math.abs(ref.fitted[i]), 1e-300));
    const d = Math.abs(residuals[i] - ref.residuals[i]);
    e = Math.max(e, scale === 0 ? (d === 0 ? 0 : Infinity) : d / scale);
  }
  return { fitted: f, residuals: e };
}
