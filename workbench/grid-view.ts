/**
 * The editable grid: a plain DOM table of the active sheet with column letters and row numbers, a name box and a
 * formula bar above it, and sheet tabs below. Only the part of the sheet in view (and a margin round it) is in the
 * DOM; spacers stand for the rest, so going to XFD1048576 draws as many cells as going to A1. Click selects a cell, shift-click or drag selects a range, a column or
 * row header selects that column or row; typing, F2 or a double-click edits; Enter, Tab and the arrows move;
 * Delete clears. Every cell's text is set with textContent: what a cell holds is data, never markup.
 */
import { Area, cellName, columnLetters, formatArea, intersects, MAX_COLUMN, MAX_ROW, parseArea } from './a1';
import { displayValue } from './cell-format';
import { isErrorValue } from './cell-values';
import type { WorkbookEditor } from './workbook-editor';
import type { WorkbookModel } from './workbook-model';

interface CellPos {
  row: number;
  column: number;
}

/** Extra empty rows and columns past the used range, so there is room to type. */
const SPARE_ROWS = 12;
const SPARE_COLUMNS = 3;
const MIN_ROWS = 40;
const MIN_COLUMNS = 12;
/** Rows and columns drawn beyond the visible part on each side, so a short scroll needs no redraw. */
const BUFFER_ROWS = 20;
const BUFFER_COLUMNS = 4;
/** A sheet this small is drawn whole in that direction (no redraw on scrolling); larger ones in a window. */
const WHOLE_ROWS = 200;
const WHOLE_COLUMNS = 40;
/** A row's height in pixels, as the stylesheet sets it (22px cells, border included). */
const ROW_HEIGHT = 22;
/** Columns past this one keep the standard width (fitting reads cells; a sheet may reach column XFD). */
const FIT_COLUMNS = 256;
/** Column widths in pixels: the row-number column, and the range a fitted column stays within. */
const ROW_HEAD_WIDTH = 44;
/** Pixels per digit of a row number, so that row 1,048,576 fits its head. */
const ROW_HEAD_DIGIT = 8;
const MIN_COLUMN_WIDTH = 64;
const MAX_COLUMN_WIDTH = 320;
/** Average width of a character of the grid's 13px font, for fitting columns to their text. */
const CHAR_WIDTH = 7.1;
/** Text longer than this many characters gets a tooltip with all of it. */
const LONG_TEXT = 30;
/** Rows looked at when fitting a column's width. */
const FIT_SCAN_ROWS = 200;

function el<K extends keyof HTMLElementTagNameMap>(tag: K, className?: string, text?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (className) e.className = className;
  if (text !== undefined) e.textContent = text;
  return e;
}

export class GridView {
  private sheetName: string;
  private anchor: CellPos = { row: 1, column: 1 };
  private focus: CellPos = { row: 1, column: 1 };
  /** The scrollable size of the sheet: its used extent, room to type, and the selection. */
  private extentRows = 0;
  private extentColumns = 0;
  /** Column widths (index = column number) and their running sums (left edge of each column past the row head). */
  private widths: number[] = [];
  private lefts: number[] = [];
  /** The block of cells in the DOM now. */
  private win = { top: 1, bottom: 0, left: 1, right: 0 };
  private redrawPending = false;
  private tableSignature = '';
  private cells = new Map<string, HTMLTableCellElement>();
  private rowHeads = new Map<number, HTMLTableCellElement>();
  private columnHeads = new Map<number, HTMLTableCellElement>();
  private marked: HTMLElement[] = [];
  private flashed: HTMLElement[] = [];
  private flashTimer: number | undefined;
  private dragging = false;
  private editing: { pos: CellPos; input: HTMLInputElement; original: string } | null = null;
  private readonly selectionListeners = new Set<() => void>();

  private readonly nameBox: HTMLInputElement;
  private readonly formulaBar: HTMLInputElement;
  private readonly scroller: HTMLDivElement;
  private readonly table: HTMLTableElement;
  private readonly tabs: HTMLDivElement;
  private readonly note: HTMLDivElement;

