/**
 * Browser-test harness: starts the workbench with the real `npm start` script (node scripts/start.js) on a free
 * port, and Debian's Chromium (/usr/bin/chromium, never a downloaded browser) driven by playwright-core with a fresh
 * profile. It records every request, dialog, page error and console error so the tests can assert that nothing
 * leaves localhost, nothing runs that should not, and the page's policy was never violated.
 */
import { ChildProcess, spawn } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { BrowserContext, Page, chromium } from 'playwright-core';
import type {} from '../../workbench/debug-handle';
import { pairsWithoutBlanks } from '../helpers/pairs';
import type { PanelDebug } from '../../taskpane/panel';

declare global {
  interface Window {
    __covaryPanel?: PanelDebug;
  }
}

/** Waits until the panel is mounted and no refresh is running or waiting. */
export async function panelIdle(p: Page): Promise<void> {
  await p.waitForFunction(() => window.__covaryPanel !== undefined, undefined, { timeout: 30000 });
  await p.evaluate(() => window.__covaryPanel!.whenIdle());
}

/** Runs an action and waits until the panel has drawn again and settled. */
export async function afterPanelRedraw(p: Page, action: () => Promise<unknown>): Promise<void> {
  const before = await p.evaluate(() => window.__covaryPanel!.renderCount());
  await action();
  await p.waitForFunction((n) => window.__covaryPanel!.renderCount() > n, before, { timeout: 30000 });
  await panelIdle(p);
}

export const ROOT = path.resolve(__dirname, '../..');
export const ARTIFACTS = path.join(ROOT, 'test-artifacts');
export const CHROMIUM = '/usr/bin/chromium';
const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run', '--disable-sync'];

export interface RunningWorkbench {
  /** e.g. http://localhost:40123/ */
  url: string;
  origin: string;
  output(): string;
  stop(): Promise<void>;
}

/** Starts `node scripts/start.js` with PORT=0 (a free port) and BROWSER=none; resolves once it prints its URL.
 *  It builds dist/ first when the sources are newer, which can take a minute or two. */
export function startWorkbench(timeoutMs = 280000): Promise<RunningWorkbench> {
  const child: ChildProcess = spawn(process.execPath, [path.join(ROOT, 'scripts/start.js')], {
    cwd: ROOT,
    env: { ...process.env, PORT: '0', BROWSER: 'none' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  return new Promise<RunningWorkbench>((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGTERM');
      reject(new Error(`the workbench server did not start in time:\n${out}`));
    }, timeoutMs);
    const onData = (chunk: Buffer) => {
      out += chunk.toString();
      const m = /workbench: (http:\/\/localhost:(\d+))\//.exec(out);
      if (m) {
        clearTimeout(timer);
        child.stdout?.off('data', onData);
        child.stdout?.on('data', (c: Buffer) => (out += c.toString()));
        resolve({
          url: `${m[1]}/`,
          origin: m[1],
          output: () => out,
          stop: async () => {
            if (child.exitCode === null) child.kill('SIGTERM');
            await exited;
          },
        });
      }
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', (c: Buffer) => (out += c.toString()));
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`scripts/start.js exited (${code}) before serving:\n${out}`));
    });
  });
}

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  /** Every URL the browser asked for (pages, scripts, workers, fetches). */
  requests: string[];
  dialogs: string[];
  pageErrors: string[];
  consoleErrors: string[];
  close(): Promise<void>;
}

/** Opens Chromium with a fresh temporary profile; requests to anything but the workbench's origin are recorded
 *  and refused. */
