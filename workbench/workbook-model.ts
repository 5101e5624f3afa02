/**
 * The workbench's workbook: sheets of typed entries (values and formulas), the results formulas produced, how those
 * results spill across cells (or show #SPILL! when something is in the way), and named tables with a header row
 * that grow when a row is typed just below them, as Excel tables do. Listeners hear which areas changed.
 */
import { Area, intersects } from './a1';
import { CellValue, ErrorValue, errorValue, isErrorValue, readEntry, sameValue, Scalar } from './cell-values';
import { displayValue } from './cell-format';
import type { CellSource, FormulaResult } from './formula-evaluator';
import { FormulaNode, FormulaSyntaxError, parseFormula, references } from './formula-parser';

/** A formula typed into a cell, its parse, what it reads, and its latest result (undefined while calculating). */
export interface FormulaCell {
  sheet: string;
  row: number;
  column: number;
  text: string;
  node?: FormulaNode;
  syntaxError?: string;
  /** The ranges and table columns it reads (table columns are resolved when asked: tables grow). */
  refs: ReturnType<typeof references>;
  result?: FormulaResult;
}

/** A named block with a header row (row `top`) and data rows below it down to `bottom`. */
export interface TableBlock {
  name: string;
  sheet: string;
  top: number;
  left: number;
  right: number;
  bottom: number;
}

export class SheetData {
  readonly values = new Map<string, Scalar>();
  readonly formulas = new Map<string, FormulaCell>();
  /** Cells covered by a spilled result → key of the formula cell it comes from. */
  spilled = new Map<string, string>();
  /** Formula cells whose result could not spill. */
  blocked = new Set<string>();
  /** The used extent, kept up to date as cells are added and recomputed after a boundary cell is cleared. */
  extent: { rows: number; columns: number } | undefined;
  constructor(public name: string) {}
}

/** A formula reading an area, as the readers' index holds it. */
interface Reader {
  f: FormulaCell;
  area: Area;
  /** The formula's place in entry order, so answers come in a stable order. */
  seq: number;
}

/** Read areas wider than this many columns are kept in a sheet's list of wide readers, not per column. */
const WIDE_READ = 32;

/** Who reads what, per sheet: narrow reads by column, wide ones in a list scanned for every query. */
interface ReadersIndex {
  version: number;
  bySheet: Map<string, { columns: Map<number, Reader[]>; wide: Reader[] }>;
}

export const cellKey = (row: number, column: number): string => `${row}:${column}`;
function splitKey(key: string): [number, number] {
  const i = key.indexOf(':');
  return [Number(key.slice(0, i)), Number(key.slice(i + 1))];
}

export type ChangeListener = (areas: Area[]) => void;

/** Whether the cell stored under `key` lies in `area` (its sheet aside). */
function keyInside(key: string, area: Area): boolean {
  const [r, c] = splitKey(key);
  return r >= area.top && r <= area.bottom && c >= area.left && c <= area.right;
}

export class WorkbookModel implements CellSource {
  readonly sheets: SheetData[] = [];
  readonly tables: TableBlock[] = [];
  private readonly listeners = new Set<ChangeListener>();
  /** Bumped whenever what a formula reads may have changed (a formula entered or removed, a table grown or
   *  renamed): the readers' index is rebuilt on the next query. */
  private readsVersion = 0;
  private readers: ReadersIndex | undefined;

  onChange(listener: ChangeListener): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  notify(areas: Area[]): void {
    if (areas.length === 0) return;
    for (const l of [...this.listeners]) l(areas);
  }

  sheet(name: string): SheetData | undefined {
    const lower = name.toLowerCase();
    return this.sheets.find((s) => s.name.toLowerCase() === lower);
  }