  constructor(
    root: HTMLElement,
    private readonly model: WorkbookModel,
    private readonly editor: WorkbookEditor,
  ) {
    this.sheetName = model.sheets[0]?.name ?? 'Sheet1';

    const bar = el('div', 'wb-bar');
    this.nameBox = el('input', 'wb-namebox');
    this.nameBox.setAttribute('aria-label', 'Cell address');
    this.nameBox.dataset.testid = 'name-box';
    this.nameBox.spellcheck = false;
    const fx = el('span', 'wb-fx', 'fx');
    fx.setAttribute('aria-hidden', 'true');
    this.formulaBar = el('input', 'wb-formula');
    this.formulaBar.setAttribute('aria-label', 'Cell contents');
    this.formulaBar.dataset.testid = 'formula-bar';
    this.formulaBar.spellcheck = false;
    bar.append(this.nameBox, fx, this.formulaBar);

    this.scroller = el('div', 'wb-scroller');
    this.scroller.tabIndex = 0;
    this.scroller.dataset.testid = 'grid';
    this.table = el('table', 'wb-grid');
    this.table.setAttribute('role', 'grid');
    this.scroller.append(this.table);

    this.note = el('div', 'wb-note');
    this.note.dataset.testid = 'cell-message';
    this.note.setAttribute('role', 'status');
    this.tabs = el('div', 'wb-tabs');
    this.tabs.setAttribute('role', 'tablist');
    root.append(bar, this.scroller, this.note, this.tabs);

    this.wireEvents();
    this.scroller.addEventListener('scroll', () => {
      if (this.redrawPending) return;
      this.redrawPending = true;
      requestAnimationFrame(() => {
        this.redrawPending = false;
        if (!this.editing) this.drawWindow(false);
      });
    });
    model.onChange((areas) => this.onModelChange(areas));
    this.render();
  }

  get activeSheet(): string {
    return this.sheetName;
  }

  /** Where F6 lands in each of the grid's regions: the name box, the grid itself, the active sheet's tab. */
  focusTargets(): { bar: HTMLElement; grid: HTMLElement; tabs: HTMLElement } {
    const active = this.tabs.querySelector<HTMLElement>('.wb-tab.active') ?? this.tabs.querySelector<HTMLElement>('.wb-tab') ?? this.tabs;
    return { bar: this.nameBox, grid: this.scroller, tabs: active };
  }

  /** The selected area on the active sheet. */
  selectionArea(): Area {
    return {
      sheet: this.sheetName,
      top: Math.min(this.anchor.row, this.focus.row),
      bottom: Math.max(this.anchor.row, this.focus.row),
      left: Math.min(this.anchor.column, this.focus.column),
      right: Math.max(this.anchor.column, this.focus.column),
    };
  }

  onSelectionChange(listener: () => void): () => void {
    this.selectionListeners.add(listener);
    return () => this.selectionListeners.delete(listener);
  }

  /** Shows a sheet (its tab becomes active). */
  showSheet(name: string): void {
    const s = this.model.sheet(name);
    if (!s || s.name === this.sheetName) return;
    this.commitEdit();
    this.sheetName = s.name;
    this.anchor = { row: 1, column: 1 };
    this.focus = { row: 1, column: 1 };
    this.scroller.scrollTop = 0;
    this.scroller.scrollLeft = 0;
    this.render();
    this.selectionChanged();
  }

  /** Selects an area (switching sheet if needed) and scrolls it into view. */
  select(area: Area, options: { flash?: boolean } = {}): void {
    this.showSheet(area.sheet);
    this.anchor = { row: area.top, column: area.left };
    this.focus = { row: area.bottom === Infinity ? this.lastUsedRow() : area.bottom, column: area.right };
    this.ensureExtent();
    this.scrollToCell(this.anchor, 'center');
    this.paintSelection();
    if (options.flash) this.flash(area);
    this.selectionChanged();
  }

