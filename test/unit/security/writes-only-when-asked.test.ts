/**
 * The add-in writes to the workbook only where the user asks: the panel's two buttons ("Put formulas in sheet",
 * "Write report sheet"). Checked statically on every panel source (taskpane/ and its subfolders) with the TypeScript
 * parser:
 * 1. every Excel write (assigning a range's values, formulas or formats; adding, deleting, clearing, inserting,
 *    copying or moving cells or sheets; adding charts; settings and custom XML) sits in ExcelWorkbook.writeCells,
 *    ExcelWorkbook.addSheet or ExcelWorkbook.addChart (taskpane/excel-workbook.ts), or in writeInBlocks, which
 *    only those call;
 * 2. those are called only from the button handlers putFormulas and writeReport (taskpane/write-actions.ts), or
 *    from addReportCharts, which only writeReport calls;
 * 3. the handlers are referenced nowhere but in the two buttons' click listeners.
 * The cell functions cannot write at all: in a shared runtime custom functions may only read, and the bundle never
 * touches Office or Excel (host-contract.test.ts, every-function.test.ts).
 */
import * as fs from 'fs';
import * as path from 'path';
import ts from 'typescript';

const ROOT = path.resolve(__dirname, '../../..');
const PANEL = path.join(ROOT, 'taskpane');

/** Properties whose assignment changes the workbook. */
const WRITE_PROPERTIES = new Set(['values', 'formulas', 'formulasLocal', 'formulasR1C1', 'numberFormat', 'numberFormatLocal', 'valuesAsJson', 'hyperlink', 'name', 'visibility', 'position']);
/** Methods that change the workbook when called on a range, sheet, table or collection (not event handlers). */
const WRITE_METHODS = new Set(['delete', 'clear', 'insert', 'copyFrom', 'moveTo', 'merge', 'unmerge', 'setCellProperties', 'setRowProperties', 'setColumnProperties', 'autofitColumns', 'autofitRows', 'addTable', 'addFromBase64', 'insertWorksheetsFromBase64', 'addRow', 'addColumn', 'set', 'setValue']);
const ALLOWED_WRITERS = new Set(['writeCells', 'addSheet', 'addChart']);
/** Helpers that write or call a writer, each with the only functions allowed to call it. */
const HELPERS: Record<string, string[]> = { writeInBlocks: ['writeCells', 'addSheet'], addReportCharts: ['writeReport'] };
const isHelper = (name: string) => Object.prototype.hasOwnProperty.call(HELPERS, name);
const BUTTON_HANDLERS = new Set(['putFormulas', 'writeReport']);

/** Every TypeScript source under taskpane/, at any depth. */
function panelFiles(dir = PANEL): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const full = path.join(dir, d.name);
    if (d.isDirectory()) return panelFiles(full);
    return d.name.endsWith('.ts') && !d.name.endsWith('.d.ts') ? [full] : [];
  });
}

/** Name of the function, method or variable-held function that encloses a node. */
function enclosingFunctionName(n: ts.Node): string {
  for (let p: ts.Node | undefined = n.parent; p; p = p.parent) {
    if ((ts.isFunctionDeclaration(p) || ts.isMethodDeclaration(p)) && p.name) return p.name.getText();
    if ((ts.isArrowFunction(p) || ts.isFunctionExpression(p)) && ts.isVariableDeclaration(p.parent)) return p.parent.name.getText();
  }
  return '(top level)';
}

/** Receiver text of a call like a.b.c(): "a.b". */
const receiverOf = (call: ts.CallExpression): string => (ts.isPropertyAccessExpression(call.expression) ? call.expression.expression.getText() : '');

interface Found {
  file: string;
  line: number;
  what: string;
  inside: string;
}

function scan(file: string, visit: (n: ts.Node, sf: ts.SourceFile, add: (n: ts.Node, what: string) => void) => void): Found[] {
  const text = fs.readFileSync(file, 'utf8');
  const sf = ts.createSourceFile(file, text, ts.ScriptTarget.ES2020, true);
  const found: Found[] = [];
  const add = (n: ts.Node, what: string) =>
    found.push({ file: path.relative(ROOT, file).split(path.sep).join('/'), line: sf.getLineAndCharacterOfPosition(n.getStart()).line + 1, what, inside: enclosingFunctionName(n) });
  const walk = (n: ts.Node) => {
    visit(n, sf, add);
    ts.forEachChild(n, walk);
  };
  walk(sf);
  return found;
}

/** Excel writes in the panel sources. Only statements that reach an Excel object (inside Excel.run) count. */
function excelWrites(): Found[] {
  return panelFiles().flatMap((file) =>
    scan(file, (n, _sf, add) => {
      const insideExcelRun = () => {
        for (let p: ts.Node | undefined = n.parent; p; p = p.parent) {
          if (ts.isCallExpression(p) && /^Excel\.run$/.test(p.expression.getText())) return true;
        }
        return false;
      };
      if (ts.isBinaryExpression(n) && n.operatorToken.kind === ts.SyntaxKind.EqualsToken && ts.isPropertyAccessExpression(n.left) && WRITE_PROPERTIES.has(n.left.name.text) && insideExcelRun()) {
        add(n, `${n.left.getText()} =`);
      }
      if (ts.isCallExpression(n) && ts.isPropertyAccessExpression(n.expression) && insideExcelRun()) {
        const name = n.expression.name.text;
        const receiver = receiverOf(n);
        // "add" writes when it adds a sheet, table, name or comment; onChanged.add(handler) only listens.
        const adds = name === 'add' && !/\.on[A-Z]\w*$/.test(receiver);
        if (WRITE_METHODS.has(name) || adds) add(n, `${receiver}.${name}()`);
      }
      if (ts.isPropertyAccessExpression(n) && /^(settings|customXmlParts|names|comments|customProperties)$/.test(n.name.text) && insideExcelRun()) {
        add(n, `uses ${n.getText()}`);
      }
    }),
  );
}

