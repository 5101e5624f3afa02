/**
 * More of the analysis in the panel, in Debian's Chromium against the workbench's demo sheet (the North table, 48
 * rows): the heatmap of every numeric column, reached and worked by keyboard; the partial correlation with chosen
 * control columns; the planning line at the current n; and residual axes that label 0.
 * Expected figures come from outside the panel: Pearson's r by its definition in the harness (pearsonReference)
 * over the cells the grid holds, the first-order partial correlation by Yule's (1897) formula from those, and the
 * exact power of the test of rho = 0 at 48 rows from mpmath (test/fixtures/compare/power-exact-mpmath.*; see
 * test/references.md).
 */
import * as fs from 'fs';
import * as path from 'path';
import { afterPanelRedraw, columnNumbers, completePairs, pearsonReference, screenshot, sharedWorkbenchWithPanel, typeInto } from './harness';

jest.setTimeout(120000);

const POWER = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../fixtures/compare/power-exact-mpmath.json'), 'utf8'));

const session = sharedWorkbenchWithPanel();
const page = () => session().page;
const testid = (id: string) => page().locator(`[data-testid="${id}"]`);

/** The North table's columns by letter, as the demo sheet lays them out (header in row 1, data rows 2-49). */
const COLUMN = { mechanics: 'B', repairs: 'C', floor: 'F', rent: 'G' } as const;

async function rOf(a: string, b: string): Promise<number> {
  const { x, y } = await completePairs(page(), 'North', a, b, 2, 49);
  return pearsonReference(x, y);
}

/** Scrolls the table section into view and waits for it to have drawn at least `after` times. */
async function tableDrawn(after = 0): Promise<void> {
  await testid('section-table').scrollIntoViewIfNeeded();
  await page().waitForFunction((n) => Number(document.querySelector('[data-testid="section-table"]')?.getAttribute('data-render-count') ?? 0) > n, after, { timeout: 30000 });
}

const renderCount = () => page().evaluate(() => Number(document.querySelector('[data-testid="section-table"]')?.getAttribute('data-render-count') ?? 0));

/** The heatmap cell of row i and column j (0-based places among the drawn columns). */
const heatCell = (i: number, j: number) => page().locator(`[data-testid="heatmap"] button[data-i="${i}"][data-j="${j}"]`);

