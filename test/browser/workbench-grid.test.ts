/**
 * The workbench's grid and formulas in Debian's Chromium: the page loads under its policy, COVARY formulas are
 * evaluated by dist/functions.js in the formula worker and follow edits, results spill (or show #SPILL!), errors
 * show like Excel's with their message, selection gives Excel-style addresses, and cell text is never markup.
 * Expected correlations come from Pearson's definition computed here in the test (harness.pearsonReference) on the
 * grid's own numbers, not from the project's code.
 */
import * as fs from 'fs';
import {
  BrowserSession, RunningWorkbench, cell, cellValue, completePairs, foreignRequests, openBrowser, pearsonReference,
  screenshot, settle, showSheet, startWorkbench, typeInto,
} from './harness';

jest.setTimeout(120000);

let server: RunningWorkbench;
let browser: BrowserSession;
const timings: Record<string, number> = {};

beforeAll(async () => {
  let t = Date.now();
  server = await startWorkbench();
  timings.serverStartMs = Date.now() - t;
  browser = await openBrowser(server.origin);
  t = Date.now();
  const response = await browser.page.goto(server.url);
  (globalThis as { cspHeader?: string }).cspHeader = response?.headers()['content-security-policy'];
  await settle(browser.page);
  timings.pageReadyMs = Date.now() - t;
}, 300000);

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (Object.keys(timings).length) process.stdout.write(`workbench-grid timings: ${JSON.stringify(timings)}\n`);
});

const page = () => browser.page;

/** The demo pair's numbers (North!B2:C49), pairwise complete. */
const demoPair = () => completePairs(page(), 'North', 'B', 'C', 2, 49);

describe('the workbench page', () => {
  test('loads with its sheets, demo tables and the functions from functions.js', async () => {
    await expect(page().title()).resolves.toBe('Covary workbench');
    const tabs = await page().locator('.wb-tab').allTextContents();
    expect(tabs).toEqual(['North', 'South', 'Monthly figures', 'Live formulas']);
    await expect(cell(page(), 'A1').textContent()).resolves.toBe('Workshop');
    await expect(cell(page(), 'B1').textContent()).resolves.toBe('Mechanics (FTE)');
    await expect(page().locator('[data-testid="formula-status"]').textContent()).resolves.toMatch(/COVARY functions loaded from functions\.js/);
    await expect(page().locator('[data-testid="name-box"]').inputValue()).resolves.toBe('B1:C49');
    await screenshot(page(), 'workbench-loaded');
  });

  test('the policy is sent as a header: the page meta tag plus frame-ancestors, which only a header can carry', async () => {
    const header = (globalThis as { cspHeader?: string }).cspHeader;
    const meta = await page().locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(meta).toMatch(/default-src 'none'/);
    expect(meta).toMatch(/script-src 'self'/);
    expect(header).toBe(`${meta}; frame-ancestors 'self'`);
  });
});