describe('the panel writes only where the user asks', () => {
  test('the panel sources are there', () => {
    const names = panelFiles().map((f) => path.relative(PANEL, f).split(path.sep).join('/'));
    expect(names).toEqual(expect.arrayContaining(['excel-workbook.ts', 'panel.ts', 'write-actions.ts', 'controller.ts']));
    // The scan reaches the subfolders too (the sections), so a write added there cannot hide.
    expect(names.filter((n) => n.startsWith('sections/')).length).toBeGreaterThanOrEqual(4);
  });

  test('every Excel write is inside ExcelWorkbook.writeCells or ExcelWorkbook.addSheet', () => {
    const writes = excelWrites();
    expect(writes.length).toBeGreaterThan(0);
    const elsewhere = writes.filter((w) => !(w.file === 'taskpane/excel-workbook.ts' && (ALLOWED_WRITERS.has(w.inside) || isHelper(w.inside))));
    expect(elsewhere).toEqual([]);
  });

  test('only taskpane/excel-workbook.ts talks to Excel (Excel.run); taskpane.ts only waits for Office.onReady', () => {
    for (const file of panelFiles()) {
      const name = path.basename(file);
      const code = fs.readFileSync(file, 'utf8').replace(/\/\*[\s\S]*?\*\/|\/\/.*$/gm, '');
      if (name !== 'excel-workbook.ts') expect([name, /\bExcel\.run\b|context\.workbook/.test(code)]).toEqual([name, false]);
      if (name !== 'taskpane.ts' && name !== 'excel-workbook.ts') expect([name, /\bOffice\.(context|onReady)/.test(code)]).toEqual([name, false]);
    }
  });

  test('no write through the older Office.js document API (selected data, bindings, settings, custom XML)', () => {
    for (const file of panelFiles()) {
      expect([file, fs.readFileSync(file, 'utf8').match(/set(Selected)?DataAsync|bindings\.add|settings\.(set|saveAsync)|customXmlParts\.add/g)]).toEqual([file, null]);
    }
  });

  test('writeCells and addSheet are called only from the two button handlers', () => {
    const calls = panelFiles().flatMap((file) =>
      scan(file, (n, _sf, add) => {
        if (ts.isCallExpression(n) && ts.isPropertyAccessExpression(n.expression) && ALLOWED_WRITERS.has(n.expression.name.text)) add(n, n.expression.name.text);
      }),
    );
    expect(calls.length).toBeGreaterThan(0);
    expect(calls.filter((c) => !BUTTON_HANDLERS.has(c.inside) && !isHelper(c.inside))).toEqual([]);
  });

  test('each writing helper is called only from where it may be', () => {
    const calls = panelFiles().flatMap((file) =>
      scan(file, (n, _sf, add) => {
        if (!ts.isCallExpression(n)) return;
        const callee = ts.isIdentifier(n.expression) ? n.expression.text : ts.isPropertyAccessExpression(n.expression) ? n.expression.name.text : '';
        if (isHelper(callee)) add(n, callee);
      }),
    );
    expect(calls.map((c) => c.what).sort()).toEqual(expect.arrayContaining(['addReportCharts', 'writeInBlocks']));
    expect(calls.filter((c) => !HELPERS[c.what].includes(c.inside))).toEqual([]);
  });

  test('the handlers are used only as click listeners of buttons', () => {
    const uses = panelFiles().flatMap((file) =>
      scan(file, (n, _sf, add) => {
        if (!ts.isIdentifier(n) || !BUTTON_HANDLERS.has(n.text)) return;
        const parent = n.parent;
        if ((ts.isFunctionDeclaration(parent) || ts.isVariableDeclaration(parent)) && parent.name === n) return; // the definition
        // The use must sit in a listener: button.addEventListener('click', () => void handler()).
        let listener: ts.CallExpression | undefined;
        for (let p: ts.Node | undefined = parent; p; p = p.parent) {
          if (ts.isCallExpression(p) && ts.isPropertyAccessExpression(p.expression) && p.expression.name.text === 'addEventListener') {
            listener = p;
            break;
          }
        }
        const event = listener && listener.arguments[0] && ts.isStringLiteral(listener.arguments[0]) ? listener.arguments[0].text : undefined;
        add(n, `${n.text} used ${event ? `in a '${event}' listener of ${receiverOf(listener!)}` : 'outside a listener'}`);
      }),
    );
    expect(uses.length).toBe(BUTTON_HANDLERS.size);
    for (const u of uses) expect(u.what).toMatch(/in a 'click' listener of \w*[Bb]utton$/);
  });
});
