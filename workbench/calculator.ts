/**
 * Recalculation: after an edit, the formulas that read the edited cells are evaluated again, then the formulas that
 * read their results, and so on. The work is planned once per edit: the formulas downstream of the change are
 * gathered through the model's index of who reads what, put in dependency order (Kahn 1962, "Topological sorting
 * of large networks", Communications of the ACM 5(11)), and any that read their own result, directly or round a
 * loop (found as strongly connected components: Tarjan 1972, "Depth-first search and linear graph algorithms",
 * SIAM Journal on Computing 1(2)), show #CIRC! instead of being evaluated. So an edit costs work in proportion to
 * the formulas that depend on it. Formulas run one at a time (the worker answers in order); calculations queue
 * behind each other so that fast typing never interleaves two of them. A spill that grows onto cells another
 * formula reads sends that formula round again, a few times at most.
 */
import { Area, formatArea } from './a1';
import { errorValue } from './cell-values';
import type { FormulaEvaluator, FormulaResult } from './formula-evaluator';
import { FormulaCell, WorkbookModel } from './workbook-model';

/** A formula evaluated more often than this in one recalculation is part of a loop. */
const MAX_ROUNDS_PER_FORMULA = 4;

/** The plan of one recalculation: formulas in dependency order, and those caught in a circular reference. */
export interface RecalcPlan {
  order: FormulaCell[];
  circular: Map<FormulaCell, string>;
}

export class Calculator {
  private queue: Promise<void> = Promise.resolve();
  private running = 0;
  /** Formulas evaluated since the calculator was made (for tests of how much work an edit costs). */
  evaluations = 0;