  /** Selects a whole row of the sheet (across its used columns) and brings it into view. */
  selectRow(sheet: string, row: number): void {
    const s = this.model.sheet(sheet);
    if (!s) throw new Error(`no sheet named ${sheet}`);
    const columns = Math.max(1, this.model.usedExtent(s.name).columns);
    this.select({ sheet: s.name, top: row, bottom: row, left: 1, right: columns }, { flash: true });
    this.scroller.scrollLeft = 0;
    this.drawWindow(false);
  }

  // ---- drawing -------------------------------------------------------------------------------------------

  private lastUsedRow(): number {
    return Math.max(1, this.model.usedExtent(this.sheetName).rows);
  }

  private tablesOnSheet() {
    return this.model.tables.filter((t) => t.sheet.toLowerCase() === this.sheetName.toLowerCase());
  }

  private currentTableSignature(): string {
    return this.tablesOnSheet()
      .map((t) => `${t.name}:${t.top}:${t.left}:${t.bottom}:${t.right}`)
      .join('|');
  }

  /** Lays out the active sheet (extent and column widths) and draws the part in view: on load, on a sheet
   *  switch, and when the sheet outgrows its extent or its tables change. */
  render(): void {
    this.editing = null;
    this.layout();
    this.drawWindow(true);
    this.renderTabs();
    this.paintSelection();
  }

  private layout(): void {
    const used = this.model.usedExtent(this.sheetName);
    const reach = Math.max(this.focus.row, this.anchor.row);
    const reachColumn = Math.max(this.focus.column, this.anchor.column);
    this.extentRows = Math.min(MAX_ROW, Math.max(MIN_ROWS, used.rows + SPARE_ROWS, reach + SPARE_ROWS));
    this.extentColumns = Math.min(MAX_COLUMN, Math.max(MIN_COLUMNS, used.columns + SPARE_COLUMNS, reachColumn + SPARE_COLUMNS));
    this.tableSignature = this.currentTableSignature();
    this.widths = [0];
    this.lefts = [0, 0];
    for (let c = 1; c <= this.extentColumns; c++) {
      const w = c <= Math.min(used.columns, FIT_COLUMNS) ? this.fitWidth(c, used.rows) : MIN_COLUMN_WIDTH;
      this.widths.push(w);
      this.lefts.push(this.lefts[c] + w);
    }
  }

  /** Grows the extent (without redrawing what is in view) when the selection reaches past it. */
  private ensureExtent(): void {
    const reach = Math.max(this.focus.row, this.anchor.row);
    const reachColumn = Math.max(this.focus.column, this.anchor.column);
    if (reach + 1 > this.extentRows || reachColumn + 1 > this.extentColumns) {
      this.layout();
      this.drawWindow(true);
    }
  }

  /** The row-number column: wide enough for the last row number drawn. */
  private rowHeadWidth(): number {
    return Math.max(ROW_HEAD_WIDTH, String(this.win.bottom).length * ROW_HEAD_DIGIT + 14);
  }

  /** The block of cells to draw for the current scroll position. */
  private wantedWindow(): { top: number; bottom: number; left: number; right: number } {
    const height = this.scroller.clientHeight || 900;
    const width = this.scroller.clientWidth || 1000;
    const firstRow = Math.floor(this.scroller.scrollTop / ROW_HEIGHT) + 1;
    const rowsInView = Math.ceil(height / ROW_HEIGHT) + 1;
    const wholeRows = this.extentRows <= WHOLE_ROWS;
    const wholeColumns = this.extentColumns <= WHOLE_COLUMNS;
    const top = wholeRows ? 1 : Math.max(1, firstRow - BUFFER_ROWS);
    const bottom = wholeRows ? this.extentRows : Math.min(this.extentRows, firstRow + rowsInView + BUFFER_ROWS);
    const firstColumn = this.columnAt(this.scroller.scrollLeft);
    const lastColumn = this.columnAt(this.scroller.scrollLeft + width);
    const left = wholeColumns ? 1 : Math.max(1, firstColumn - BUFFER_COLUMNS);
    const right = wholeColumns ? this.extentColumns : Math.min(this.extentColumns, lastColumn + BUFFER_COLUMNS);
    return { top, bottom, left, right };
  }