describe('COVARY formulas hosted from dist/functions.js', () => {
  test('COEF beside the demo table equals Pearson r of the same cells', async () => {
    const { x, y } = await demoPair();
    expect(x.length).toBe(48);
    const r = await cellValue(page(), 'North!N2');
    expect(typeof r).toBe('number');
    // Reference: Pearson's definition computed in this test; relative tolerance 1e-9.
    expect(r as number).toBeCloseTo(pearsonReference(x, y), 9);
    await expect(cell(page(), 'N5').textContent()).resolves.toBe('48');
  });

  test('INTERVAL spills across two cells around r; PVALUE is a probability', async () => {
    const r = (await cellValue(page(), 'North!N2')) as number;
    const lower = (await cellValue(page(), 'North!N3')) as number;
    const upper = (await cellValue(page(), 'North!O3')) as number;
    expect(typeof lower).toBe('number');
    expect(typeof upper).toBe('number');
    expect(lower).toBeLessThan(r);
    expect(upper).toBeGreaterThan(r);
    expect(upper).toBeLessThanOrEqual(1);
    const p = (await cellValue(page(), 'North!N4')) as number;
    expect(p).toBeGreaterThanOrEqual(0);
    expect(p).toBeLessThan(0.001);
  });

  test('editing a data cell recalculates the formulas that read it', async () => {
    const before = (await cellValue(page(), 'North!N2')) as number;
    const old = await cellValue(page(), 'North!C5');
    await typeInto(page(), 'North', 'C5', '400');
    const after = (await cellValue(page(), 'North!N2')) as number;
    expect(after).not.toBeCloseTo(before, 6);
    const { x, y } = await demoPair();
    expect(after).toBeCloseTo(pearsonReference(x, y), 9);
    // The formula on another sheet that reads North!B:C by a sheet-qualified range followed too.
    await expect(cellValue(page(), "'Live formulas'!B2")).resolves.toBeCloseTo(after, 12);
    await screenshot(page(), 'workbench-after-edit');
    await typeInto(page(), 'North', 'C5', String(old));
    await expect(cellValue(page(), 'North!N2')).resolves.toBeCloseTo(before, 12);
  });

  test('a blank cell is skipped pairwise (passed as null), so PAIRS drops by one', async () => {
    const old = await cellValue(page(), 'North!B7');
    await typeInto(page(), 'North', 'B7', '');
    await expect(cellValue(page(), 'North!N5')).resolves.toBe(47);
    const { x, y } = await demoPair();
    await expect(cellValue(page(), 'North!N2')).resolves.toBeCloseTo(pearsonReference(x, y), 9);
    await typeInto(page(), 'North', 'B7', String(old));
    await expect(cellValue(page(), 'North!N5')).resolves.toBe(48);
  });

  test('a spilled result shows #SPILL! while a cell blocks it, and spills again when cleared', async () => {
    await typeInto(page(), 'North', 'O3', 'in the way');
    await expect(cell(page(), 'N3').textContent()).resolves.toBe('#SPILL!');
    await expect(cell(page(), 'N3').getAttribute('title')).resolves.toMatch(/not empty/);
    await typeInto(page(), 'North', 'O3', '');
    await expect(cellValue(page(), 'North!O3')).resolves.toEqual(expect.any(Number));
  });

  test('sheet-qualified and quoted ranges, omitted arguments and three-cell spills work', async () => {
    await showSheet(page(), 'Live formulas');
    await expect(cellValue(page(), "'Live formulas'!B8")).resolves.toEqual(expect.any(Number));
    for (const address of ['B14', 'C14', 'D14', 'B15', 'C15', 'D15']) {
      await expect(cellValue(page(), `'Live formulas'!${address}`)).resolves.toEqual(expect.any(Number));
    }
    // A 90% interval is narrower than a 95% one for the same reported r and n.
    const width95 = ((await cellValue(page(), "'Live formulas'!C14")) as number) - ((await cellValue(page(), "'Live formulas'!B14")) as number);
    const width90 = ((await cellValue(page(), "'Live formulas'!C15")) as number) - ((await cellValue(page(), "'Live formulas'!B15")) as number);
    expect(width90).toBeLessThan(width95);
    // DIFF_GROUPS spills four cells; its difference is the two COEF cells' difference, computed another way.
    const north = (await cellValue(page(), "'Live formulas'!B2")) as number;
    const south = (await cellValue(page(), "'Live formulas'!B3")) as number;
    const diff = (await cellValue(page(), "'Live formulas'!B11")) as number;
    expect(Math.abs(diff - (north - south))).toBeLessThanOrEqual(1e-9 * Math.abs(north - south));
    expect(await cellValue(page(), "'Live formulas'!C11")).toBeLessThan(diff);
    expect(await cellValue(page(), "'Live formulas'!D11")).toBeGreaterThan(diff);
    await screenshot(page(), 'workbench-live-formulas');
  });

  test('a function error shows its code with the message as the tooltip', async () => {
    await typeInto(page(), 'Live formulas', 'B25', '=COVARY.COEF({1,2,3}, {5,5,5})');
    await expect(cell(page(), 'B25').textContent()).resolves.toBe('#VALUE!');
    await expect(cell(page(), 'B25').getAttribute('title')).resolves.toMatch(/constant/);
    await typeInto(page(), 'Live formulas', 'B26', '=COVARY.NOSUCH(1)');
    await expect(cell(page(), 'B26').textContent()).resolves.toBe('#NAME?');
    await typeInto(page(), 'Live formulas', 'B27', '=COVARY.COEF(Nowhere!A1:A3, B1:B3)');
    await expect(cell(page(), 'B27').textContent()).resolves.toBe('#REF!');
    // An error in an input answers the formula without a call, as in Excel.
    await typeInto(page(), 'Live formulas', 'B28', '=COVARY.COEF(B25:B27, B2:B4)');
    await expect(cell(page(), 'B28').textContent()).resolves.toBe('#VALUE!');
    await screenshot(page(), 'workbench-errors');
  });
  test('table columns by structured reference follow the table as it grows', async () => {
    const cols = 'NorthWorkshops[[Mechanics (FTE)]], NorthWorkshops[[Repairs per week]]';
    await typeInto(page(), 'Live formulas', 'B30', `=COVARY.PAIRS(${cols})`);
    await typeInto(page(), 'Live formulas', 'B31', `=COVARY.COEF(${cols})`);
    await expect(cellValue(page(), "'Live formulas'!B30")).resolves.toBe(48);
    await expect(cellValue(page(), "'Live formulas'!B31")).resolves.toBeCloseTo((await cellValue(page(), 'North!N2')) as number, 12);
    // A row typed just below the table joins it: the structured reference grows, the fixed range does not.
    await typeInto(page(), 'North', 'B50', '5');
    await typeInto(page(), 'North', 'C50', '52');
    await expect(cellValue(page(), "'Live formulas'!B30")).resolves.toBe(49);
    await expect(cellValue(page(), 'North!N5')).resolves.toBe(48);
    await typeInto(page(), 'North', 'B50', '');
    await typeInto(page(), 'North', 'C50', '');
    await expect(cellValue(page(), "'Live formulas'!B30")).resolves.toBe(48);
  });
});

