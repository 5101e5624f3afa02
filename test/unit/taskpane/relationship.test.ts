/**
 * The panel's relationship computation against R 4.2.2 (fixtures and scripts: test/fixtures/panel/ and
 * test/fixtures/plots/, versions in the fixtures): the Q-Q abscissae and reference line of the drawn view
 * (stats::qqnorm, stats::qqline's quartile rule), and Anscombe's (1973) set 3 (cor.test; the outlier is the
 * point with the largest |rstudent|).
 */
import * as fs from 'fs';
import * as path from 'path';
import { analyseRelationship, FLAG_OUTLIER, isFailure, RedrawMemory, RelationshipView, resorted, SMOOTH_LIMIT } from '../../../taskpane/relationship';
import { drawSample } from '../../../taskpane/draw-sample';
import { lowess } from '../../../src/stats/plots/lowess';
import type { PairedRows } from '../../../taskpane/pairs';

const R = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../fixtures/panel/panel-r.json'), 'utf8'));
const QQ = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../fixtures/plots/qq-r.json'), 'utf8')).qq;

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(1e-300, Math.abs(b));

function pairs(x: number[], y: number[], firstRow = 2): PairedRows {
  return {
    x: Float64Array.from(x),
    y: Float64Array.from(y),
    rows: Int32Array.from(x, (_, i) => firstRow + i),
    sheet: 'Sheet1',
    total: x.length,
    skipped: 0,
    xHeader: 'x',
    yHeader: 'y',
    skippedRows: new Int32Array(0),
  };
}

const opts = { method: 'pearson' as const, level: 0.95, alpha: 0.05, drawLimit: 2000 };

describe('Q-Q plot geometry', () => {
  test("Anscombe's set 1 residuals: abscissae equal R qqnorm(e)$x and the line equals R's qqline rule", () => {
    const v = analyseRelationship(pairs(QQ.x, QQ.y), opts) as RelationshipView;
    QQ.normalScores.forEach((z: number, i: number) => expect(rel(v.drawn.normalScore[i], z)).toBeLessThan(1e-9));
    expect(rel(v.qqLine.slope, QQ.slope)).toBeLessThan(1e-9);
    expect(rel(v.qqLine.intercept, QQ.intercept)).toBeLessThan(1e-9);
  });
});

describe('Anscombe (1973) set 3 (R datasets::anscombe)', () => {
  const a3 = R.anscombe3;
  const v = analyseRelationship(pairs(a3.x, a3.y), opts) as RelationshipView;

  test('r, interval and p equal R cor.test', () => {
    expect(rel(v.correlation.statistic, a3.r)).toBeLessThan(1e-9);
    expect(rel(v.correlation.interval.lower, a3.lower)).toBeLessThan(1e-9);
    expect(rel(v.correlation.interval.upper, a3.upper)).toBeLessThan(1e-9);
    expect(rel(v.correlation.pValue, a3.p)).toBeLessThan(1e-6);
  });

  test('the outlier (largest |rstudent| in R) is flagged, drawn and highlighted in its sheet row', () => {
    const row = 2 + a3.maxAbsRstudentIndex;
    expect(v.flaggedRows).toContain(row);
    const k = Array.from(v.drawn.rows).indexOf(row);
    expect(k).toBeGreaterThanOrEqual(0);
    expect(v.drawn.flags[k] & FLAG_OUTLIER).toBeTruthy();
    expect(v.flags.some((f) => f.includes(`row ${row}`))).toBe(true);
  });

  test('all 11 points are drawn, in row order, with a smooth over the x range', () => {
    expect(Array.from(v.drawn.rows)).toEqual(a3.x.map((_: number, i: number) => i + 2));
    expect(v.smooth).not.toBeNull();
    expect(v.smooth!.x[0]).toBe(Math.min(...a3.x));
    expect(v.reading.length).toBeGreaterThanOrEqual(3);
  });
});

