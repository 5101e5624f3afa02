/**
 * Normal Q-Q plot geometry against R 4.2.2 (script and fixture: test/fixtures/plots/qq-r.R, qq-r.json, version
 * in the fixture): plotting positions (stats::ppoints), the abscissae of qqnorm, and the reference line by
 * stats::qqline's quartile rule, on the residuals of Anscombe's (1973) set 1.
 */
import * as fs from 'fs';
import * as path from 'path';
import { normalScores, plottingPosition, quartileLine } from '../../../../src/stats/plots/qq';

const R = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../fixtures/plots/qq-r.json'), 'utf8'));
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(1e-300, Math.abs(b));

test('plotting positions equal R ppoints(5) and ppoints(20) (a = 3/8 up to 10 points, 1/2 above)', () => {
  R.ppoints5.forEach((p: number, i: number) => expect(rel(plottingPosition(i, 5), p)).toBeLessThan(1e-15));
  R.ppoints20.forEach((p: number, i: number) => expect(rel(plottingPosition(i, 20), p)).toBeLessThan(1e-15));
});

test("Anscombe's set 1 residuals: normal scores equal R qqnorm(e)$x, for all points and for a subset", () => {
  const e: number[] = R.qq.residuals;
  const all = normalScores(e, e);
  R.qq.normalScores.forEach((z: number, i: number) => expect(rel(all[i], z)).toBeLessThan(1e-9));
  const some = normalScores(e, [e[3], e[7]]);
  expect(rel(some[0], R.qq.normalScores[3])).toBeLessThan(1e-9);
  expect(rel(some[1], R.qq.normalScores[7])).toBeLessThan(1e-9);
});

test("Anscombe's set 1 residuals: the quartile line equals R's qqline rule", () => {
  const line = quartileLine(R.qq.residuals);
  expect(rel(line.slope, R.qq.slope)).toBeLessThan(1e-9);
  expect(rel(line.intercept, R.qq.intercept)).toBeLessThan(1e-9);
});
