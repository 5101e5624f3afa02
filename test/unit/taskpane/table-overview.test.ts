/**
 * The "Across the table" section's figures against R (fixture and script: test/fixtures/panel/table-overview-r.*,
 * R and psych versions in the fixture; see test/references.md): the heatmap's pairwise-complete Pearson matrix
 * and Holm-adjusted p-values as cor.test and p.adjust(..., "holm"), and the partial correlation, with controls
 * read from other rows of the sheet and matched by sheet row, as psych::partial.r with its t test and Fisher-z
 * interval. The scale's steps and the cell text are rules of our own, checked against their stated limits.
 */
import * as fs from 'fs';
import * as path from 'path';
import { cellText, heatStep, isOverviewFailure, OverviewColumn, partialOf, partialReading, tableMatrix } from '../../../taskpane/table-overview';
import type { NumericColumnRead } from '../../../taskpane/workbook';

const R = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../fixtures/panel/table-overview-r.json'), 'utf8'));
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

/** A column of the table on the sheet Depot, data from `firstRow`, blanks (null in R's output) as NaN. */
function column(name: string, position: number, data: (number | null)[], firstRow = 2): OverviewColumn {
  const read: NumericColumnRead = {
    address: `Depot!col${position + 1}`,
    sheet: 'Depot',
    firstRow,
    column: position + 1,
    header: name,
    numbers: Float64Array.from(data, (v) => (v === null ? NaN : v)),
  };
  return { name, position, read };
}

const COLUMNS: OverviewColumn[] = (R.columns as string[]).map((name, i) => column(name, i, R.data[name]));

describe('the heatmap matrix (R cor.test per pair, p.adjust holm)', () => {
  const v = tableMatrix('Depot', COLUMNS, 'pearson');
  if (isOverviewFailure(v)) throw new Error(v.error);
  const k = COLUMNS.length;

  test('coefficients on pairwise-complete rows to 1e-9', () => {
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        if (i === j) continue;
        expect(rel(v.matrix.coef[i * k + j], R.matrix.coef[i][j])).toBeLessThan(1e-9);
        expect(v.matrix.pairs[i * k + j]).toBe(R.matrix.pairs[i][j]);
      }
    }
  });

  test('Holm-adjusted p-values across the 10 pairs to 1e-6', () => {
    expect(v.matrix.tests).toBe(10);
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) if (i !== j) expect(rel(v.matrix.pHolm[i * k + j], R.matrix.holm[i][j])).toBeLessThan(1e-6);
    }
  });

  test('a label column and a constant column are left out and named, not computed', () => {
    const withLabels = [
      column('Week', 0, Array(30).fill(null)),
      ...COLUMNS.map((c) => ({ ...c, position: c.position + 1 })),
      column('Depot code', 6, Array(30).fill(7)),
    ];
    const w = tableMatrix('Depot', withLabels, 'pearson');
    if (isOverviewFailure(w)) throw new Error(w.error);
    expect(w.columns.map((c) => c.name)).toEqual(R.columns);
    expect(w.left).toEqual([{ name: 'Week', why: 'no numbers' }, { name: 'Depot code', why: 'the same value in every row' }]);
  });

  test('fewer than two usable columns is a failure with the reason', () => {
    const w = tableMatrix('Depot', [COLUMNS[0], column('Week', 1, Array(30).fill(null))], 'pearson');
    expect(w).toEqual({ error: 'Depot has only one column of varying numbers: a heatmap needs at least two.' });
  });

  test('a robust coefficient above gives a Spearman heatmap, said in a note', () => {
    const w = tableMatrix('Depot', COLUMNS, 'biweight');
    if (isOverviewFailure(w)) throw new Error(w.error);
    expect(w.matrix.method).toBe('spearman');
    expect(w.methodNote).toContain('Spearman');
  });
});