  /** The column whose span holds horizontal position x (pixels from the first column's left edge). */
  private columnAt(x: number): number {
    let lo = 1;
    let hi = this.extentColumns;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.lefts[mid] <= x) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  /** Draws the part of the sheet in view, when it is not already drawn (or always, when forced). */
  private drawWindow(force: boolean): void {
    const want = this.wantedWindow();
    const w = this.win;
    const covered = want.top >= w.top && want.bottom <= w.bottom && want.left >= w.left && want.right <= w.right;
    if (covered && !force) return;
    this.win = want;
    const { top, bottom, left, right } = want;
    this.cells = new Map();
    this.rowHeads = new Map();
    this.columnHeads = new Map();
    this.marked = [];
    this.flashed = [];
    const total = this.lefts[this.extentColumns + 1];
    const before = this.lefts[left];
    const after = total - this.lefts[right + 1];

    const colgroup = el('colgroup');
    const corner = el('col', 'wb-col-rowhead');
    corner.style.width = `${this.rowHeadWidth()}px`;
    colgroup.append(corner);
    const spacerCol = (width: number) => {
      const col = el('col');
      col.style.width = `${width}px`;
      colgroup.append(col);
    };
    if (before > 0) spacerCol(before);
    for (let c = left; c <= right; c++) spacerCol(this.widths[c]);
    if (after > 0) spacerCol(after);
    // A fixed layout needs the table's width: long text is then cut with an ellipsis (the full text is in the
    // formula bar), as in a spreadsheet.
    this.table.style.width = `${this.rowHeadWidth() + total}px`;

    const thead = el('thead');
    const headRow = el('tr');
    headRow.append(el('th', 'wb-corner'));
    if (before > 0) headRow.append(el('th', 'wb-spacer'));
    for (let c = left; c <= right; c++) {
      const th = el('th', 'wb-colhead', columnLetters(c));
      th.dataset.column = String(c);
      th.scope = 'col';
      headRow.append(th);
      this.columnHeads.set(c, th);
    }
    if (after > 0) headRow.append(el('th', 'wb-spacer'));
    thead.append(headRow);

    const spanned = 1 + (before > 0 ? 1 : 0) + (right - left + 1) + (after > 0 ? 1 : 0);
    const spacerRow = (rows: number) => {
      const tr = el('tr', 'wb-spacer-row');
      const td = el('td', 'wb-spacer');
      td.colSpan = spanned;
      td.style.height = `${rows * ROW_HEIGHT}px`;
      tr.append(td);
      tr.setAttribute('aria-hidden', 'true');
      return tr;
    };
    const tables = this.tablesOnSheet();
    const tbody = el('tbody');
    if (top > 1) tbody.append(spacerRow(top - 1));
    for (let r = top; r <= bottom; r++) {
      const tr = el('tr');
      const rh = el('th', 'wb-rowhead', String(r));
      rh.dataset.row = String(r);
      rh.scope = 'row';
      tr.append(rh);
      this.rowHeads.set(r, rh);
      if (before > 0) tr.append(el('td', 'wb-spacer'));
      for (let c = left; c <= right; c++) {
        const td = el('td');
        td.dataset.row = String(r);
        td.dataset.column = String(c);
        td.dataset.address = cellName(r, c);
        const t = tables.find((tb) => r >= tb.top && r <= tb.bottom && c >= tb.left && c <= tb.right);
        td.className = t ? (r === t.top ? 'tbl-head' : (r - t.top) % 2 === 0 ? 'tbl tbl-band' : 'tbl') : '';
        this.fillCell(td, r, c);
        tr.append(td);
        this.cells.set(`${r}:${c}`, td);
      }
      if (after > 0) tr.append(el('td', 'wb-spacer'));
      tbody.append(tr);
    }
    if (bottom < this.extentRows) tbody.append(spacerRow(this.extentRows - bottom));
    const keepTop = this.scroller.scrollTop;
    const keepLeft = this.scroller.scrollLeft;
    this.table.replaceChildren(colgroup, thead, tbody);
    this.scroller.scrollTop = keepTop;
    this.scroller.scrollLeft = keepLeft;
    if (!force) this.paintSelection();
  }

