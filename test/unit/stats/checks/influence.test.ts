/**
 * Hat values, externally studentized residuals, Cook's distances and the Bonferroni outlier p against R 4.2.2:
 * hatvalues, rstudent, cooks.distance, qf(0.5, 2, n - 2), and car::outlierTest (checks-r.json, checks-r.R).
 */
import { bonferroniOutlierP, cookCutoff, lineInfluence } from '../../../../src/stats/checks/influence';
import { fitLine } from '../../../../src/stats/correlation/regression';
import { expectRel } from '../../../helpers/close';
import { R, RChecks } from './fixtures';
import { simulate } from './simulated-data';

function check(x: ArrayLike<number>, y: ArrayLike<number>, ref: RChecks): { maxRel: number } {
  const infl = lineInfluence(x, fitLine(x, y).residuals);
  let maxRel = 0;
  const pts = ref.points;
  if (pts) {
    for (let i = 0; i < ref.n; i++) {
      expectRel(infl.leverage[i], pts.hat[i], 1e-12, `hat ${i}`);
      const rs = pts.rstudent[i];
      const cd = pts.cooks[i];
      if (rs === null) expect(infl.studentized[i]).toBeNaN();
      else expectRel(infl.studentized[i], rs, 1e-9, `rstudent ${i}`);
      if (cd === null) expect(infl.cooksDistance[i]).toBeNaN();
      else expectRel(infl.cooksDistance[i], cd, 1e-9, `Cook ${i}`);
      if (rs !== null) maxRel = Math.max(maxRel, Math.abs(infl.studentized[i] / rs - 1));
    }
  }
  expect(infl.maxStudentizedIndex).toBe(ref.outlier.index);
  expectRel(infl.studentized[infl.maxStudentizedIndex], ref.outlier.rstudent, 1e-9, 'largest rstudent');
  expectRel(infl.cooksDistance[infl.maxCookIndex], ref.cook.max, 1e-9, "largest Cook's D");
  expectRel(infl.leverage[infl.maxLeverageIndex], ref.cook.max_hat, 1e-12, 'largest hat');
  const p = bonferroniOutlierP(infl.studentized[infl.maxStudentizedIndex], ref.n);
  expectRel(p, ref.outlier.bonferroni_p, 1e-6, 'Bonferroni p');
  expectRel(cookCutoff(ref.n), ref.cook.cutoff, 1e-9, 'median of F(2, n - 2)');
  return { maxRel };
}

describe('influence of each point on the line', () => {
  test('Anscombe set 1: every hat value, rstudent and Cook distance', () => {
    const s = R.anscombe[0];
    check(s.x, s.y, s);
  });

  test('Anscombe set 2: the two largest Cook distances tie (0.808), either is the largest', () => {
    const s = R.anscombe[1];
    const infl = lineInfluence(s.x, fitLine(s.x, s.y).residuals);
    s.points!.cooks.forEach((cd, i) => expectRel(infl.cooksDistance[i], cd!, 1e-9, `Cook ${i}`));
    s.points!.rstudent.forEach((rs, i) => expectRel(infl.studentized[i], rs!, 1e-9, `rstudent ${i}`));
    expectRel(infl.cooksDistance[infl.maxCookIndex], s.cook.max, 1e-9);
  });

  test('Anscombe set 3: the outlier (rstudent 1203.5, Bonferroni p 2.8e-21, same as car::outlierTest)', () => {
    const s = R.anscombe[2];
    check(s.x, s.y, s);
    expectRel(s.outlier.bonferroni_p, s.outlier.car_bonf_p, 1e-12);
  });

  test('Anscombe set 4: leverage 1 at the eighth point, where rstudent and Cook distance are undefined (R: NaN)', () => {
    const s = R.anscombe[3];
    const infl = lineInfluence(s.x, fitLine(s.x, s.y).residuals);
    expect(infl.maxLeverageIndex).toBe(7);
    expect(infl.leverage[7]).toBeGreaterThanOrEqual(0.99);
    expect(infl.studentized[7]).toBeNaN();
    expect(infl.cooksDistance[7]).toBeNaN();
    check(s.x, s.y, s);
  });

  test.each(R.simulated.map((s) => [s.kind, s.n, s] as const))('simulated %s, n = %d', (kind, n, s) => {
    const { x, y } = simulate(kind, n);
    check(x, y, s);
  });

  test('Bonferroni p is capped at 1 and is 0 for an infinite residual', () => {
    expect(bonferroniOutlierP(0.5, 20)).toBe(1);
    expect(bonferroniOutlierP(-Infinity, 20)).toBe(0);
    expect(() => bonferroniOutlierP(2, 3)).toThrow(/at least 4/);
  });

  test('a point off a line that all others follow exactly has an infinite studentized residual', () => {
    const x = [1, 2, 3, 4, 5];
    const y = [2, 4, 6, 8, 20];
    const infl = lineInfluence(x, fitLine(x, y).residuals);
    expect(infl.studentized[4]).toBe(Infinity);
  });
});