describe('the partial correlation (psych::partial.r on complete rows)', () => {
  const byName = (n: string) => COLUMNS.find((c) => c.name === n)!;
  const x = byName(R.partial.x).read;
  const y = byName(R.partial.y).read;
  const controls = (R.partial.controls as string[]).map(byName);

  test('r, p, the Fisher-z interval and the plain r on the same rows', () => {
    const v = partialOf(x, y, controls, 0.95);
    if (isOverviewFailure(v)) throw new Error(v.error);
    expect(v.n).toBe(R.partial.n);
    expect(rel(v.r, R.partial.r)).toBeLessThan(1e-9);
    expect(rel(v.p, R.partial.p)).toBeLessThan(1e-6);
    expect(rel(v.lower, R.partial.lower)).toBeLessThan(1e-9);
    expect(rel(v.upper, R.partial.upper)).toBeLessThan(1e-9);
    expect(rel(v.plain, R.partial.plain)).toBeLessThan(1e-9);
    expect(rel(v.plainLower, R.partial.plainLower)).toBeLessThan(1e-9);
    expect(rel(v.plainUpper, R.partial.plainUpper)).toBeLessThan(1e-9);
  });

  test('controls read from a block starting elsewhere on the sheet are matched by sheet row', () => {
    // The same control values, read as a block three rows higher: rows above the pair's first row are padding.
    const shifted = controls.map((c) => column(c.name, c.position, [null, 5, 5, ...Array.from(c.read.numbers, (v) => (v === v ? v : null))], -1));
    const v = partialOf(x, y, shifted, 0.95);
    if (isOverviewFailure(v)) throw new Error(v.error);
    expect(v.n).toBe(R.partial.n);
    expect(rel(v.r, R.partial.r)).toBeLessThan(1e-9);
  });

  test('a control on another sheet is refused with the reason', () => {
    const other = { ...controls[0], read: { ...controls[0].read, sheet: 'Elsewhere' } };
    expect(partialOf(x, y, [other], 0.95)).toEqual({ error: 'parcels is on the sheet Elsewhere and the pair on Depot: a partial correlation matches rows on one sheet.' });
  });

  test('a partial r much stronger than the plain one is not read as "changes little", and no cause is claimed', () => {
    const text = partialReading(
      { r: 0.6, lower: 0.4, upper: 0.75, p: 1e-5, n: 60, plain: 0.3, plainLower: 0.05, plainUpper: 0.52, controls: ['Tenure', 'Grade'], level: 0.95 },
      { x: 'Training hours', y: 'Sales' },
    );
    expect(text).toBe('The correlation is stronger with Tenure and Grade held fixed: Tenure and Grade may mask part of it in the plain figures, or may be a result of both; the numbers cannot tell which.');
  });

  test('the reading says when holding the columns fixed leaves nothing to tell from zero', () => {
    const text = partialReading(
      { r: 0.05, lower: -0.3, upper: 0.4, p: 0.7, n: 40, plain: 0.5, plainLower: 0.2, plainUpper: 0.7, controls: ['Tenure'], level: 0.95 },
      { x: 'Training hours', y: 'Sales' },
    );
    expect(text).toMatch(/^Once Tenure is held fixed, no correlation between Training hours and Sales is left/);
    expect(text).toContain('cannot tell which');
  });
});

describe('the colour scale and the cell text', () => {
  test('five strengths per sign, with steps at 0.1, 0.3, 0.5 and 0.7 of |r|', () => {
    expect([0, 0.0999, 0.1, 0.3, 0.5, 0.6999, 0.7, 1].map((r) => heatStep(r).level)).toEqual([0, 0, 1, 2, 3, 3, 4, 4]);
    expect(heatStep(-0.55)).toEqual({ sign: 'neg', level: 3 });
    expect(heatStep(0.55)).toEqual({ sign: 'pos', level: 3 });
  });

  test('two decimals without the leading zero, a true minus, a small value never shown as zero nor one short of 1 as 1', () => {
    expect([0.62, -0.41, -0.004, 0.996, 1, Number.NaN].map(cellText)).toEqual(['.62', '\u2212.41', '\u2212.004', '.996', '1.00', '–']);
  });
});
