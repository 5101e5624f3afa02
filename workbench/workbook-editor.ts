/**
 * The one way cells change in the workbench, whether the user types or the panel writes: store the entries, re-lay
 * the spills they may block or free, tell listeners (grid, panel) what changed, and recalculate what depends on it.
 */
import { Area } from './a1';
import type { Calculator } from './calculator';
import { FormulaCell, WorkbookModel } from './workbook-model';

export type TypedCell = string | number | boolean | null;

export class WorkbookEditor {
  constructor(
    readonly model: WorkbookModel,
    private readonly calculator: Calculator,
  ) {}

  /** Writes a block of entries with its top-left cell at (top, left); resolves when dependent formulas are done. */
  write(sheet: string, top: number, left: number, cells: TypedCell[][]): Promise<void> {
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
    if (!this.model.clearArea(cut)) return Promise.resolve();
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
