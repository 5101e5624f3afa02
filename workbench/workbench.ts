/**
 * Workbench entry: builds the demo workbook, draws the grid, starts the formula worker (which hosts
 * dist/functions.js as Excel does), calculates every formula, and mounts the real panel on the grid's workbook.
 */
import { firstFocusable, installRegionKeys } from './regions';
import { Calculator } from './calculator';
import { COMPANY, demoWorkbook } from './demo-data';
import { FormulaEvaluator } from './formula-evaluator';
import { FunctionHost } from './function-host';
import { FunctionMeta, loadFunctionMetadata } from './function-metadata';
import { GridView } from './grid-view';
import { GridWorkbook } from './grid-workbook';
import { mountPanelInWorkbench } from './panel-mount';
import { parseArea, formatArea } from './a1';
import { WorkbookEditor } from './workbook-editor';
import { WorkbookModel } from './workbook-model';
import type { WorkbenchDebugHandle } from './debug-handle';

function loadDemo(model: WorkbookModel): void {
  for (const sheet of demoWorkbook()) {
    const s = model.addSheet(sheet.name);
    sheet.cells.forEach((row, r) => row.forEach((entry, c) => model.setEntry(s.name, r + 1, c + 1, entry)));
    for (const x of sheet.extras ?? []) model.setEntry(s.name, x.row, x.column, x.entry);
    if (sheet.table) model.addTable({ name: sheet.table.name, sheet: s.name, top: 1, left: 1, right: sheet.table.columns, bottom: sheet.table.rows });
  }
}

function start(): void {
  const gridRoot = document.getElementById('grid-root');
  const panelRoot = document.getElementById('panel-root');
  const status = document.getElementById('formula-status');
  const subtitle = document.getElementById('wb-subtitle');
  if (!gridRoot || !panelRoot || !status) throw new Error('the workbench page is missing its mount points');
  if (subtitle) subtitle.textContent = `Demo data: ${COMPANY}, an invented chain of bike-repair workshops. Edit any cell; the formulas and the panel follow.`;

  const model = new WorkbookModel();
  loadDemo(model);

  const host = new FunctionHost('formula-worker.js');
  const functions = new Map<string, FunctionMeta>();
  const registered = new Set<string>();
  const evaluator = new FormulaEvaluator(model, host, functions, registered);
  const calculator = new Calculator(model, evaluator);
  const editor = new WorkbookEditor(model, calculator);
  const view = new GridView(gridRoot, model, editor);
  const workbook = new GridWorkbook(model, editor, view);

  // Start with the demo pair selected (headers included), so "pick from selection" works at once.
  view.select({ sheet: 'North', top: 1, bottom: model.table('NorthWorkshops')?.bottom ?? 49, left: 2, right: 3 });

  const handle: WorkbenchDebugHandle = {
    ready: false,
    busy: () => editor.busy,
    value: (address: string) => {
      const area = parseArea(address, view.activeSheet);
      return area ? model.value(area.sheet, area.top, area.left) : undefined;
    },
    entry: (address: string) => {
      const area = parseArea(address, view.activeSheet);
      return area ? model.entryText(area.sheet, area.top, area.left) : '';
    },
    selection: () => formatArea(view.selectionArea()),
  };
  window.covaryWorkbench = handle;

  void Promise.all([loadFunctionMetadata('functions.json'), host.ready]).then(async ([meta, ready]) => {
    for (const [name, f] of meta) functions.set(name, f);
    for (const id of ready.ids) registered.add(id.toUpperCase());
    if (ready.loadError || ready.ids.length === 0) {
      status.textContent = `functions.js did not load in the formula worker: ${ready.loadError ?? 'no functions were registered'}`;
      status.classList.add('problem');
    } else {
      status.textContent = `${ready.ids.length} COVARY functions loaded from functions.js (in a worker, as Excel hosts them)`;
    }
    await editor.recalcAll();
    handle.ready = true;
    document.body.dataset.ready = 'true';
  });

  // The pane theme stands in for the host's Office theme: chosen in the header, or ?theme=dark in the address.
  const themeSelect = document.getElementById('wb-theme') as HTMLSelectElement | null;
  const asked = new URLSearchParams(location.search).get('theme') === 'dark' ? 'dark' : 'light';
  if (themeSelect) themeSelect.value = asked;
  const panel = mountPanelInWorkbench(panelRoot, workbook, asked);
  themeSelect?.addEventListener('change', () => panel?.setTheme(themeSelect.value === 'dark' ? 'dark' : 'light'));
  const targets = () => view.focusTargets();
  installRegionKeys(document, [
    { name: 'formula bar', contains: (e) => !!e && e.closest('.wb-bar') !== null, entry: () => targets().bar },
    { name: 'grid', contains: (e) => e === targets().grid || (!!e && targets().grid.contains(e)), entry: () => targets().grid },
    { name: 'sheet tabs', contains: (e) => !!e && e.closest('.wb-tabs') !== null, entry: () => targets().tabs },
    { name: 'panel', contains: (e) => !!e && panelRoot.contains(e), entry: () => firstFocusable(panelRoot) },
  ]);
}

start();