  /** Adds a sheet with a unique name derived from `name` ("Report", "Report (2)", …); returns it. */
  addSheet(name: string): SheetData {
    const base = (name.replace(/[\\/?*[\]:]/g, ' ').trim() || 'Sheet').slice(0, 31);
    let candidate = base;
    for (let i = 2; this.sheet(candidate); i++) candidate = `${base.slice(0, 26)} (${i})`;
    const s = new SheetData(candidate);
    this.sheets.push(s);
    return s;
  }

  addTable(table: TableBlock): void {
    this.tables.push(table);
    this.readsVersion++;
  }

  table(name: string): TableBlock | undefined {
    const lower = name.toLowerCase();
    return this.tables.find((t) => t.name.toLowerCase() === lower);
  }

  /**
   * Stores what the user typed (or the panel wrote) into one cell. Returns the formula cell when a formula was
   * entered (it still needs calculating), and grows a table when the cell is just below it.
   */
  setEntry(sheetName: string, row: number, column: number, typed: string | number | boolean | null): FormulaCell | undefined {
    const s = this.sheet(sheetName);
    if (!s) throw new Error(`no sheet named ${sheetName}`);
    const key = cellKey(row, column);
    const entry = readEntry(typed);
    if (s.formulas.delete(key)) this.readsVersion++;
    if (s.values.delete(key) || entry.kind === 'formula') this.shrinkExtent(s, row, column);
    if (this.isTableHeaderCell(s.name, row, column)) this.readsVersion++;
    let formula: FormulaCell | undefined;
    if (entry.kind === 'formula') {
      formula = { sheet: s.name, row, column, text: entry.text, refs: [] };
      try {
        formula.node = parseFormula(entry.text, s.name);
        formula.refs = references(formula.node);
      } catch (e) {
        formula.syntaxError = e instanceof FormulaSyntaxError ? e.message : String(e);
        formula.result = [[errorValue('#NAME?', `this formula could not be read: ${formula.syntaxError}`)]];
      }
      s.formulas.set(key, formula);
      this.readsVersion++;
    } else if (entry.value !== null) {
      s.values.set(key, entry.value);
    }
    if (entry.kind === 'formula' || entry.value !== null) {
      this.growExtent(s, row, column);
      this.growTables(s.name, row, column);
    }
    return formula;
  }

  /**
   * Clears every entry inside an area, visiting only the cells that hold something (clearing A1:Z1048576 costs
   * what the sheet holds, not 27 million cells). Returns whether anything changed.
   */
  /**
   * The entry of a cell as it could be typed again to give the same cell: a formula's text, a number or TRUE/FALSE
   * as such, text behind an apostrophe (so "42" typed as text stays text), null when empty. For undo.
   */
  typedEntry(sheetName: string, row: number, column: number): string | number | boolean | null {
    const s = this.sheet(sheetName);
    if (!s) return null;
    const key = cellKey(row, column);
    const f = s.formulas.get(key);
    if (f) return f.text;
    const v = s.values.get(key);
    if (v === undefined || v === null) return null;
    if (typeof v === 'string') return `'${v}`;
    if (typeof v === 'number' || typeof v === 'boolean') return v;
    return null;
  }

  /** The cells holding something inside an area (visiting stored cells only, however large the area). */
  storedIn(area: Area): { row: number; column: number }[] {
    const s = this.sheet(area.sheet);
    if (!s) return [];
    const out: { row: number; column: number }[] = [];
    const seen = new Set<string>();
    for (const key of [...s.values.keys(), ...s.formulas.keys()]) {
      if (seen.has(key)) continue;
      seen.add(key);
      if (!keyInside(key, area)) continue;
      const [r, c] = splitKey(key);
      out.push({ row: r, column: c });
    }
    return out;
  }

  clearArea(area: Area): boolean {
    const s = this.sheet(area.sheet);
    if (!s) return false;
    let changed = false;
    for (const key of [...s.values.keys()]) {
      if (keyInside(key, area)) {
        s.values.delete(key);
        changed = true;
      }
    }
    for (const key of [...s.formulas.keys()]) {
      if (keyInside(key, area)) {
        s.formulas.delete(key);
        changed = true;
        this.readsVersion++;
      }
    }
    if (changed) {
      s.extent = undefined;
      if (this.tables.some((t) => t.sheet.toLowerCase() === s.name.toLowerCase() && t.top >= area.top && t.top <= area.bottom)) this.readsVersion++;
    }
    return changed;
  }