  constructor(
    private readonly model: WorkbookModel,
    private readonly evaluator: Pick<FormulaEvaluator, 'evaluate'>,
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

  /**
   * Plans a recalculation: every formula downstream of the start set, in an order where each comes after the
   * formulas whose results it reads; formulas on a loop are set apart with the reason.
   */
  plan(start: Iterable<FormulaCell>): RecalcPlan {
    const nodes: FormulaCell[] = [];
    const seen = new Set<FormulaCell>();
    const readers = new Map<FormulaCell, FormulaCell[]>();
    for (const f of start) {
      if (seen.has(f)) continue;
      seen.add(f);
      nodes.push(f);
    }
    for (let i = 0; i < nodes.length; i++) {
      const f = nodes[i];
      const next = this.model.formulasReading([this.model.outputArea(f)]);
      readers.set(f, next);
      for (const g of next) {
        if (!seen.has(g)) {
          seen.add(g);
          nodes.push(g);
        }
      }
    }
    const circular = this.loops(nodes, readers);
    // Kahn's order over the formulas not on a loop (a loop's readers still come after it).
    const indegree = new Map<FormulaCell, number>();
    for (const f of nodes) indegree.set(f, 0);
    for (const f of nodes) {
      if (circular.has(f)) continue;
      for (const g of readers.get(f) ?? []) if (g !== f) indegree.set(g, (indegree.get(g) ?? 0) + 1);
    }
    const order: FormulaCell[] = [];
    const ready = nodes.filter((f) => !circular.has(f) && indegree.get(f) === 0);
    for (let i = 0; i < ready.length; i++) {
      const f = ready[i];
      order.push(f);
      for (const g of readers.get(f) ?? []) {
        if (g === f || circular.has(g)) continue;
        const d = (indegree.get(g) ?? 0) - 1;
        indegree.set(g, d);
        if (d === 0) ready.push(g);
      }
    }
    return { order, circular };
  }

  /** Formulas on a loop (Tarjan's strongly connected components, written without recursion), each with why. */
  private loops(nodes: FormulaCell[], readers: Map<FormulaCell, FormulaCell[]>): Map<FormulaCell, string> {
    const index = new Map<FormulaCell, number>();
    const low = new Map<FormulaCell, number>();
    const onStack = new Set<FormulaCell>();
    const stack: FormulaCell[] = [];
    const out = new Map<FormulaCell, string>();
    let counter = 0;
    for (const root of nodes) {
      if (index.has(root)) continue;
      const work: { f: FormulaCell; i: number }[] = [{ f: root, i: 0 }];
      index.set(root, counter);
      low.set(root, counter++);
      stack.push(root);
      onStack.add(root);
      while (work.length > 0) {
        const top = work[work.length - 1];
        const next = readers.get(top.f) ?? [];
        if (top.i < next.length) {
          const g = next[top.i++];
          if (!index.has(g)) {
            index.set(g, counter);
            low.set(g, counter++);
            stack.push(g);
            onStack.add(g);
            work.push({ f: g, i: 0 });
          } else if (onStack.has(g)) {
            low.set(top.f, Math.min(low.get(top.f) ?? 0, index.get(g) ?? 0));
          }
          continue;
        }
        work.pop();
        if (work.length > 0) {
          const parent = work[work.length - 1].f;
          low.set(parent, Math.min(low.get(parent) ?? 0, low.get(top.f) ?? 0));
        }
        if (low.get(top.f) !== index.get(top.f)) continue;
        const component: FormulaCell[] = [];
        for (;;) {
          const g = stack.pop() as FormulaCell;
          onStack.delete(g);
          component.push(g);
          if (g === top.f) break;
        }
        if (component.length > 1) {
          component.sort((a, b) => a.sheet.localeCompare(b.sheet) || a.row - b.row || a.column - b.column);
          const names = component.map((g) => formatArea({ sheet: g.sheet, top: g.row, bottom: g.row, left: g.column, right: g.column }));
          for (const g of component) {
            out.set(g, `circular reference: ${names.length === 2 ? 'this formula and the other one read each other' : `${names.length} formulas read each other round a loop`} (${names.join(', ')}); point one of them at other cells`);
          }
        } else if ((readers.get(top.f) ?? []).includes(top.f)) {
          const own = formatArea({ sheet: top.f.sheet, top: top.f.row, bottom: top.f.row, left: top.f.column, right: top.f.column }, false);
          out.set(top.f, `circular reference: this formula reads its own cell (${own}); point it at cells outside it`);
        }
      }
    }
    return out;
  }

  private async run(changed: Area[] | 'all', alsoFormulas: FormulaCell[]): Promise<void> {
    const start = new Set<FormulaCell>(changed === 'all' ? this.model.allFormulas() : this.model.formulasReading(changed));
    for (const f of alsoFormulas) start.add(f);
    const { order, circular } = this.plan(start);

    for (const [f, why] of circular) this.store(f, [[errorValue('#CIRC!', why)]]);
    const pending = [...order];
    const queued = new Set<FormulaCell>(pending);
    const rounds = new Map<FormulaCell, number>();
    for (let i = 0; i < pending.length; i++) {
      const f = pending[i];
      queued.delete(f);
      // The formula may have been overwritten since it was queued.
      const live = this.model.sheet(f.sheet)?.formulas.get(`${f.row}:${f.column}`);
      if (live !== f) continue;
      const n = (rounds.get(f) ?? 0) + 1;
      rounds.set(f, n);
      let result: FormulaResult;
      if (n > MAX_ROUNDS_PER_FORMULA) result = [[errorValue('#CIRC!', 'circular reference: this formula depends on its own result through a spilled range')]];
      else if (f.node) {
        this.evaluations++;
        result = await this.evaluator.evaluate(f.node, { sheet: f.sheet, row: f.row, column: f.column });
      } else result = f.result ?? [[errorValue('#NAME?')]];
      const touched = this.store(f, result);
      if (touched.length === 0 || n > MAX_ROUNDS_PER_FORMULA) continue;
      // Readers still waiting will see the new values. Others read what changed after they ran, or were not in
      // the plan (a spill grew onto their cells): they go (round again) at the end of the queue.
      for (const g of this.model.formulasReading(touched)) {
        if (g === f || circular.has(g) || queued.has(g)) continue;
        pending.push(g);
        queued.add(g);
      }
    }
  }

  /** Stores a result; re-lays the sheet's spills only when the result's shape changed. Returns the areas whose
   *  shown values changed (already announced to listeners). */
  private store(f: FormulaCell, result: FormulaResult): Area[] {
    const before = this.model.outputArea(f);
    const oldShape = f.result ? `${f.result.length}x${f.result[0].length}` : '1x1';
    const changedValues = this.model.setResult(f, result);
    const newShape = `${result.length}x${result[0].length}`;
    const spillChanges = oldShape !== newShape ? this.model.layoutSpills(f.sheet) : [];
    const after = this.model.outputArea(f);
    const touched = changedValues ? [before, after, ...spillChanges] : spillChanges;
    this.model.notify(touched);
    return touched;
  }
}
