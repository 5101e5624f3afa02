/**
 * The one way cells change in the workbench, whether the user types or the panel writes: store the entries, re-lay
 * the spills they may block or free, tell listeners (grid, panel) what changed, and recalculate what depends on it.
 */
import { Area } from './a1';
import type { Calculator } from './calculator';
import { FormulaCell, WorkbookModel } from './workbook-model';

export type TypedCell = string | number | boolean | null;

/** One cell's entry before or after a change, for undo and redo. */
interface CellEntry {
  row: number;
  column: number;
  typed: TypedCell;
}

/** One undoable change: the entries it replaced on one sheet. */
interface Step {
  sheet: string;
  entries: CellEntry[];
}

/** How many changes can be undone. */
const HISTORY = 100;

export class WorkbookEditor {
  private readonly undoSteps: Step[] = [];
  private readonly redoSteps: Step[] = [];

  constructor(
    readonly model: WorkbookModel,
    private readonly calculator: Calculator,
  ) {}

  /** Writes a block of entries with its top-left cell at (top, left); resolves when dependent formulas are done. */
  write(sheet: string, top: number, left: number, cells: TypedCell[][]): Promise<void> {
    const before: CellEntry[] = [];
    cells.forEach((row, r) => row.forEach((_, c) => before.push({ row: top + r, column: left + c, typed: this.model.typedEntry(sheet, top + r, left + c) })));
    this.remember({ sheet, entries: before });
    return this.writeBlock(sheet, top, left, cells);
  }

  /** Undoes the last change (typing, Delete, a paste-like write from the panel); false when there is none. */
  async undo(): Promise<boolean> {
    return this.replay(this.undoSteps, this.redoSteps);
  }

  /** Redoes the last undone change; false when there is none. */
  async redo(): Promise<boolean> {
    return this.replay(this.redoSteps, this.undoSteps);
  }

  private remember(step: Step): void {
    if (step.entries.length === 0) return;
    this.undoSteps.push(step);
    if (this.undoSteps.length > HISTORY) this.undoSteps.shift();
    this.redoSteps.length = 0;
  }

  /** Puts back the entries of the last step of `from`, recording what they replace on `to`. */
  private async replay(from: Step[], to: Step[]): Promise<boolean> {
    const step = from.pop();
    if (!step) return false;
    to.push({ sheet: step.sheet, entries: step.entries.map((e) => ({ row: e.row, column: e.column, typed: this.model.typedEntry(step.sheet, e.row, e.column) })) });
    const formulas: FormulaCell[] = [];
    let top = Infinity;
    let bottom = -Infinity;
    let left = Infinity;
    let right = -Infinity;
    for (const e of step.entries) {
      const f = this.model.setEntry(step.sheet, e.row, e.column, e.typed);
      if (f) formulas.push(f);
      top = Math.min(top, e.row);
      bottom = Math.max(bottom, e.row);
      left = Math.min(left, e.column);
      right = Math.max(right, e.column);
    }
    const name = this.model.sheet(step.sheet)?.name ?? step.sheet;
    const area: Area = { sheet: name, top, left, bottom, right };
    const changed = [area, ...this.model.layoutSpills(name)];
    this.model.notify(changed);
    await this.calculator.recalc(changed, formulas);
    return true;
  }

  private writeBlock(sheet: string, top: number, left: number, cells: TypedCell[][]): Promise<void> {
    const formulas: FormulaCell[] = [];
    let width = 0;
    cells.forEach((row, r) => {
      width = Math.max(width, row.length);
      row.forEach((typed, c) => {
        const f = this.model.setEntry(sheet, top + r, left + c, typed);
        if (f) formulas.push(f);
      });
    });
    if (cells.length === 0 || width === 0) return Promise.resolve();
    const name = this.model.sheet(sheet)?.name ?? sheet;
    const area: Area = { sheet: name, top, left, bottom: top + cells.length - 1, right: left + width - 1 };
    const changed = [area, ...this.model.layoutSpills(name)];
    this.model.notify(changed);
    return this.calculator.recalc(changed, formulas);
  }

  /** Clears an area (Delete on a selection), visiting only the cells that hold something; resolves when the
   *  formulas that read it are done. */
  clear(area: Area): Promise<void> {
    const name = this.model.sheet(area.sheet)?.name ?? area.sheet;
    const cut: Area = { ...area, sheet: name };
    const before = this.model.storedIn(cut).map((p) => ({ ...p, typed: this.model.typedEntry(name, p.row, p.column) }));
    if (!this.model.clearArea(cut)) return Promise.resolve();
    this.remember({ sheet: name, entries: before });
    const changed = [cut, ...this.model.layoutSpills(name)];
    this.model.notify(changed);
    return this.calculator.recalc(changed);
  }

  /** Recalculates every formula (used once the function host is ready). */
  recalcAll(): Promise<void> {
    return this.calculator.recalc('all');
  }

  get busy(): boolean {
    return this.calculator.busy;
  }
}