export async function openBrowser(origin: string): Promise<BrowserSession> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: install Debian's chromium (apt-get install chromium)`);
  const userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'covary-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM,
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: 1500, height: 940 },
    deviceScaleFactor: 1,
  });
  const requests: string[] = [];
  const dialogs: string[] = [];
  const pageErrors: string[] = [];
  const consoleErrors: string[] = [];
  context.on('request', (r) => requests.push(r.url()));
  await context.route('**/*', (route) => {
    const url = route.request().url();
    if (url.startsWith(origin + '/') || url.startsWith('data:')) return route.continue();
    return route.abort('blockedbyclient');
  });
  const page = context.pages()[0] ?? (await context.newPage());
  page.on('dialog', (d) => {
    dialogs.push(`${d.type()}: ${d.message()}`);
    void d.dismiss();
  });
  page.on('pageerror', (e) => pageErrors.push(String(e)));
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(m.text());
  });
  return {
    context,
    page,
    requests,
    dialogs,
    pageErrors,
    consoleErrors,
    close: async () => {
      await context.close();
      fs.rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}

/** Waits until the functions are loaded and no recalculation is queued. */
export async function settle(page: Page): Promise<void> {
  await page.waitForFunction(() => window.covaryWorkbench?.ready === true && !window.covaryWorkbench.busy(), undefined, { timeout: 30000 });
}

/** A cell's value through the page's read-only handle (numbers at full precision). */
export function cellValue(page: Page, address: string): Promise<unknown> {
  return page.evaluate((a) => window.covaryWorkbench?.value(a), address);
}

/** Shows a sheet by clicking its tab. */
export async function showSheet(page: Page, sheet: string): Promise<void> {
  await page.locator(`.wb-tab[data-sheet="${sheet}"]`).click();
}

/** The grid cell element of the active sheet, e.g. cell(page, "N2"). */
export function cell(page: Page, address: string) {
  return page.locator(`td[data-address="${address}"]`);
}

/** Types into a cell as a user does: click it, type, press Enter. Waits for the recalculation to finish. */
export async function typeInto(page: Page, sheet: string, address: string, text: string): Promise<void> {
  await showSheet(page, sheet);
  await cell(page, address).click();
  if (text === '') await page.keyboard.press('Delete');
  else {
    await page.keyboard.type(text);
    await page.keyboard.press('Enter');
  }
  await settle(page);
}

export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  const file = path.join(ARTIFACTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}

/** Requests that went anywhere but the workbench's own origin (or data: URLs). */
export function foreignRequests(requests: string[], origin: string): string[] {
  return requests.filter((u) => !(u.startsWith(origin + '/') || u.startsWith('data:')));
}

export { pearsonReference } from '../helpers/pearson-reference';

/** Numbers in a column of the sheet through the page handle (rows first..last). */
export async function columnNumbers(page: Page, sheet: string, column: string, first: number, last: number): Promise<(number | null)[]> {
  return page.evaluate(
    ({ sheet, column, first, last }) => {
      const out: (number | null)[] = [];
      for (let r = first; r <= last; r++) {
        const v = window.covaryWorkbench?.value(`'${sheet}'!${column}${r}`);
        out.push(typeof v === 'number' ? v : null);
      }
      return out;
    },
    { sheet, column, first, last },
  );
}

/** Two columns of a sheet (rows first..last) as the grid holds them, keeping the rows with a number in both. */
export async function completePairs(page: Page, sheet: string, xColumn: string, yColumn: string, first: number, last: number): Promise<{ x: number[]; y: number[] }> {
  const xs = await columnNumbers(page, sheet, xColumn, first, last);
  const ys = await columnNumbers(page, sheet, yColumn, first, last);
  return pairsWithoutBlanks(xs, ys);
}

/** The workbench started and open in Chromium, with the panel's first result on screen and settled. */
export async function openWorkbenchWithPanel(): Promise<{ server: RunningWorkbench; browser: BrowserSession }> {
  const server = await startWorkbench();
  const browser = await openBrowser(server.origin);
  await browser.page.goto(server.url);
  await settle(browser.page);
  await browser.page.waitForFunction(() => window.__covaryPanel?.summary() != null, undefined, { timeout: 30000 });
  await panelIdle(browser.page);
  return { server, browser };
}

/**
 * For a test file that shares one workbench and panel: opens them (openWorkbenchWithPanel) before the file's first
 * test and closes them after its last. The returned accessor gives the open session inside tests.
 */
export function sharedWorkbenchWithPanel(): () => BrowserSession {
  let server: RunningWorkbench | undefined;
  let browser: BrowserSession | undefined;
  beforeAll(async () => {
    ({ server, browser } = await openWorkbenchWithPanel());
  }, 300000);
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  return () => {
    if (!browser) throw new Error('the workbench is not open (sharedWorkbenchWithPanel opens it in beforeAll)');
    return browser;
  };
}
