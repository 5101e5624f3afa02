import { coMoments, CoMoments } from './comoments';
import { Codes, countingRanks, MAX_CODE_SPAN, smallSpanCodes } from './codes';
import { kendallCounts, KendallCounts, kendallFromTable } from './kendall';
import { averageRanks, rankCoMoments } from './ranks';
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
  /** Memos handed in by their owner (see seed): release() leaves them alone. */
  private readonly seeded = new Set<string>();

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

  /**
   * Hands in a value computed elsewhere for `key` (the panel's sorted order of a column that an edit left
   * unchanged): it must be what the memo's own computation would give for these columns. The caller keeps
   * owning it: release() neither gives it back nor lets it be reused.
   */
  seed(key: 'sortedX' | 'ranksX' | 'sortedY' | 'ranksY', value: KeyedOrder | Float64Array): void {
    this.memos.set(key, value);
    this.seeded.add(key);
  }

  /**
   * Takes a computed memo out of release()'s reach, for a caller that keeps it past this object (to seed the next
   * one); undefined when it was never computed.
   */
  keep(key: 'sortedX' | 'ranksX' | 'sortedY' | 'ranksY'): KeyedOrder | Float64Array | undefined {
    const v = this.memos.get(key) as KeyedOrder | Float64Array | undefined;
    if (v !== undefined) this.seeded.add(key);
    return v;
  }

  get moments(): CoMoments {
    return this.memo('moments', () => coMoments(this.x, this.y));
  }

  /** x as integer codes when it is a decimal column of at most MAX_CODE_SPAN + 1 codes (codes.ts), else null. */
  get codesX(): Codes | null {
    return this.memo('codesX', () => this.adoptCodes(smallSpanCodes(this.x, MAX_CODE_SPAN)));
  }

  get codesY(): Codes | null {
    return this.memo('codesY', () => this.adoptCodes(smallSpanCodes(this.y, MAX_CODE_SPAN)));
  }

  /** x's sorted order, shared by Spearman's ranks and the robust coefficients' sorted columns. */
  get sortedX(): KeyedOrder {
    return this.memo('sortedX', () => argsortKeyed(this.x, undefined, this.codesX));
  }

  /** Mid-ranks of x: counted from its codes when they are few enough for that to beat a sort, else sorted. */
  get ranksX(): Float64Array {
    return this.memo('ranksX', () => this.ranksOf(this.x, 'sortedX', () => this.codesX, () => this.sortedX));
  }

  /** y's sorted order, shared by Spearman's ranks and Kendall's counts. */
  get sortedY(): KeyedOrder {
    return this.memo('sortedY', () => argsortKeyed(this.y, undefined, this.codesY));
  }

  get ranksY(): Float64Array {
    return this.memo('ranksY', () => this.ranksOf(this.y, 'sortedY', () => this.codesY, () => this.sortedY));
  }

  private ranksOf(v: Float64Array, sortKey: 'sortedX' | 'sortedY', codes: () => Codes | null, sorted: () => KeyedOrder): Float64Array {
    // A sort already made (or seeded) costs nothing more; a frequency table of up to 2n + 1024 codes costs less
    // than making one.
    if (!this.memos.has(sortKey)) {
      const c = codes();
      if (c && c.span <= 2 * v.length + 1024) return countingRanks(c);
    }
    return averageRanks(v, sorted());
  }

  private adoptCodes(c: Codes | null): Codes | null {
    if (c) this.adopted.push(c.codes);
    return c;
  }

  get rankMoments(): CoMoments {
    return this.memo('rankMoments', () => rankCoMoments(this.ranksX, this.ranksY));
  }

  get kendall(): KendallCounts {
    return this.memo('kendall', () => {
      const cx = this.codesX;
      const cy = this.codesY;
      return (cx && cy && kendallFromTable(cx, cy)) ||
        kendallCounts(this.x, this.y, { sortedX: () => this.sortedX, sortedY: () => this.sortedY, codesY: cy });
    });
  }

  get fit(): LineFit {
    return this.memo('fit', () => fitLine(this.x, this.y));
  }

  /**
   * Hands the sorted orders and ranks back to the scratch pool (see scratch.ts) and forgets every memo. Only for
   * an owner that knows nothing else still reads them (the cell functions' cache, on eviction).
   */
  release(): void {
    const own = (key: string) => (this.seeded.has(key) ? undefined : this.memos.get(key));
    for (const key of ['sortedX', 'sortedY']) {
      const sorted = own(key) as KeyedOrder | undefined;
      if (sorted) releaseKeyedOrder(sorted);
    }
    const fit = this.memos.get('fit') as LineFit | undefined;
    giveBack(own('ranksX') as Float64Array | undefined, own('ranksY') as Float64Array | undefined);
    if (fit) giveBack(fit.fitted, fit.residuals);
    giveBack(...this.adopted);
    this.adopted.length = 0;
    this.seeded.clear();
    this.memos.clear();
  }

  /** Marks arrays of a memoised value (e.g. a check report's per-point columns) as given back on release(). */
  adopt(...arrays: ArrayBufferView[]): void {
    this.adopted.push(...arrays);
  }
}
