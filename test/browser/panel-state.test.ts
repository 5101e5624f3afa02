/**
 * The panel's state after the edits an analyst makes, in Debian's Chromium against the workbench: a renamed
 * header is followed (dropdowns, label and the reading take the new name, and later edits still move the panel
 * with the sheet's own COEF formula), the same column picked for X and Y clears the result with the reason, a
 * table's default pair skips its label column, the header's live region says when nothing could be computed,
 * and a column without a header is named once. The expected figures are the grid's COEF formula cells (the cell
 * functions in the formula worker, a second route through the core), never the panel's own output.
 */
import { afterPanelRedraw, cellValue, panelIdle, screenshot, settle, sharedWorkbenchWithPanel, typeInto } from './harness';

jest.setTimeout(120000);

const session = sharedWorkbenchWithPanel();
const page = () => session().page;
const testid = (id: string) => page().locator(`[data-testid="${id}"]`);

const afterRedraw = (action: () => Promise<unknown>) => afterPanelRedraw(page(), action);

/** Waits for the panel to finish whatever an action started (a redraw or a failure). */
async function afterAction(action: () => Promise<unknown>): Promise<void> {
  await action();
  await settle(page());
  await panelIdle(page());
}

describe('a renamed header', () => {
  test('is followed by the pick, and later edits still move the panel with the sheet', async () => {
    await afterRedraw(() => typeInto(page(), 'North', 'B1', 'Staff FTE'));
    await expect(testid('main-pair-label').textContent()).resolves.toContain('Staff FTE');
    const options = await page().locator('[data-testid="main-x-column"] option').allTextContents();
    expect(options).toContain('Staff FTE');
    await expect(testid('main-x-column').inputValue()).resolves.toBe('Staff FTE');
    // An edit after the rename: the panel and the sheet's COEF formula over the same cells move together.
    await afterRedraw(() => typeInto(page(), 'North', 'B5', '99'));
    const formula = (await cellValue(page(), 'North!N2')) as number;
    const shown = (await page().evaluate(() => window.__covaryPanel!.summary()))!;
    expect(Math.abs(shown.r - formula)).toBeLessThan(1e-9);
    await screenshot(page(), 'panel-after-rename');
  });
});

describe('picks that cannot be used', () => {
  test('the same column for X and Y clears the result and says why', async () => {
    await afterAction(() => testid('main-y-column').selectOption({ label: 'Staff FTE' }));
    await expect(page().evaluate(() => window.__covaryPanel!.summary())).resolves.toBeNull();
    await expect(testid('status').textContent()).resolves.toBe('Not computed: X and Y are the same column (Staff FTE): pick two different columns.');
    await expect(testid('r-value').isVisible()).resolves.toBe(false);
  });

  test('a label column picked as X is named in the message, and the status says nothing was computed', async () => {
    await afterAction(async () => {
      await testid('main-y-column').selectOption({ label: 'Repairs per week' });
      await testid('main-x-column').selectOption({ label: 'Workshop' });
    });
    await expect(testid('status').textContent()).resolves.toBe('Not computed: “Workshop” holds no numbers (only text or blanks): pick a column of numbers.');
    await expect(page().evaluate(() => window.__covaryPanel!.summary())).resolves.toBeNull();
  });

  test('choosing another table defaults to its first two columns of numbers, not its label column', async () => {
    await afterRedraw(async () => {
      await testid('main-table').selectOption({ index: 1 });
    });
    const x = await testid('main-x-column').inputValue();
    const y = await testid('main-y-column').inputValue();
    expect([x, y]).not.toContain('Workshop');
    expect([x, y]).not.toContain('Month');
    expect(await page().evaluate(() => window.__covaryPanel!.summary())).not.toBeNull();
    await expect(testid('status').textContent()).resolves.toMatch(/^\d[\d,]* pairs/);
  });
});

test('the page raised no errors', () => {
  expect(session().pageErrors).toEqual([]);
});

