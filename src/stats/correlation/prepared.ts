import { coMoments, CoMoments } from './comoments';
import { kendallCounts, KendallCounts } from './kendall';
import { averageRanks } from './ranks';
import { fitLine, LineFit } from './regression';
import { giveBack } from '../internal/scratch';
import { argsortKeyed, KeyedOrder, releaseKeyedOrder } from '../internal/sort';

/**
 * Two paired columns with the expensive intermediate results computed once, on first use: co-moments, ranks,
 * Kendall's counts, the line fit, and anything else a caller memoises by key (the check report, say). Every cell
 * function looking at the same cells shares one of these through the content cache (src/functions/shared-pairs.ts),
 * so sorting a million rows happens once per recalculation, not once per function; the panel makes one per redraw
 * and releases it when the view is built.
 */
export class PreparedPairs {
  readonly x: Float64Array;
  readonly y: Float64Array;
  private readonly memos = new Map<string, unknown>();
  /** Arrays inside memoised values that release() may give back (see adopt). */
  private readonly adopted: ArrayBufferView[] = [];

  constructor(x: ArrayLike<number>, y: ArrayLike<number>) {
    this.x = x instanceof Float64Array ? x : Float64Array.from(x);
    this.y = y instanceof Float64Array ? y : Float64Array.from(y);
  }

  get n(): number {
    return this.x.length;
  }

  /** Memoised value for `key`; `compute` runs at most once per key (unless it throws). */
  memo<T>(key: string, compute: () => T): T {
    if (this.memos.has(key)) return this.memos.get(key) as T;
    const v = compute();
    this.memos.set(key, v);
    return v;
  }

  get moments(): CoMoments {
    return this.memo('moments', () => coMoments(this.x, this.y));
  }

  /** x's sorted order, shared by Spearman's ranks and the robust coefficients' sorted columns. */
  get sortedX(): KeyedOrder {
    return this.memo('sortedX', () => argsortKeyed(this.x));
  }

  get ranksX(): Float64Array {
    return this.memo('ranksX', () => averageRanks(this.x, this.sortedX.order));
  }

  /** y's sorted order, shared by Spearman's ranks and Kendall's counts. */
  get sortedY(): KeyedOrder {
    return this.memo('sortedY', () => argsortKeyed(this.y));
  }

  get ranksY(): Float64Array {
    return this.memo('ranksY', () => averageRanks(this.y, this.sortedY.order));
  }

  get rankMoments(): CoMoments {
    return this.memo('rankMoments', () => coMoments(this.ranksX, this.ranksY));
  }

  get kendall(): KendallCounts {
    return this.memo('kendall', () => kendallCounts(this.x, this.y, this.sortedY));
  }

  get fit(): LineFit {
    return this.memo('fit', () => fitLine(this.x, this.y));
  }

  /**
   * Hands the sorted orders and ranks back to the scratch pool (see scratch.ts) and forgets every memo. Only for
   * an owner that knows nothing else still reads them (the cell functions' cache, on eviction).
   */
  release(): void {
    for (const key of ['sortedX', 'sortedY']) {
      const sorted = this.memos.get(key) as KeyedOrder | undefined;
      if (sorted) releaseKeyedOrder(sorted);
    }
    const fit = this.memos.get('fit') as LineFit | undefined;
    giveBack(this.memos.get('ranksX') as Float64Array | undefined, this.memos.get('ranksY') as Float64Array | undefined);
    if (fit) giveBack(fit.fitted, fit.residuals);
    giveBack(...this.adopted);
    this.adopted.length = 0;
    this.memos.clear();
  }

  /** Marks arrays of a memoised value (e.g. a check report's per-point columns) as given back on release(). */
  adopt(...arrays: ArrayBufferView[]): void {
    this.adopted.push(...arrays);
  }
}
