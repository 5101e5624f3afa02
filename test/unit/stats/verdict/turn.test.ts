/**
 * A relationship that turns back: where the least-squares parabola turns, the correlation on each side of the
 * turn, and the verdict's words. References: R 4.2.2, lm(y ~ I(x - m) + I((x - m)^2)) for the turn and cor.test
 * on each side (fixture test/fixtures/checks/turning-point-r.json, script turning-point-r.R beside it; see
 * test/references.md, "A curve that turns back"). The samples are those of checks-r.R, regenerated number for
 * number by simulated-data.ts, bent into the shapes the script names.
 */
import * as fs from 'fs';
import * as path from 'path';
import { checksOf } from '../../../../src/stats/checks/checked';
import { runChecks } from '../../../../src/stats/checks/run-checks';
import { PreparedPairs } from '../../../../src/stats/correlation/prepared';
import { conclude } from '../../../../src/stats/verdict/conclusion';
import { turnOf } from '../../../../src/stats/verdict/turn';
import { expectRel } from '../../../helpers/close';
import { normals, uniforms } from '../checks/simulated-data';

interface Side { n: number; r: number; lower: number; upper: number; p: number }
interface Case { kind: string; n: number; turn: number; square: number; below: Side | null; above: Side | null }
const FIXTURE: { generator: string; cases: Case[] } = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../fixtures/checks/turning-point-r.json'), 'utf8'),
);
const byKind = (k: string) => FIXTURE.cases.find((c) => c.kind === k)!;

/** The shapes of turning-point-r.R, same seeds and formulas. */
function shape(kind: string, n: number): { x: Float64Array; y: Float64Array } {
  const z2 = normals(67890, n);
  const u = uniforms(13579, n);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (kind === 'u_shape') {
      x[i] = 4 * u[i] - 2;
      y[i] = x[i] * x[i] + 0.5 * z2[i];
    } else if (kind === 'hump' || kind === 'hump_far') {
      const x0 = 40 * u[i];
      x[i] = kind === 'hump' ? x0 : x0 + 1e6;
      y[i] = 50 + 4 * x0 - 0.08 * x0 ** 2 + 6 * z2[i];
    } else {
      x[i] = 1 + 40 * u[i];
      y[i] = 10 * Math.log(x[i]) + 2 * z2[i];
    }
  }
  return { x, y };
}

const names = { key: 'rows', name: (i: number) => `row ${i + 2}` };
function verdictOf(kind: string) {
  const { x, y } = shape(kind, 200);
  const prepared = new PreparedPairs(x, y);
  const report = checksOf(prepared, 0.05, names);
  return { prepared, report, c: conclude(prepared, report, { method: 'pearson', level: 0.95, name: names.name, columns: { x: 'Hours of overtime', y: 'Output per shift' } }) };
}

describe('where the fitted parabola turns (the straight-line check, against R lm)', () => {
  test.each(['u_shape', 'hump', 'hump_far', 'log_rise'])('%s', (kind) => {
    const ref = byKind(kind);
    const { x, y } = shape(kind, ref.n);
    const row = runChecks(x, y, { alpha: 0.05 }).checks.find((c) => c.key === 'straight-line')!;
    expect(row.verdict).toBe('problem');
    // With 1e6 added to x the turn keeps its place to 1e-9 of its distance from the offset, not only of its size.
    expectRel(row.detail.turnAt - (kind === 'hump_far' ? 1e6 : 0), ref.turn - (kind === 'hump_far' ? 1e6 : 0), 1e-9, 'turn');
  });

  test('no turn is reported for a straight line, nor for a curve that is only slight', () => {
    const x = Float64Array.from({ length: 60 }, (_, i) => i);
    const y = Float64Array.from(x, (v, i) => 2 * v + (i % 3) - 1);
    const row = runChecks(x, y, { alpha: 0.05 }).checks.find((c) => c.key === 'straight-line')!;
    expect(row.verdict).not.toBe('problem');
    expect(row.detail.turnAt).toBeUndefined();
  });
});