describe('writing formulas', () => {
  test('"Put formulas in sheet" selects what it wrote, and a second click shows them instead of writing a copy', async () => {
    // Back to the demo pair of the North table.
    await afterRedraw(async () => {
      await testid('main-table').selectOption({ index: 0 });
      await testid('main-x-column').selectOption({ label: 'Staff FTE' });
      await testid('main-y-column').selectOption({ label: 'Repairs per week' });
    });
    const countFormulas = () =>
      page().evaluate(() => {
        let k = 0;
        for (let c = 12; c <= 60; c++) {
          let col = '';
          for (let n = c; n > 0; n = Math.floor((n - 1) / 26)) col = String.fromCharCode(65 + ((n - 1) % 26)) + col;
          for (let r = 1; r <= 12; r++) if (window.covaryWorkbench!.entry(`North!${col}${r}`).startsWith('=COVARY.COEF(')) k++;
        }
        return k;
      });
    const before = await countFormulas();
    await testid('btn-formulas').click();
    await page().waitForFunction(() => /Formulas written at/.test(document.querySelector('[data-testid="action-status"]')?.textContent ?? ''), undefined, { timeout: 15000 });
    const status = (await testid('action-status').textContent())!;
    const at = /Formulas written at (\S+) \(selected\)/.exec(status)![1];
    await expect(page().evaluate(() => window.covaryWorkbench!.selection())).resolves.toBe(at);
    expect(await countFormulas()).toBe(before + 1);
    await testid('btn-formulas').click();
    await page().waitForFunction(() => /already at/.test(document.querySelector('[data-testid="action-status"]')?.textContent ?? ''), undefined, { timeout: 15000 });
    await expect(testid('action-status').textContent()).resolves.toBe(`The formulas for this pair are already at ${at} (selected). They recalculate with the sheet.`);
    expect(await countFormulas()).toBe(before + 1);
  });
});

describe('compare', () => {
  test('two groups compared on different measures carry a caution; the same measures do not', async () => {
    const cautions = testid('compare-cautions');
    // While North's B1 is renamed, the two groups' columns are named differently: a caution already.
    await expect(cautions.getAttribute('class')).resolves.not.toContain('cv-hidden');
    await afterRedraw(() => typeInto(page(), 'North', 'B1', 'Mechanics (FTE)'));
    await expect(cautions.getAttribute('class')).resolves.toContain('cv-hidden');
    await afterRedraw(async () => {
      await testid('second-mode-table').click();
      await page().waitForFunction(() => [...document.querySelectorAll('[data-testid="second-x-column"] option')].some((o) => o.textContent === 'Floor area m²'), undefined, { timeout: 10000 });
      await testid('second-x-column').selectOption({ label: 'Floor area m²' });
      await testid('second-y-column').selectOption({ label: 'Rent per month' });
    });
    await expect(cautions.getAttribute('class')).resolves.not.toContain('cv-hidden');
    await expect(cautions.textContent()).resolves.toMatch(/are not the same measures: a comparison of two groups asks whether one relationship differs between them/);
    await screenshot(page(), 'panel-compare-caution');
  });
});

describe('skipped rows', () => {
  test('are listed by sheet row under the pairs used, the rows the grid holds no number in', async () => {
    await afterRedraw(async () => {
      await testid('main-x-column').selectOption({ label: 'Households nearby (k)' });
      await testid('main-y-column').selectOption({ label: 'Revenue per week' });
    });
    // The rows of North!J2:K49 where either cell is not a number, found from the grid itself.
    const blank: number[] = [];
    for (let r = 2; r <= 49; r++) {
      const j = await cellValue(page(), `North!J${r}`);
      const k = await cellValue(page(), `North!K${r}`);
      if (typeof j !== 'number' || typeof k !== 'number') blank.push(r);
    }
    expect(blank.length).toBeGreaterThan(0);
    const sub = await page().locator('.cv-tile:has([data-testid="pairs"]) .cv-tile-sub').textContent();
    expect(sub).toBe(`Skipped (a cell not a number): ${blank.length === 1 ? 'row' : 'rows'} ${blank.join(', ')}`);
    await afterRedraw(async () => {
      await testid('main-x-column').selectOption({ label: 'Mechanics (FTE)' });
      await testid('main-y-column').selectOption({ label: 'Repairs per week' });
    });
  });
});