  /** Scrolls so that a cell is in view ('nearest': only as far as needed; 'center': in the middle), then draws. */
  private scrollToCell(pos: CellPos, mode: 'nearest' | 'center'): void {
    const headHeight = ROW_HEIGHT;
    const viewHeight = Math.max(ROW_HEIGHT, (this.scroller.clientHeight || 900) - headHeight);
    const viewWidth = Math.max(MIN_COLUMN_WIDTH, (this.scroller.clientWidth || 1000) - this.rowHeadWidth());
    const y = (pos.row - 1) * ROW_HEIGHT;
    const x = this.lefts[Math.min(pos.column, this.extentColumns)] ?? 0;
    const w = this.widths[pos.column] ?? MIN_COLUMN_WIDTH;
    if (mode === 'center') {
      if (y < this.scroller.scrollTop || y + ROW_HEIGHT > this.scroller.scrollTop + viewHeight) this.scroller.scrollTop = Math.max(0, y - viewHeight / 2);
    } else if (y < this.scroller.scrollTop) this.scroller.scrollTop = y;
    else if (y + ROW_HEIGHT > this.scroller.scrollTop + viewHeight) this.scroller.scrollTop = y + ROW_HEIGHT - viewHeight;
    if (x < this.scroller.scrollLeft) this.scroller.scrollLeft = x;
    else if (x + w > this.scroller.scrollLeft + viewWidth) this.scroller.scrollLeft = x + w - viewWidth;
    this.drawWindow(false);
  }

  /** A column wide enough for its longest text among the first rows (like a spreadsheet's autofit), within limits. */
  private fitWidth(column: number, usedRows: number): number {
    let longest = 0;
    const last = Math.min(usedRows, FIT_SCAN_ROWS);
    for (let r = 1; r <= last; r++) {
      const text = displayValue(this.model.value(this.sheetName, r, column)).text;
      // Header rows of tables are bold: their characters are wider.
      const width = text.length * (this.isTableHeader(r, column) ? CHAR_WIDTH * 1.12 : CHAR_WIDTH);
      if (width > longest) longest = width;
    }
    return Math.round(Math.min(MAX_COLUMN_WIDTH, Math.max(MIN_COLUMN_WIDTH, longest + 18)));
  }

  private isTableHeader(row: number, column: number): boolean {
    return this.tablesOnSheet().some((t) => t.top === row && column >= t.left && column <= t.right);
  }

  private renderTabs(): void {
    const buttons = this.model.sheets.map((s) => {
      const b = el('button', s.name === this.sheetName ? 'wb-tab active' : 'wb-tab', s.name);
      b.type = 'button';
      b.setAttribute('role', 'tab');
      b.setAttribute('aria-selected', String(s.name === this.sheetName));
      b.dataset.sheet = s.name;
      b.addEventListener('click', () => this.showSheet(s.name));
      return b;
    });
    this.tabs.replaceChildren(...buttons);
  }

  private fillCell(td: HTMLTableCellElement, row: number, column: number): void {
    const shown = displayValue(this.model.value(this.sheetName, row, column));
    td.textContent = shown.text;
    td.dataset.kind = shown.kind;
    // Long text may be cut by the column width: its tooltip holds all of it.
    const title = shown.title ?? (shown.kind === 'text' && shown.text.length > LONG_TEXT ? shown.text : undefined);
    if (title) td.title = title;
    else td.removeAttribute('title');
  }