describe('the heatmap of the table', () => {
  test('draws every numeric column, leaves the label column out, and shows r and the Holm p on hover', async () => {
    await tableDrawn();
    const names = await page().locator('[data-testid="heatmap"] .cv-heat-name').allTextContents();
    expect(names[0]).toBe('Mechanics (FTE)');
    expect(names).not.toContain('Workshop');
    await expect(testid('heatmap-left').textContent()).resolves.toContain('Workshop (no numbers)');
    // Repairs per week (place 1) against Mechanics (place 0), and Rent (place 5) against Floor area (place 4).
    const repairs = Number(await heatCell(1, 0).getAttribute('data-r'));
    expect(Math.abs(repairs - (await rOf(COLUMN.mechanics, COLUMN.repairs)))).toBeLessThan(1e-9);
    const rent = Number(await heatCell(5, 4).getAttribute('data-r'));
    expect(Math.abs(rent - (await rOf(COLUMN.floor, COLUMN.rent)))).toBeLessThan(1e-9);
    await heatCell(5, 4).hover();
    const detail = await testid('heatmap-detail').textContent();
    expect(detail).toMatch(/^Rent per month with Floor area m²: Pearson r = \.\d\d, Holm-adjusted p [=<] /);
    // The cell's text is part of its spoken label (WCAG 2.5.3), for negative cells too.
    const negative = page().locator('[data-testid="heatmap"] button', { hasText: '\u2212' }).first();
    await expect(negative.getAttribute('aria-label')).resolves.toContain((await negative.textContent())!);
    await expect(heatCell(5, 4).getAttribute('title')).resolves.toContain('Holm-adjusted p');
    await testid('section-table').screenshot({ path: path.join(__dirname, '../../test-artifacts', 'panel-section-table.png') });
  });

  test('is one Tab stop, arrow keys move within it, and Enter makes the cell the main pair', async () => {
    await tableDrawn();
    const tabbable = await page().locator('[data-testid="heatmap"] button[tabindex="0"]').count();
    expect(tabbable).toBe(1);
    await heatCell(1, 0).focus();
    await page().keyboard.press('ArrowDown');
    await page().keyboard.press('ArrowDown');
    await page().keyboard.press('ArrowDown');
    await page().keyboard.press('ArrowDown');
    await page().keyboard.press('ArrowRight');
    await page().keyboard.press('ArrowRight');
    await page().keyboard.press('ArrowRight');
    await page().keyboard.press('ArrowRight');
    const at = await page().evaluate(() => {
      const b = document.activeElement as HTMLElement;
      return { i: b.dataset.i, j: b.dataset.j, tabindex: b.getAttribute('tabindex') };
    });
    expect(at).toEqual({ i: '5', j: '4', tabindex: '0' });
    await afterPanelRedraw(page(), () => page().keyboard.press('Enter'));
    await expect(testid('main-x-column').inputValue()).resolves.toBe('Floor area m²');
    await expect(testid('main-y-column').inputValue()).resolves.toBe('Rent per month');
    const shown = (await page().evaluate(() => window.__covaryPanel!.summary()))!;
    expect(Math.abs(shown.r - (await rOf(COLUMN.floor, COLUMN.rent)))).toBeLessThan(1e-9);
    // The focus goes where the answer is.
    await expect(page().evaluate(() => document.activeElement?.closest('[data-testid]')?.getAttribute('data-testid'))).resolves.toBe('section-relationship');
    // Back to the demo pair for the tests below.
    await afterPanelRedraw(page(), () => heatCell(1, 0).click());
    await expect(testid('main-y-column').inputValue()).resolves.toBe('Repairs per week');
  });

  test('follows an edit in a column outside the main pair', async () => {
    await tableDrawn();
    const before = await renderCount();
    const unedited = await rOf(COLUMN.floor, COLUMN.rent);
    await typeInto(page(), 'North', `${COLUMN.rent}7`, '9999');
    await tableDrawn(before);
    // A draw the previous test's pair change started may finish after `before` was read, so the first new draw
    // can still hold the unedited r: wait until the cell shows the r of the cells the grid now holds.
    const edited = await rOf(COLUMN.floor, COLUMN.rent);
    expect(Math.abs(edited - unedited)).toBeGreaterThan(0.01);
    await page().waitForFunction(
      (want) => Math.abs(Number(document.querySelector('[data-testid="heatmap"] button[data-i="5"][data-j="4"]')?.getAttribute('data-r')) - want) < 1e-9,
      edited,
      { timeout: 30000 },
    );
    const rent = Number(await heatCell(5, 4).getAttribute('data-r'));
    expect(Math.abs(rent - edited)).toBeLessThan(1e-9);
  });
});

describe('a pair whose relationship turns back', () => {
  test('Parts discount % and Margin %: the card says "Turns back" and the reading gives each side, not one direction', async () => {
    await tableDrawn();
    // Margin % (table place 4) against Parts discount % (place 3); places count from 0 among the drawn columns.
    await afterPanelRedraw(page(), () => heatCell(3, 2).click());
    await expect(testid('main-x-column').inputValue()).resolves.toBe('Parts discount %');
    await expect(testid('verdict-summary').textContent()).resolves.toBe('Turns back');
    const reading = (await testid('reading').textContent())!;
    expect(reading).toMatch(/^Margin % follows Parts discount % along a curve that peaks at Parts discount % = /);
    expect(reading).not.toMatch(/No clear relationship/);
    // Each side's r against Pearson's r by its definition over the grid's cells on that side of the turn.
    const { x, y } = await completePairs(page(), 'North', 'D', 'E', 2, 49);
    const at = Number(/peaks at Parts discount % = (\d+(?:\.\d+)?)/.exec(reading)![1]);
    const shown = [...reading.matchAll(/r = (\u2212?[\d.]+) on (\d+) rows/g)].map((m) => `${m[1]} on ${m[2]}`);
    const side = (keep: (v: number) => boolean) => {
      const pairs = x.map((v, i) => [v, y[i]]).filter(([v]) => keep(v));
      const r = pearsonReference(pairs.map((p) => p[0]), pairs.map((p) => p[1]));
      return `${r.toFixed(2).replace('-', '\u2212')} on ${pairs.length}`; // shown to two decimals
    };
    // The turn is printed to 3 significant figures; no x lies between that and the turn itself on these cells.
    expect(shown).toEqual([side((v) => v <= at), side((v) => v > at)]);
    await expect(testid('advice').textContent()).resolves.toMatch(/^No single coefficient fits this curve\. /);
    await testid('verdict-card').screenshot({ path: path.join(__dirname, '../../test-artifacts', 'panel-verdict-turns-back.png') });
    await afterPanelRedraw(page(), () => heatCell(1, 0).click());
    await expect(testid('main-y-column').inputValue()).resolves.toBe('Repairs per week');
  });
});