describe('selection', () => {
  test('click, shift-click and drag select ranges with Excel-style addresses', async () => {
    await showSheet(page(), 'North');
    await cell(page(), 'D2').click();
    await expect(page().evaluate(() => window.covaryWorkbench?.selection())).resolves.toBe('North!D2');
    await cell(page(), 'E49').click({ modifiers: ['Shift'] });
    await expect(page().evaluate(() => window.covaryWorkbench?.selection())).resolves.toBe('North!D2:E49');
    await expect(page().locator('[data-testid="name-box"]').inputValue()).resolves.toBe('D2:E49');
    await cell(page(), 'F2').scrollIntoViewIfNeeded();
    const from = await cell(page(), 'F2').boundingBox();
    const to = await cell(page(), 'G9').boundingBox();
    if (!from || !to) throw new Error('cells not visible');
    await page().mouse.move(from.x + 5, from.y + 5);
    await page().mouse.down();
    await page().mouse.move(to.x + 5, to.y + 5, { steps: 6 });
    await page().mouse.up();
    await expect(page().evaluate(() => window.covaryWorkbench?.selection())).resolves.toBe('North!F2:G9');
    await page().locator('th.wb-colhead', { hasText: /^B$/ }).click();
    await expect(page().evaluate(() => window.covaryWorkbench?.selection())).resolves.toBe('North!B1:B49');
  });
});

describe('cell text is data, never markup', () => {
  const payload = '<img src=x onerror=alert(1)>';

  test('a header and a cell holding an img tag show it as text and run nothing', async () => {
    await typeInto(page(), 'South', 'A1', payload);
    await typeInto(page(), 'South', 'A3', payload);
    await expect(cell(page(), 'A1').textContent()).resolves.toBe(payload);
    await expect(cell(page(), 'A3').textContent()).resolves.toBe(payload);
    await page().waitForTimeout(300);
    await expect(page().locator('img').count()).resolves.toBe(0);
    expect(browser.dialogs).toEqual([]);
    await screenshot(page(), 'workbench-markup-as-text');
  });
});