  private growExtent(s: SheetData, row: number, column: number): void {
    if (!s.extent) return;
    if (row > s.extent.rows) s.extent.rows = row;
    if (column > s.extent.columns) s.extent.columns = column;
  }

  /** A cell on the used extent's edge was emptied: the extent is worked out again when next asked. */
  private shrinkExtent(s: SheetData, row: number, column: number): void {
    if (s.extent && (row >= s.extent.rows || column >= s.extent.columns)) s.extent = undefined;
  }

  private isTableHeaderCell(sheet: string, row: number, column: number): boolean {
    const lower = sheet.toLowerCase();
    return this.tables.some((t) => t.sheet.toLowerCase() === lower && t.top === row && column >= t.left && column <= t.right);
  }

  private growTables(sheet: string, row: number, column: number): void {
    for (const t of this.tables) {
      if (t.sheet.toLowerCase() === sheet.toLowerCase() && row === t.bottom + 1 && column >= t.left && column <= t.right) {
        t.bottom = row;
        this.readsVersion++;
      }
    }
  }

  /** What the user typed into a cell, for the formula bar: the formula text or the plain value. */
  entryText(sheetName: string, row: number, column: number): string {
    const s = this.sheet(sheetName);
    if (!s) return '';
    const key = cellKey(row, column);
    const f = s.formulas.get(key);
    if (f) return f.text;
    const v = s.values.get(key);
    if (v === undefined || v === null) return '';
    if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
    if (typeof v === 'string') {
      // Text that would read back as something else when typed ("=1+1", "42", "TRUE", "'x") shows with the
      // apostrophe that keeps it text, as Excel's formula bar does.
      const back = readEntry(v);
      return back.kind === 'value' && back.value === v ? v : `'${v}`;
    }
    return String(v);
  }

  /** The value a cell shows: its own value, its formula's result, or the part of a spilled result over it. */
  value(sheetName: string, row: number, column: number): CellValue {
    const s = this.sheet(sheetName);
    return s ? this.valueIn(s, row, column) : null;
  }

  private valueIn(s: SheetData, row: number, column: number): CellValue {
    const key = cellKey(row, column);
    const f = s.formulas.get(key);
    if (f) {
      if (!f.result) return errorValue('#BUSY!', 'calculating');
      if (s.blocked.has(key)) {
        return errorValue('#SPILL!', `the result needs ${f.result.length} x ${f.result[0].length} cells, and a cell in that area is not empty`);
      }
      return f.result[0][0];
    }
    const v = s.values.get(key);
    if (v !== undefined) return v;
    const anchor = s.spilled.get(key);
    if (anchor !== undefined) {
      const af = s.formulas.get(anchor);
      const [ar, ac] = splitKey(anchor);
      const res = af?.result;
      if (res) return res[row - ar]?.[column - ac] ?? null;
    }
    return null;
  }

  /** Rows and columns in use on a sheet (values, formulas and spilled results). */
  usedExtent(sheetName: string): { rows: number; columns: number } {
    const s = this.sheet(sheetName);
    if (!s) return { rows: 0, columns: 0 };
    if (!s.extent) {
      let rows = 0;
      let columns = 0;
      for (const keys of [s.values.keys(), s.formulas.keys(), s.spilled.keys()]) {
        for (const key of keys) {
          const [r, c] = splitKey(key);
          if (r > rows) rows = r;
          if (c > columns) columns = c;
        }
      }
      s.extent = { rows, columns };
    }
    return { ...s.extent };
  }

