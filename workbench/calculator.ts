/**
 * Recalculation: after an edit, the formulas that read the edited cells are evaluated again, then the formulas that
 * read their results, and so on. Formulas run one at a time (the worker answers in order), a formula whose inputs
 * are still waiting on another dirty formula goes after it, and a loop of formulas stops after a few rounds.
 * Calculations queue behind each other so that fast typing never interleaves two of them.
 */
import { Area, intersects } from './a1';
import { errorValue } from './cell-values';
import type { FormulaEvaluator } from './formula-evaluator';
import { FormulaCell, WorkbookModel } from './workbook-model';

/** A formula evaluated more often than this in one recalculation is part of a loop. */
const MAX_ROUNDS_PER_FORMULA = 4;

export class Calculator {
  private queue: Promise<void> = Promise.resolve();
  private running = 0;

  constructor(
    private readonly model: WorkbookModel,
    private readonly evaluator: FormulaEvaluator,
  ) {}

  /** True while any recalculation is queued or running. */
  get busy(): boolean {
    return this.running > 0;
  }

  /** Recalculates what depends on the changed areas (or every formula). Resolves when the results are in. */
  recalc(changed: Area[] | 'all', alsoFormulas: FormulaCell[] = []): Promise<void> {
    this.running++;
    const run = this.queue.then(() => this.run(changed, alsoFormulas));
    this.queue = run.catch(() => undefined).finally(() => {
      this.running--;
    });
    return this.queue;
  }

  private async run(changed: Area[] | 'all', alsoFormulas: FormulaCell[]): Promise<void> {
    const dirty = new Set<FormulaCell>(changed === 'all' ? this.model.allFormulas() : this.model.formulasReading(changed));
    for (const f of alsoFormulas) dirty.add(f);
    const rounds = new Map<FormulaCell, number>();
    while (dirty.size > 0) {
      const f = this.next(dirty);
      dirty.delete(f);
      // The formula may have been overwritten since it was queued.
      const live = this.model.sheet(f.sheet)?.formulas.get(`${f.row}:${f.column}`);
      if (live !== f) continue;
      const n = (rounds.get(f) ?? 0) + 1;
      rounds.set(f, n);
      const before = this.model.outputArea(f);
      let result;
      if (n > MAX_ROUNDS_PER_FORMULA) result = [[errorValue('#CIRC!', 'this formula depends on its own result')]];
      else if (f.node) result = await this.evaluator.evaluate(f.node, { sheet: f.sheet, row: f.row, column: f.column });
      else result = f.result ?? [[errorValue('#NAME?')]];
      const changedValues = this.model.setResult(f, result);
      const spillChanges = this.model.layoutSpills(f.sheet);
      const after = this.model.outputArea(f);
      const touched = changedValues ? [before, after, ...spillChanges] : spillChanges;
      if (touched.length === 0) continue;
      this.model.notify(touched);
      if (n > MAX_ROUNDS_PER_FORMULA) continue;
      // A formula reading its own result would be a circular reference: it is not queued again by itself.
      for (const g of this.model.formulasReading(touched)) if (g !== f) dirty.add(g);
    }
  }

  /** The next formula to evaluate: one that reads no cell another dirty formula is about to write. */
  private next(dirty: Set<FormulaCell>): FormulaCell {
    const list = [...dirty];
    for (const f of list) {
      const reads = this.model.readsOf(f);
      const waits = list.some((g) => g !== f && reads.some((r) => intersects(r, this.model.outputArea(g))));
      if (!waits) return f;
    }
    return list[0];
  }
}