describe('entries as Excel reads them', () => {
  test('a formula missing a required argument says which one; "5%" and "$1,234.50" become numbers', async () => {
    await showSheet(page(), 'Live formulas');
    // Through the name box and the formula bar: column Z is off screen.
    const enter = async (address: string, text: string) => {
      await page().getByTestId('name-box').fill(address);
      await page().getByTestId('name-box').press('Enter');
      await page().getByTestId('formula-bar').fill(text);
      await page().getByTestId('formula-bar').press('Enter');
      await settle(page());
    };
    await enter('Z2', '=COVARY.COEF(North!B2:B49)');
    await expect(cellValue(page(), "'Live formulas'!Z2")).resolves.toEqual({
      error: '#VALUE!',
      message: 'COVARY.COEF needs 2 arguments (x, y); y is missing',
    });
    await enter('Z3', '5%');
    await enter('Z4', '$1,234.50');
    await expect(cellValue(page(), "'Live formulas'!Z3")).resolves.toBe(0.05);
    await expect(cellValue(page(), "'Live formulas'!Z4")).resolves.toBe(1234.5);
  });
});

describe('undo', () => {
  test('Ctrl+Z puts back a typed cell and the formulas follow; Ctrl+Y does it again', async () => {
    const before = await cellValue(page(), 'North!C7');
    const coefBefore = await cellValue(page(), 'North!N2');
    await typeInto(page(), 'North', 'C7', '500');
    expect(await cellValue(page(), 'North!C7')).toBe(500);
    expect(await cellValue(page(), 'North!N2')).not.toBe(coefBefore);
    await page().getByTestId('grid').focus();
    await page().keyboard.press('Control+z');
    await settle(page());
    expect(await cellValue(page(), 'North!C7')).toBe(before);
    expect(await cellValue(page(), 'North!N2')).toBe(coefBefore);
    await page().keyboard.press('Control+y');
    await settle(page());
    expect(await cellValue(page(), 'North!C7')).toBe(500);
    await page().keyboard.press('Control+z');
    await settle(page());
    expect(await cellValue(page(), 'North!C7')).toBe(before);
  });
});

describe('the keyboard reaches every region', () => {
  const focused = () =>
    page().evaluate(() => {
      const a = document.activeElement as HTMLElement | null;
      if (!a) return 'nothing';
      if (a.closest('[data-testid="panel-root"]')) return 'panel';
      if (a.closest('.wb-tabs')) return `tab ${a.textContent}`;
      return a.dataset.testid ?? a.tagName.toLowerCase();
    });

  test('Tab inside the grid moves the active cell and stays there; F6 and Shift+F6 move between regions', async () => {
    await showSheet(page(), 'North');
    await page().getByTestId('grid').focus();
    for (let i = 0; i < 60; i++) await page().keyboard.press('Tab');
    // As in a spreadsheet, Tab moved the active cell: 60 columns to the right of where it was.
    await expect(focused()).resolves.toBe('grid');
    for (const [key, region] of [
      ['F6', 'tab North'], ['F6', 'panel'], ['F6', 'name-box'], ['F6', 'grid'], ['Shift+F6', 'name-box'], ['Shift+F6', 'panel'],
    ]) {
      await page().keyboard.press(key);
      await expect(focused()).resolves.toBe(region);
    }
  });
});

describe('after all of the above', () => {
  test('no request left localhost and the page raised no errors', async () => {
    expect(browser.requests.length).toBeGreaterThan(3);
    expect(foreignRequests(browser.requests, server.origin)).toEqual([]);
    expect(browser.requests.some((u) => u.endsWith('/functions.js'))).toBe(true);
    expect(browser.pageErrors).toEqual([]);
    expect(browser.consoleErrors.filter((m) => /Content Security Policy|Refused/i.test(m))).toEqual([]);
    expect(fs.existsSync(`${__dirname}/../../test-artifacts/workbench-loaded.png`)).toBe(true);
  });
});