  /** The cells of an area as rows; whole columns stop at the sheet's last used row (callers that must not build
   *  huge arrays cut the area first: see clipToUsed in formula-evaluator.ts). */
  readArea(area: Area): CellValue[][] | { error: string; message?: string } {
    const s = this.sheet(area.sheet);
    if (!s) return errorValue('#REF!', `there is no sheet named ${area.sheet}`);
    const bottom = area.bottom === Infinity ? Math.max(area.top, this.usedExtent(s.name).rows) : area.bottom;
    const out: CellValue[][] = [];
    for (let r = area.top; r <= bottom; r++) {
      const row: CellValue[] = [];
      for (let c = area.left; c <= area.right; c++) row.push(this.valueIn(s, r, c));
      out.push(row);
    }
    return out;
  }

  /** Every formula in the workbook. */
  allFormulas(): FormulaCell[] {
    return this.sheets.flatMap((s) => [...s.formulas.values()]);
  }

  /** The cells a formula's result currently covers (its own cell when blocked or not yet calculated). */
  outputArea(f: FormulaCell): Area {
    const s = this.sheet(f.sheet);
    const key = cellKey(f.row, f.column);
    const res = f.result;
    if (!s || !res || s.blocked.has(key)) return { sheet: f.sheet, top: f.row, left: f.column, bottom: f.row, right: f.column };
    return { sheet: f.sheet, top: f.row, left: f.column, bottom: f.row + res.length - 1, right: f.column + res[0].length - 1 };
  }

  /** Stores a formula's new result; returns true when anything it shows changed. */
  setResult(f: FormulaCell, result: FormulaResult): boolean {
    const old = f.result;
    f.result = result;
    if (this.isTableHeaderCell(f.sheet, f.row, f.column)) this.readsVersion++;
    if (!old || old.length !== result.length || old[0].length !== result[0].length) return true;
    for (let r = 0; r < result.length; r++) for (let c = 0; c < result[r].length; c++) if (!sameValue(old[r][c], result[r][c])) return true;
    return false;
  }

  /**
   * Works out where every formula on a sheet spills, in reading order: a result claims its cells when all of them
   * are empty (no value, no formula, not claimed by an earlier spill), else it shows #SPILL!.
   * Returns the areas whose shown values changed because a spill appeared, moved or vanished.
   */
  layoutSpills(sheetName: string): Area[] {
    const s = this.sheet(sheetName);
    if (!s) return [];
    const before = new Map(s.spilled);
    const beforeBlocked = new Set(s.blocked);
    const spilled = new Map<string, string>();
    const blocked = new Set<string>();
    const ordered = [...s.formulas.values()].sort((a, b) => a.row - b.row || a.column - b.column);
    for (const f of ordered) {
      const res = f.result;
      const anchor = cellKey(f.row, f.column);
      if (!res || (res.length === 1 && res[0].length === 1)) continue;
      const cells: string[] = [];
      let free = true;
      for (let r = 0; r < res.length && free; r++) {
        for (let c = 0; c < res[0].length; c++) {
          if (r === 0 && c === 0) continue;
          const k = cellKey(f.row + r, f.column + c);
          if (s.values.has(k) || s.formulas.has(k) || spilled.has(k)) {
            free = false;
            break;
          }
          cells.push(k);
        }
      }
      if (free) for (const k of cells) spilled.set(k, anchor);
      else blocked.add(anchor);
    }
    if (spilled.size !== before.size || [...spilled.keys()].some((k) => !before.has(k))) s.extent = undefined;
    s.spilled = spilled;
    s.blocked = blocked;
    const changed: Area[] = [];
    const cellArea = (k: string): Area => {
      const [r, c] = splitKey(k);
      return { sheet: s.name, top: r, bottom: r, left: c, right: c };
    };
    for (const [k, a] of before) if (spilled.get(k) !== a) changed.push(cellArea(k));
    for (const [k, a] of spilled) if (before.get(k) !== a) changed.push(cellArea(k));
    for (const k of beforeBlocked) if (!blocked.has(k)) changed.push(cellArea(k));
    for (const k of blocked) if (!beforeBlocked.has(k)) changed.push(cellArea(k));
    return changed;
  }