describe('large inputs', () => {
  test('100,000 pairs: at most drawLimit points drawn, every flagged one among them', () => {
    const n = 100000;
    const x: number[] = [];
    const y: number[] = [];
    let s = 12345;
    const rnd = (): number => {
      s = (s * 16807) % 2147483647;
      return s / 2147483647;
    };
    for (let i = 0; i < n; i++) {
      x.push(rnd() * 10);
      y.push(x[i] + rnd());
    }
    y[777] = 500; // a gross outlier at sheet row 779
    const v = analyseRelationship(pairs(x, y), opts) as RelationshipView;
    expect(v.n).toBe(n);
    expect(v.drawn.rows.length).toBe(2000);
    expect(v.flaggedRows).toContain(779);
    const drawn = new Set(v.drawn.rows);
    for (const r of v.flaggedRows.slice(0, 2000)) expect(drawn.has(r)).toBe(true);
  });
});

describe('redraws after an edit', () => {
  // The smooth and the drawing sample are kept between redraws and reused when their inputs are unchanged; what a
  // redraw shows must still equal the same steps computed afresh (lowess itself is checked against R in
  // test/unit/stats/plots/lowess.test.ts).
  const n = 5000;
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < n; i++) {
    x.push(((i * 7919) % 1000) / 10);
    y.push(0.5 * x[i] + ((i * 104729) % 97) / 10);
  }
  const base = drawSample(n, [], SMOOTH_LIMIT);
  const inSample = base[10];
  let outside = 0;
  while (base.includes(outside)) outside++;
  const fresh = (xs: number[], ys: number[]) => lowess(Float64Array.from(base, (i) => xs[i]), Float64Array.from(base, (i) => ys[i]));
  // One memory across the redraws below, as the panel holds one: the reuse paths are what is under test.
  const memory = new RedrawMemory();

  test('the smooth follows an edit inside its sample and stays for one outside it', () => {
    const v1 = analyseRelationship(pairs(x, y), opts, memory) as RelationshipView;
    expect(Array.from(v1.smooth!.y)).toEqual(Array.from(fresh(x, y).y));
    v1.smooth!.y.fill(NaN); // the caller owns its copy (the worker transfers it away)
    const y2 = y.slice();
    y2[inSample] += 40;
    const v2 = analyseRelationship(pairs(x, y2), opts, memory) as RelationshipView;
    expect(Array.from(v2.smooth!.y)).toEqual(Array.from(fresh(x, y2).y));
    const y3 = y2.slice();
    y3[outside] += 40;
    const v3 = analyseRelationship(pairs(x, y3), opts, memory) as RelationshipView;
    expect(Array.from(v3.smooth!.y)).toEqual(Array.from(fresh(x, y3).y));
    expect(Array.from(v3.smooth!.x)).toEqual(Array.from(fresh(x, y3).x));
  });

  test('the drawn points follow a change in the flagged rows', () => {
    const y2 = y.slice();
    y2[outside] += 1000; // a gross outlier, not in the hash sample: drawn only because it is flagged
    const v = analyseRelationship(pairs(x, y2), opts, memory) as RelationshipView;
    expect(v.flaggedRows).toContain(outside + 2);
    expect(Array.from(v.drawn.rows)).toContain(outside + 2);
    const back = analyseRelationship(pairs(x, y), opts, memory) as RelationshipView;
    expect(Array.from(back.drawn.rows)).not.toContain(outside + 2);
    expect(Array.from(back.drawn.rows)).toEqual(Array.from(drawSample(n, back.flaggedRows.map((r) => r - 2), opts.drawLimit), (i) => i + 2));
  });
});