describe('pictures that leave the pane, and their numbers in words', () => {
  test('the scatter is described in words, and its numbers open as a table from the keyboard', async () => {
    const n = (await page().evaluate(() => window.__covaryPanel!.summary()))!.n;
    await expect(testid('chart-scatter-summary').textContent()).resolves.toMatch(new RegExp(`^Scatter of .+ against .+: ${n} points, \\d+ flagged\\.`));
    await expect(testid('chart-scatter').getAttribute('aria-describedby')).resolves.toBe('chart-scatter-summary');
    const fold = page().locator('figure:has([data-testid="chart-scatter"]) details > summary');
    await fold.focus();
    await page().keyboard.press('Enter');
    const rows = page().locator('[data-testid="chart-scatter-table"] tbody tr');
    // The table is built when the fold opens (its toggle event comes after the key press): wait for its last row.
    await rows.nth(n - 1).waitFor();
    await expect(rows.count()).resolves.toBe(n);
    // Row 5 of the sheet, as the grid holds it (B5 was set to 99 above).
    const row5 = await page().locator('[data-testid="chart-scatter-table"] tbody tr', { hasText: /^5/ }).first().locator('td').allTextContents();
    expect(row5.slice(0, 3)).toEqual(['5', '99', String(await cellValue(page(), 'North!C5'))]);
    await page().locator('figure:has([data-testid="chart-scatter"])').scrollIntoViewIfNeeded();
    await screenshot(page(), 'panel-chart-numbers');
  });

  test('"Save PNG" gives a PNG picture of the chart', async () => {
    const [download] = await Promise.all([page().waitForEvent('download'), testid('chart-scatter-save').click()]);
    expect(download.suggestedFilename()).toBe('covary-chart-scatter.png');
    const file = await download.path();
    const bytes = require('fs').readFileSync(file) as Buffer;
    // The PNG signature (ISO/IEC 15948, section 5.2), and a picture larger than an empty canvas.
    expect([...bytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(bytes.length).toBeGreaterThan(5000);
  });
});

/** The workbench's pane theme switch (it stands in for the host's Office theme); waits for the redraw. */
async function setTheme(theme: string): Promise<void> {
  if ((await testid('wb-theme').inputValue()) === theme) return;
  await afterRedraw(() => testid('wb-theme').selectOption(theme));
  await expect(testid('panel-root').getAttribute('data-theme')).resolves.toBe(theme);
}

/** Brings the table section into view (it draws only near the screen) and waits for its first drawing. */
async function tableSectionDrawn(): Promise<void> {
  await testid('section-table').scrollIntoViewIfNeeded();
  await page().waitForFunction(() => Number(document.querySelector('[data-testid="section-table"]')?.getAttribute('data-render-count') ?? 0) > 0, undefined, { timeout: 30000 });
  await panelIdle(page());
}

describe('the dark theme', () => {
  test('the charts repaint in the dark palette: the points take its teal and none keeps the light one', async () => {
    /** Pixels of the scatter, mostly opaque, within 12 of a colour on every channel. */
    const count = (hex: string) => page().evaluate((h) => {
      const canvas = document.querySelector('[data-testid="chart-scatter"]') as HTMLCanvasElement;
      const data = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
      const want = [1, 3, 5].map((i) => parseInt(h.slice(i, i + 2), 16));
      let n = 0;
      for (let i = 0; i < data.length; i += 4) {
        if (data[i + 3] > 150 && want.every((w, k) => Math.abs(data[i + k] - w) <= 12)) n++;
      }
      return n;
    }, hex);
    // The point colours of panel.css: light #0f6b73 at 75%, dark #4cc2c9 opaque.
    // (getImageData gives colours unpremultiplied, so a 75% point reads as its own colour at alpha 191.)
    await setTheme('light');
    expect(await count('#0f6b73')).toBeGreaterThan(200);
    await setTheme('dark');
    expect(await count('#4cc2c9')).toBeGreaterThan(200);
    expect(await count('#0f6b73')).toBe(0);
    await setTheme('light');
  });
});

describe('the panel at task-pane widths, in both themes', () => {
  test.each([[320, 'light'], [1000, 'light'], [320, 'dark'], [1000, 'dark']])('at %i px, %s: nothing runs off the side, and every section is drawn', async (width, theme) => {
    await setTheme(theme as string);
    await tableSectionDrawn();
    await page().evaluate((w) => {
      const main = document.querySelector('.wb-main') as HTMLElement;
      main.style.gridTemplateColumns = `minmax(0, 1fr) ${w}px`;
    }, width);
    await panelIdle(page());
    await page().evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    const overflow = await page().evaluate(() => {
      const root = document.querySelector('[data-testid="panel-root"]') as HTMLElement;
      const out: string[] = [];
      const limit = root.getBoundingClientRect().right + 1;
      root.querySelectorAll('*').forEach((e) => {
        const r = (e as HTMLElement).getBoundingClientRect();
        // The chart tables and a heatmap wider than the pane scroll sideways inside their own region, by design.
        if (r.width > 0 && r.right > limit && !(e as HTMLElement).closest('.cv-chart-table, .cv-heat-wrap')) out.push(`${(e as HTMLElement).className || e.tagName}`);
      });
      return { width: root.clientWidth, out: [...new Set(out)].slice(0, 10) };
    });
    expect(overflow.width).toBeLessThanOrEqual(width);
    expect(overflow.out).toEqual([]);
    // The heatmap of the demo table's ten columns is wider than 320 px: it scrolls in its frame and says so.
    await expect(testid('heatmap-scroll-hint').isVisible()).resolves.toBe(width === 320);
    for (const id of ['section-relationship', 'section-residuals', 'section-compare', 'section-table']) {
      const el = page().locator(`[data-testid="${id}"]`);
      await el.scrollIntoViewIfNeeded();
      const shot = await el.screenshot({ path: require('path').join(__dirname, '../../test-artifacts', `panel-${id}-${width}px-${theme}.png`) });
      expect(shot.length).toBeGreaterThan(3000);
    }
  });
});

describe('accessibility of the panel (WCAG 2.1 AA, checked by axe-core)', () => {
  test('the source toggle shows its focus ring when reached by keyboard, not clipped by its group', async () => {
    await testid('main-mode-selection').focus();
    await page().keyboard.press('Tab');
    const ring = await page().evaluate(() => {
      const b = document.activeElement as HTMLElement;
      const st = getComputedStyle(b);
      const clippers: string[] = [];
      for (let e = b.parentElement; e && e.dataset.testid !== 'panel-root'; e = e.parentElement) {
        const o = getComputedStyle(e);
        // Only a box the ring would cross counts: the button's own group and anything as tight around it.
        const r = e.getBoundingClientRect();
        const br = b.getBoundingClientRect();
        const tight = br.left - r.left < 4 || r.right - br.right < 4 || br.top - r.top < 4 || r.bottom - br.bottom < 4;
        if (tight && (o.overflow !== 'visible' || o.overflowX !== 'visible')) clippers.push(e.className);
      }
      return { id: b.dataset.testid, outline: `${st.outlineStyle} ${st.outlineWidth}`, clippers };
    });
    expect(ring).toEqual({ id: 'main-mode-table', outline: 'solid 2px', clippers: [] });
  });

  test.each(['light', 'dark'])('axe-core reports no violations in the panel, %s theme', async (theme) => {
    await setTheme(theme);
    await tableSectionDrawn();
    // Every folded part opened, so the checker sees all of the panel's text.
    await page().evaluate(() => document.querySelectorAll('[data-testid="panel-root"] details').forEach((d) => ((d as HTMLDetailsElement).open = true)));
    // Evaluated through the debugging protocol, which the page's Content-Security-Policy does not govern (a
    // script tag would be refused by it, as it should be).
    const source = require('fs').readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8') as string;
    await page().evaluate(source);
    const violations = await page().evaluate(async () => {
      const axe = (window as unknown as { axe: { run(el: Element, opts: object): Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[]; failureSummary: string }[] }[] }> } }).axe;
      const res = await axe.run(document.querySelector('[data-testid="panel-root"]')!, {
        runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] },
      });
      return {
        passed: (res as unknown as { passes: { id: string }[] }).passes.map((p) => p.id),
        incomplete: (res as unknown as { incomplete: { id: string; nodes: unknown[] }[] }).incomplete.map((p) => `${p.id} (${p.nodes.length})`),
        violations: res.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 5).map((n) => `${n.target.join(' ')}: ${n.failureSummary}`) })),
      };
    });
    process.stdout.write(`axe-core: ${violations.passed.length} rules passed (${violations.passed.join(', ')}); needs review: ${violations.incomplete.join(', ') || 'none'}\n`);
    // The checker ran its colour-contrast and naming rules on the panel, not on an empty node.
    expect(violations.passed).toEqual(expect.arrayContaining(['color-contrast', 'button-name', 'select-name', 'aria-allowed-attr']));
    expect(violations.violations).toEqual([]);
  });
});