  private onModelChange(areas: Area[]): void {
    if (this.model.sheets.length !== this.tabs.childElementCount) this.renderTabs();
    const here = areas.filter((a) => a.sheet.toLowerCase() === this.sheetName.toLowerCase());
    if (here.length === 0) return;
    const used = this.model.usedExtent(this.sheetName);
    const outgrown = used.rows + 1 > this.extentRows || used.columns + 1 > this.extentColumns;
    if (outgrown || this.currentTableSignature() !== this.tableSignature) {
      this.editing = null;
      this.layout();
      this.drawWindow(true);
      this.paintSelection();
      return;
    }
    const w = this.win;
    for (const a of here) {
      const top = Math.max(a.top, w.top);
      const bottom = Math.min(a.bottom, w.bottom);
      const left = Math.max(a.left, w.left);
      const right = Math.min(a.right, w.right);
      for (let r = top; r <= bottom; r++) {
        for (let c = left; c <= right; c++) {
          const td = this.cells.get(`${r}:${c}`);
          if (td && !(this.editing && this.editing.pos.row === r && this.editing.pos.column === c)) this.fillCell(td, r, c);
        }
      }
    }
    this.refreshFormulaBar();
  }

  // ---- selection -----------------------------------------------------------------------------------------

  private paintSelection(): void {
    for (const e of this.marked) e.classList.remove('sel', 'active', 'sel-head');
    this.marked = [];
    const a = this.selectionArea();
    const w = this.win;
    const top = Math.max(a.top, w.top);
    const bottom = Math.min(a.bottom, w.bottom);
    const left = Math.max(a.left, w.left);
    const right = Math.min(a.right, w.right);
    for (let r = top; r <= bottom; r++) {
      for (let c = left; c <= right; c++) {
        const td = this.cells.get(`${r}:${c}`);
        if (td) {
          td.classList.add('sel');
          this.marked.push(td);
        }
      }
      const rh = this.rowHeads.get(r);
      if (rh) {
        rh.classList.add('sel-head');
        this.marked.push(rh);
      }
    }
    for (let c = left; c <= right; c++) {
      const ch = this.columnHeads.get(c);
      if (ch) {
        ch.classList.add('sel-head');
        this.marked.push(ch);
      }
    }
    const active = this.cells.get(`${this.anchor.row}:${this.anchor.column}`);
    if (active) {
      active.classList.add('active');
      this.marked.push(active);
    }
    this.nameBox.value = formatArea(a, false);
    this.refreshFormulaBar();
  }

  private refreshFormulaBar(): void {
    this.refreshNote();
    if (document.activeElement === this.formulaBar) return;
    this.formulaBar.value = this.model.entryText(this.sheetName, this.anchor.row, this.anchor.column);
  }

  /** Under the grid, the active cell's error and what it means, in text a keyboard or screen-reader user reaches
   *  (the cell's tooltip alone needs a mouse). */
  private refreshNote(): void {
    const v = this.model.value(this.sheetName, this.anchor.row, this.anchor.column);
    const text = isErrorValue(v) ? `${cellName(this.anchor.row, this.anchor.column)}: ${v.error}${v.message ? ` ${v.message}` : ''}` : '';
    if (this.note.textContent !== text) this.note.textContent = text;
    this.note.hidden = text === '';
  }

  private flash(area: Area): void {
    for (const e of this.flashed) e.classList.remove('flash');
    this.flashed = [];
    if (this.flashTimer !== undefined) window.clearTimeout(this.flashTimer);
    const w = this.win;
    for (let r = Math.max(area.top, w.top); r <= Math.min(area.bottom, w.bottom); r++) {
      const rh = this.rowHeads.get(r);
      if (rh) this.flashed.push(rh);
      for (let c = Math.max(area.left, w.left); c <= Math.min(area.right, w.right); c++) {
        const td = this.cells.get(`${r}:${c}`);
        if (td) this.flashed.push(td);
      }
    }
    for (const e of this.flashed) e.classList.add('flash');
    this.flashTimer = window.setTimeout(() => {
      for (const e of this.flashed) e.classList.remove('flash');
      this.flashed = [];
    }, 2500);
  }

  private selectionChanged(): void {
    for (const l of [...this.selectionListeners]) l();
  }

  private setSelection(anchor: CellPos, focus: CellPos): void {
    this.anchor = anchor;
    this.focus = focus;
    this.paintSelection();
    this.selectionChanged();
  }

