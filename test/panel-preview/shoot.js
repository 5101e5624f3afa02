/* Screenshots of the panel preview in Debian's Chromium (never a downloaded browser), and a redraw timing.
 *   node test/panel-preview/shoot.js [scenario ...]      scenarios: demo markup rows=100000 rows=1000000
 * Serves test-artifacts/preview/ on a free local port; writes PNGs to test-artifacts/. */
const http = require('http');
const fs = require('fs');
const path = require('path');
const { chromium } = require('playwright-core');

const dir = path.resolve(__dirname, '../../test-artifacts/preview');
const out = path.resolve(__dirname, '../../test-artifacts');
const types = { '.html': 'text/html', '.js': 'text/javascript', '.css': 'text/css', '.png': 'image/png' };

function serve() {
  const server = http.createServer((req, res) => {
    const file = path.join(dir, decodeURIComponent(new URL(req.url, 'http://x').pathname).replace(/^\/+/, '') || 'index.html');
    if (!file.startsWith(dir) || !fs.existsSync(file) || fs.statSync(file).isDirectory()) {
      res.writeHead(404);
      res.end();
      return;
    }
    res.writeHead(200, { 'Content-Type': types[path.extname(file)] || 'application/octet-stream' });
    fs.createReadStream(file).pipe(res);
  });
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve(server)));
}

async function main() {
  const scenarios = process.argv.slice(2).length ? process.argv.slice(2) : ['demo'];
  const server = await serve();
  const base = `http://127.0.0.1:${server.address().port}/index.html`;
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run', '--disable-sync'],
  });
  try {
    for (const scenario of scenarios) {
      const page = await browser.newPage({ viewport: { width: Number(process.env.PANEL_WIDTH || 380), height: 900 }, deviceScaleFactor: 2 });
      const problems = [];
      page.on('console', (m) => { if (m.type() === 'error' || m.type() === 'warning') problems.push(`${m.type()}: ${m.text()}`); });
      page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`));
      page.on('dialog', async (d) => { problems.push(`DIALOG OPENED: ${d.message()}`); await d.dismiss(); });
      await page.goto(`${base}#${scenario}`);
      await page.waitForFunction(() => ['ready', 'error', 'empty'].includes(document.getElementById('app').getAttribute('data-state')), null, { timeout: 60000 });
      if (scenario !== 'empty') await page.waitForFunction(() => window.__covaryPanel && window.__covaryPanel.renderCount() > 0, null, { timeout: 60000 });
      await page.evaluate(() => window.__covaryPanel.whenIdle());
      const name = scenario.replace(/[^a-z0-9]+/gi, '-');
      if (scenario.startsWith('rows=')) {
        const timings = [];
        for (let k = 0; k < Number(process.env.EDITS || 5); k++) {
          const before = await page.evaluate(() => window.__covaryPanel.renderCount());
          await page.evaluate((v) => { window.__editAt = performance.now(); window.previewEdit(50, v); }, 60 + k);
          await page.waitForFunction((b) => window.__covaryPanel.renderCount() > b, before, { timeout: 60000 });
          // whenIdle also waits for charts scrolled out of view, painted when the page is next idle
          const settled = await page.evaluate(() => window.__covaryPanel.whenIdle().then(() => performance.now() - window.__editAt));
          timings.push(await page.evaluate((allCharts) => ({
            latency: window.__covaryPanel.lastLatencyMs(),
            allCharts,
            render: window.__covaryPanel.lastRenderMs(),
            drawn: window.__covaryPanel.drawnRows().length,
            phases: window.__covaryPanel.lastPhases(),
          }), settled));
          await page.waitForTimeout(300);
        }
        console.log(scenario, JSON.stringify(timings));
        const summary = (key) => {
          const v = timings.map((t) => t[key]).sort((a, b) => a - b);
          return `median ${Math.round(v[v.length >> 1])} ms, max ${Math.round(v[v.length - 1])} ms, over 200 ms: ${v.filter((t) => t > 200).length} of ${v.length}`;
        };
        console.log(`redraw on screen after an edit: ${summary('latency')}; every chart painted: ${summary('allCharts')}`);
        console.log('best of 10 without drawing:', JSON.stringify(await page.evaluate(() => window.previewTimeSteps(10))));
      }
      if (scenario === 'demo' || scenario === 'markup') {
        // Hover then click the first flagged point on the residual plot: the tooltip names the row, the click
        // must select that row in the workbook.
        const row = await page.evaluate(() => window.__covaryPanel.flaggedRows()[0]);
        if (row !== undefined) {
          const at = await page.evaluate((r) => window.__covaryPanel.pointOnScreen('residuals', r), row);
          await page.locator('[data-testid="chart-residuals"]').scrollIntoViewIfNeeded();
          const at2 = await page.evaluate((r) => window.__covaryPanel.pointOnScreen('residuals', r), row);
          await page.mouse.move(at2.x, at2.y);
          await page.waitForTimeout(200);
          await page.locator('[data-testid="chart-residuals-frame"]').screenshot({ path: path.join(out, `panel-${name}-hover.png`) });
          await page.mouse.click(at2.x, at2.y);
          await page.waitForTimeout(100);
          const selected = await page.evaluate(() => window.previewWorkbook.selectedRows.slice());
          console.log(`flagged row ${row} at`, at, '-> selected', JSON.stringify(selected));
        }
        await page.click('.cv-details summary');
      }
      await page.screenshot({ path: path.join(out, `panel-${name}.png`), fullPage: true });
      await page.locator('[data-testid="checks-table"]').screenshot({ path: path.join(out, `panel-${name}-checks.png`) }).catch(() => undefined);
      for (const id of ['section-relationship', 'section-residuals', 'section-compare', 'section-cautions']) {
        await page.locator(`[data-testid="${id}"]`).screenshot({ path: path.join(out, `panel-${name}-${id}.png`) });
      }
      console.log(`${scenario}: test-artifacts/panel-${name}.png`, problems.length ? problems : 'no console errors');
      await page.close();
    }
  } finally {
    await browser.close();
    server.close();
  }
}

main().catch((e) => { console.error(e); process.exit(1); });