describe('the correlation on each side of the turn (against R cor.test)', () => {
  test.each(['u_shape', 'hump', 'hump_far'])('%s turns back', (kind) => {
    const ref = byKind(kind);
    const { prepared, report } = verdictOf(kind);
    const t = turnOf(prepared, report, 0.95)!;
    expect(t).not.toBeNull();
    for (const [mine, theirs] of [[t.below, ref.below!], [t.above, ref.above!]] as const) {
      expect(mine.n).toBe(theirs.n);
      expectRel(mine.statistic, theirs.r, 1e-9, 'r');
      expectRel(mine.interval.lower, theirs.lower, 1e-9, 'lower');
      expectRel(mine.interval.upper, theirs.upper, 1e-9, 'upper');
      expectRel(mine.pValue, theirs.p, 1e-6, 'p');
    }
    expect(t.shape).toBe(kind === 'u_shape' ? 'trough' : 'peak');
  });

  test('log_rise bends but does not turn back: R finds no clear correlation above its fitted turn', () => {
    const ref = byKind('log_rise');
    expect(ref.above!.p).toBeGreaterThan(0.05); // the premise, from R
    const { prepared, report, c } = verdictOf('log_rise');
    expect(turnOf(prepared, report, 0.95)).toBeNull();
    expect(c.turn).toBeNull();
    expect(c.sensitivity.summary).not.toBe('turns back');
    expect(c.recommendation.remedy).toBe('rank');
  });
});

describe('the verdict on a relationship that turns back', () => {
  test('a hump: "turns back", no single coefficient, both sides named in the reading', () => {
    const ref = byKind('hump');
    const { c } = verdictOf('hump');
    expect(c.sensitivity.summary).toBe('turns back');
    expect(c.sensitivity.line).toMatch(/^Turns back: the relationship changes direction at x = 25\.3\. At or below it, a positive correlation \(r = 0\.903, 124 rows\); above it, a negative correlation \(r = -0\.516, 76 rows\)\. No single coefficient describes a relationship that rises and then falls/);
    expect(c.recommendation).toMatchObject({ name: 'none', method: null, remedy: 'each-side' });
    expect(c.reading).toMatch(/^Across 200 pairs, Output per shift follows Hours of overtime along a curve that peaks at Hours of overtime = 25\.3: /);
    expect(c.reading).toContain(`rise as Hours of overtime rises (r = ${Number(ref.below!.r.toPrecision(3))}, 124 rows)`);
    expect(c.reading).toContain(`fall as Hours of overtime rises (r = ${Number(ref.above!.r.toPrecision(3))}, 76 rows)`);
    expect(c.reading).toMatch(/does not show that Hours of overtime causes Output per shift/);
    const sides = c.sensitivity.rows.filter((r) => r.scenario === 'below the turn' || r.scenario === 'above the turn');
    expect(sides.map((r) => [r.direction, r.n])).toEqual([['positive', 124], ['negative', 76]]);
  });

  test('a U whose overall r is near zero is never read as "no clear relationship", nor as negligible', () => {
    const { c } = verdictOf('u_shape');
    expect(c.turn).not.toBeNull();
    expect(c.reading).not.toMatch(/no clear relationship/);
    expect(c.reading).toMatch(/bottoms out at/);
    expect(c.equivalence).toBeNull();
    expect(c.bayes).toBeNull();
  });

  test('rows sorted by x: the row-order flag is put down to the curve', () => {
    const { x, y } = shape('hump', 200);
    const order = Array.from(x.keys()).sort((a, b) => x[a] - x[b]);
    const prepared = new PreparedPairs(Float64Array.from(order, (i) => x[i]), Float64Array.from(order, (i) => y[i]));
    const report = checksOf(prepared, 0.05, names);
    const c = conclude(prepared, report, { method: 'pearson', level: 0.95, name: names.name });
    expect(report.checks.find((k) => k.key === 'row-order')!.verdict).toBe('problem');
    expect(c.sensitivity.summary).toBe('turns back');
    expect([c.turn!.xInRowOrder, verdictOf('hump').c.turn!.xInRowOrder]).toEqual([true, false]); // sorted, then as drawn
    expect(c.recommendation.reason).toMatch(/The rows run in the order of x, so the curve itself makes neighbouring rows alike/);
  });
});