  private moveBy(dRow: number, dColumn: number, extend: boolean): void {
    const from = extend ? this.focus : this.anchor;
    const next = { row: Math.min(MAX_ROW, Math.max(1, from.row + dRow)), column: Math.min(MAX_COLUMN, Math.max(1, from.column + dColumn)) };
    if (extend) this.focus = next;
    else {
      this.anchor = next;
      this.focus = next;
    }
    this.ensureExtent();
    this.scrollToCell(next, 'nearest');
    this.setSelection(this.anchor, this.focus);
  }

  // ---- editing -------------------------------------------------------------------------------------------

  private beginEdit(pos: CellPos, initial?: string): void {
    this.commitEdit();
    const td = this.cells.get(`${pos.row}:${pos.column}`);
    if (!td) return;
    const original = this.model.entryText(this.sheetName, pos.row, pos.column);
    const input = el('input', 'wb-cell-editor');
    input.value = initial ?? original;
    input.spellcheck = false;
    input.setAttribute('aria-label', `Edit ${cellName(pos.row, pos.column)}`);
    td.replaceChildren(input);
    this.editing = { pos, input, original };
    input.focus();
    input.setSelectionRange(input.value.length, input.value.length);
    input.addEventListener('keydown', (e) => {
      if (e.key === 'Enter' || e.key === 'Tab') {
        e.preventDefault();
        this.commitEdit();
        this.moveBy(e.key === 'Enter' ? (e.shiftKey ? -1 : 1) : 0, e.key === 'Tab' ? (e.shiftKey ? -1 : 1) : 0, false);
        this.scroller.focus({ preventScroll: true });
      } else if (e.key === 'Escape') {
        e.preventDefault();
        this.cancelEdit();
      }
      e.stopPropagation();
    });
    input.addEventListener('input', () => {
      this.formulaBar.value = input.value;
    });
    input.addEventListener('blur', () => this.commitEdit());
  }

  private cancelEdit(): void {
    const ed = this.editing;
    if (!ed) return;
    this.editing = null;
    const td = this.cells.get(`${ed.pos.row}:${ed.pos.column}`);
    if (td) this.fillCell(td, ed.pos.row, ed.pos.column);
    this.refreshFormulaBar();
    this.scroller.focus({ preventScroll: true });
  }

  private commitEdit(): void {
    const ed = this.editing;
    if (!ed) return;
    this.editing = null;
    const typed = ed.input.value;
    const td = this.cells.get(`${ed.pos.row}:${ed.pos.column}`);
    if (typed === ed.original) {
      if (td) this.fillCell(td, ed.pos.row, ed.pos.column);
      return;
    }
    void this.editor.write(this.sheetName, ed.pos.row, ed.pos.column, [[typed]]);
    if (td && td.isConnected) this.fillCell(td, ed.pos.row, ed.pos.column);
  }

  private clearSelection(): void {
    void this.editor.clear(this.selectionArea());
  }

  // ---- events --------------------------------------------------------------------------------------------

  private posOf(target: EventTarget | null): CellPos | null {
    const td = (target as HTMLElement | null)?.closest?.('td');
    if (!td || !td.dataset.row) return null;
    return { row: Number(td.dataset.row), column: Number(td.dataset.column) };
  }