  /** The areas a formula reads now. */
  readsOf(f: FormulaCell): Area[] {
    const out: Area[] = [];
    for (const r of f.refs) {
      if (r.kind === 'ref') out.push(r.area);
      else {
        const a = this.tableColumnArea(r.table, r.column, r.part);
        // A reference to a missing table or column depends on every table's header row (it may appear there).
        if (isErrorValue(a)) out.push(...this.tables.map((t) => ({ sheet: t.sheet, top: t.top, bottom: t.top, left: t.left, right: t.right })));
        else out.push(a);
      }
    }
    return out;
  }

  /**
   * Formulas that read any of the areas, in the order they were entered. Answered from an index of who reads
   * which columns, so the cost follows the formulas that read there, not every formula of the workbook.
   */
  formulasReading(areas: Area[]): FormulaCell[] {
    const index = this.readersIndex();
    const found = new Map<FormulaCell, number>();
    const consider = (r: Reader, a: Area) => {
      if (!found.has(r.f) && intersects(r.area, a)) found.set(r.f, r.seq);
    };
    for (const a of areas) {
      const bucket = index.bySheet.get(a.sheet.toLowerCase());
      if (!bucket) continue;
      for (const r of bucket.wide) consider(r, a);
      if (a.right - a.left + 1 <= WIDE_READ * 4) {
        for (let c = a.left; c <= a.right; c++) for (const r of bucket.columns.get(c) ?? []) consider(r, a);
      } else {
        for (const list of bucket.columns.values()) for (const r of list) consider(r, a);
      }
    }
    return [...found].sort((p, q) => p[1] - q[1]).map(([f]) => f);
  }

  private readersIndex(): ReadersIndex {
    if (this.readers && this.readers.version === this.readsVersion) return this.readers;
    const bySheet: ReadersIndex['bySheet'] = new Map();
    let seq = 0;
    for (const f of this.allFormulas()) {
      seq++;
      for (const area of this.readsOf(f)) {
        const key = area.sheet.toLowerCase();
        let bucket = bySheet.get(key);
        if (!bucket) bySheet.set(key, (bucket = { columns: new Map(), wide: [] }));
        const reader = { f, area, seq };
        if (area.right - area.left + 1 > WIDE_READ) bucket.wide.push(reader);
        else {
          for (let c = area.left; c <= area.right; c++) {
            const list = bucket.columns.get(c);
            if (list) list.push(reader);
            else bucket.columns.set(c, [reader]);
          }
        }
      }
    }
    this.readers = { version: this.readsVersion, bySheet };
    return this.readers;
  }

  /** Header texts of a table as shown; a blank header reads "Column" + its position, as Excel names it. */
  tableHeaders(t: TableBlock): string[] {
    const out: string[] = [];
    for (let c = t.left; c <= t.right; c++) {
      const text = displayValue(this.value(t.sheet, t.top, c)).text;
      out.push(text === '' ? `Column${c - t.left + 1}` : text);
    }
    return out;
  }

  /** The cells of one table column: its data rows, its header, or both. */
  tableColumnArea(tableName: string, column: string, part: 'data' | 'headers' | 'all' = 'data'): Area | ErrorValue {
    const t = this.table(tableName);
    if (!t) return errorValue('#REF!', `there is no table named ${tableName}`);
    const headers = this.tableHeaders(t);
    let index = headers.indexOf(column);
    if (index < 0) index = headers.findIndex((h) => h.toLowerCase() === column.toLowerCase());
    if (index < 0) return errorValue('#REF!', `table ${t.name} has no column "${column}"`);
    const c = t.left + index;
    const top = part === 'data' ? t.top + 1 : t.top;
    const bottom = part === 'headers' ? t.top : Math.max(t.top + 1, t.bottom);
    return { sheet: t.sheet, top, bottom, left: c, right: c };
  }
}