describe('sorted orders kept between redraws', () => {
  // The order a column's sort gave is kept; after an edit of a few cells it is mended instead of sorted again.
  // The reference is JavaScript's own Array.prototype.sort, stable by the language standard (ECMA-262, 2019 on).
  const stableOrder = (v: Float64Array) => Array.from(v, (_, i) => i).sort((a, b) => v[a] - v[b] || a - b);

  test('mending an order after changed places gives the stable sort of the new values, ties by place', () => {
    let seed = 7;
    const rand = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const v = Float64Array.from({ length: 3000 }, () => Math.round(rand() * 400) / 4 + 1); // many ties, no zeros
    const before = stableOrder(v);
    const w = v.slice();
    const changed = [17, 1200, 2999, 5];
    w[17] = w[400]; // equal to another value: placed by its place among the equals
    w[1200] = 1e6; // past the end
    w[2999] = -3; // before the start
    w[5] = w[5] + 0.125;
    expect(Array.from(resorted(before, w, changed)!)).toEqual(stableOrder(w));
    expect(resorted(before, Float64Array.of(...w.slice(0, 5), 0, ...w.slice(6)), [5])).toBeNull();
  });

  test('ranks kept for one column never follow a new column whose redraw sorted it but failed before ranking', () => {
    const n = 200;
    const memory = new RedrawMemory();
    const spearman = { ...opts, method: 'spearman' as const };
    const ax = Array.from({ length: n }, (_, i) => ((i * 37) % 101) + 1);
    const ay = ax.map((v, i) => v + ((i * 13) % 17));
    analyseRelationship(pairs(ax, ay), spearman, memory);
    // Pair B: most of x is one value, so the biweight has no scale and fails after sorting the columns.
    const bx = Array.from({ length: n }, (_, i) => (i < 180 ? 5 : 5 + i));
    const by = Array.from({ length: n }, (_, i) => ((i * 53) % 97) + 1);
    expect(analyseRelationship(pairs(bx, by), { ...opts, method: 'biweight' as const }, memory)).toHaveProperty('error', expect.stringContaining('biweight'));
    const kept = analyseRelationship(pairs(bx, by), spearman, memory) as RelationshipView;
    const fresh = analyseRelationship(pairs(bx, by), spearman) as RelationshipView;
    expect(kept.correlation.statistic).toBe(fresh.correlation.statistic);
  });

  test('a redraw that reuses or mends the sorts shows what a fresh computation shows', () => {
    const n = 4000;
    const x = Array.from({ length: n }, (_, i) => ((i * 7919) % 1000) / 10 + 1);
    const y = x.map((v, i) => 0.5 * v + ((i * 104729) % 97) / 10 + 1);
    const memory = new RedrawMemory();
    const spearman = { ...opts, method: 'spearman' as const };
    analyseRelationship(pairs(x, y), spearman, memory);
    for (const [col, at, value] of [['y', 10, 77.5], ['y', 3000, 12], ['x', 5, 50.1], ['x', 5, 50.1]] as const) {
      if (col === 'y') y[at] = value;
      else x[at] = value;
      const kept = analyseRelationship(pairs(x, y), spearman, memory) as RelationshipView;
      const fresh = analyseRelationship(pairs(x, y), spearman) as RelationshipView;
      expect(kept.correlation.statistic).toBe(fresh.correlation.statistic);
      expect(kept.correlation.pValue).toBe(fresh.correlation.pValue);
      expect(kept.verdict.rows.map((r) => r.statistic)).toEqual(fresh.verdict.rows.map((r) => r.statistic));
      expect(kept.checks.map((c) => c.pValue)).toEqual(fresh.checks.map((c) => c.pValue));
    }
  });
});

describe('failures come back as messages', () => {
  test('too few pairs', () => {
    const v = analyseRelationship(pairs([1, 2], [3, 4]), opts);
    expect(isFailure(v) && v.error).toMatch(/at least 3/);
  });
  test('a constant column', () => {
    const v = analyseRelationship(pairs([1, 1, 1, 1], [3, 4, 5, 6]), opts);
    expect(isFailure(v)).toBe(true);
  });
});