  private wireEvents(): void {
    this.table.addEventListener('mousedown', (e) => {
      if (e.button !== 0) return;
      const target = e.target as HTMLElement;
      if (target.classList.contains('wb-cell-editor')) return;
      const head = target.closest('th');
      const used = this.model.usedExtent(this.sheetName);
      if (head?.dataset.column) {
        e.preventDefault();
        this.commitEdit();
        const c = Number(head.dataset.column);
        const lastRow = Math.max(1, used.rows);
        if (e.shiftKey) this.setSelection({ row: 1, column: this.anchor.column }, { row: lastRow, column: c });
        else this.setSelection({ row: 1, column: c }, { row: lastRow, column: c });
        this.scroller.focus({ preventScroll: true });
        return;
      }
      if (head?.dataset.row) {
        e.preventDefault();
        this.commitEdit();
        const r = Number(head.dataset.row);
        const lastColumn = Math.max(1, used.columns);
        if (e.shiftKey) this.setSelection({ row: this.anchor.row, column: 1 }, { row: r, column: lastColumn });
        else this.setSelection({ row: r, column: 1 }, { row: r, column: lastColumn });
        this.scroller.focus({ preventScroll: true });
        return;
      }
      const pos = this.posOf(e.target);
      if (!pos) return;
      e.preventDefault();
      this.commitEdit();
      if (e.shiftKey) this.setSelection(this.anchor, pos);
      else this.setSelection(pos, pos);
      this.dragging = true;
      this.scroller.focus({ preventScroll: true });
    });
    this.table.addEventListener('mouseover', (e) => {
      if (!this.dragging) return;
      const pos = this.posOf(e.target);
      if (pos && (pos.row !== this.focus.row || pos.column !== this.focus.column)) this.setSelection(this.anchor, pos);
    });
    document.addEventListener('mouseup', () => {
      this.dragging = false;
    });
    this.table.addEventListener('dblclick', (e) => {
      const pos = this.posOf(e.target);
      if (pos) this.beginEdit(pos);
    });

    this.scroller.addEventListener('keydown', (e) => {
      if (this.editing) return;
      const moves: Record<string, [number, number]> = { ArrowUp: [-1, 0], ArrowDown: [1, 0], ArrowLeft: [0, -1], ArrowRight: [0, 1] };
      if (moves[e.key]) {
        e.preventDefault();
        this.moveBy(moves[e.key][0], moves[e.key][1], e.shiftKey);
      } else if (e.key === 'Enter') {
        e.preventDefault();
        this.moveBy(e.shiftKey ? -1 : 1, 0, false);
      } else if (e.key === 'Tab') {
        e.preventDefault();
        this.moveBy(0, e.shiftKey ? -1 : 1, false);
      } else if (e.key === 'F2') {
        e.preventDefault();
        this.beginEdit(this.anchor);
      } else if (e.key === 'Delete' || e.key === 'Backspace') {
        e.preventDefault();
        this.clearSelection();
      } else if ((e.ctrlKey || e.metaKey) && !e.altKey && (e.key === 'z' || e.key === 'Z' || e.key === 'y' || e.key === 'Y')) {
        // Ctrl+Z undoes, Ctrl+Y or Ctrl+Shift+Z redoes, as in a spreadsheet.
        e.preventDefault();
        const redo = e.key === 'y' || e.key === 'Y' || e.shiftKey;
        void (redo ? this.editor.redo() : this.editor.undo());
      } else if (e.key.length === 1 && !e.ctrlKey && !e.metaKey && !e.altKey) {
        e.preventDefault();
        this.setSelection(this.anchor, this.anchor);
        this.beginEdit(this.anchor, e.key);
      }
    });

    this.formulaBar.addEventListener('keydown', (e) => {
      if (e.key === 'Enter') {
        e.preventDefault();
        const text = this.formulaBar.value;
        const pos = this.anchor;
        if (text !== this.model.entryText(this.sheetName, pos.row, pos.column)) void this.editor.write(this.sheetName, pos.row, pos.column, [[text]]);
        this.scroller.focus({ preventScroll: true });
        this.moveBy(1, 0, false);
      } else if (e.key === 'Escape') {
        e.preventDefault();
        this.scroller.focus({ preventScroll: true });
        this.refreshFormulaBar();
      }
    });
    this.formulaBar.addEventListener('blur', () => this.refreshFormulaBar());

    this.nameBox.addEventListener('keydown', (e) => {
      if (e.key !== 'Enter') return;
      e.preventDefault();
      const area = parseArea(this.nameBox.value, this.sheetName);
      if (area && this.model.sheet(area.sheet)) {
        this.select(area);
        this.scroller.focus({ preventScroll: true });
      } else {
        this.nameBox.value = formatArea(this.selectionArea(), false);
      }
    });
  }

  /** True when the area is (partly) drawn on the active sheet: for callers deciding whether to redraw. */
  shows(area: Area): boolean {
    return intersects(area, { sheet: this.sheetName, top: this.win.top, left: this.win.left, bottom: this.win.bottom, right: this.win.right });
  }
}