describe('the partial correlation', () => {
  test('holding one column fixed gives Yule\u2019s first-order partial r, beside the plain r on the same rows', async () => {
    await tableDrawn();
    await testid('partial-control-5').check(); // Floor area m² (table place 5; the Workshop label is place 0)
    const shown = Number(await testid('partial-r').getAttribute('data-value'));
    // r_xy.z = (r_xy - r_xz r_yz) / sqrt((1 - r_xz^2)(1 - r_yz^2)) (Yule 1897), on the rows complete in all three.
    const xs = await columnNumbers(page(), 'North', COLUMN.mechanics, 2, 49);
    const ys = await columnNumbers(page(), 'North', COLUMN.repairs, 2, 49);
    const zs = await columnNumbers(page(), 'North', COLUMN.floor, 2, 49);
    const keep = xs.map((v, i) => v !== null && ys[i] !== null && zs[i] !== null);
    const pick = (v: (number | null)[]) => v.filter((_, i) => keep[i]) as number[];
    const [x, y, z] = [pick(xs), pick(ys), pick(zs)];
    const rxy = pearsonReference(x, y);
    const rxz = pearsonReference(x, z);
    const ryz = pearsonReference(y, z);
    const expected = (rxy - rxz * ryz) / Math.sqrt((1 - rxz ** 2) * (1 - ryz ** 2));
    expect(Math.abs(shown - expected)).toBeLessThan(1e-9);
    await expect(testid('partial-n').getAttribute('data-value')).resolves.toBe(String(x.length));
    await expect(testid('partial-reading').textContent()).resolves.toContain('Floor area m²');
    await testid('partial-control-5').uncheck();
    await expect(testid('partial-result').textContent()).resolves.toContain('Tick one or more columns');
  });
});

describe('the planning line', () => {
  const exact = (r: number) => POWER.power.find((e: { r: number; n: number; tail: string }) => e.r === r && e.n === 48 && e.tail === 'both').power as number;

  test('at 48 pairs: power at 0.1, 0.3 and 0.5 and the detectable correlation as the exact distribution gives them', async () => {
    const summary = (await page().evaluate(() => window.__covaryPanel!.summary()))!;
    expect(summary.n).toBe(48);
    await testid('planning').scrollIntoViewIfNeeded();
    const cells = await page().locator('[data-testid="planning-table"] tbody tr td:nth-child(2)').allTextContents();
    expect(cells).toEqual([0.1, 0.3, 0.5].map((r) => `${Math.round(100 * exact(r))}%`));
    const d8 = POWER.detectable.find((e: { n: number; power: number }) => e.n === 48 && e.power === 0.8).r as number;
    const d9 = POWER.detectable.find((e: { n: number; power: number }) => e.n === 48 && e.power === 0.9).r as number;
    await expect(testid('planning-lead').textContent()).resolves.toBe(`Smallest true correlation these 48 pairs find 8 times in 10: ${d8.toFixed(2)}; 9 times in 10: ${d9.toFixed(2)} (two-sided test, alpha 0.05).`);
    await testid('planning').screenshot({ path: path.join(__dirname, '../../test-artifacts', 'panel-planning.png') });
  });

  test('a typed correlation gets its power and the rows it needs; text that is not one is refused in words', async () => {
    const rows = POWER.sample_size.find((e: { r: number; power: number; tail: string }) => e.r === 0.2 && e.power === 0.8 && e.tail === 'both').n as number;
    await testid('planning-target').fill('20%');
    await expect(testid('planning-answer').textContent()).resolves.toBe(`A true correlation of 0.20 is found ${Math.round(100 * exact(0.2))}% of the time with 48 pairs; ${rows} rows find it 8 times in 10.`);
    await testid('planning-target').fill('strong');
    await expect(testid('planning-answer').textContent()).resolves.toContain('Type a correlation between 0 and 1');
    await expect(testid('planning-target').getAttribute('aria-invalid')).resolves.toBe('true');
    await testid('planning-target').fill('0.2');
  });
});

describe('residual axes', () => {
  test('every residual chart labels 0 on its value axis', async () => {
    for (const chart of ['residuals', 'order'] as const) {
      const ticks = await page().evaluate((c) => window.__covaryPanel!.axisTicks(c, 'y'), chart);
      expect(ticks).toContain(0);
      expect(ticks.length).toBeLessThanOrEqual(6);
    }
    await screenshot(page(), 'panel-after-table-tests');
  });
});
