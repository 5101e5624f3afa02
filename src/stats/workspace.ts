/**
 * Work arrays that code outside the core borrows for one job from the core's pool (internal/scratch.ts) and hands
 * back together with release(). The pool stays private to the core: the cell functions' reading of a million-row
 * column fills a column it got here (its pages already mapped, and no new external memory for the collector to
 * answer with a full collection), and whoever holds the Workspace releases it when the job is done.
 */
import { borrowF64, clearScratch, giveBack, scratchStats } from './internal/scratch';

export class Workspace {
  private readonly lent: ArrayBufferView[] = [];

  /** A Float64Array of n elements with unspecified contents: the borrower writes every element before reading it. */
  readonly float64 = (n: number): Float64Array => {
    const a = borrowF64(n);
    this.lent.push(a);
    return a;
  };

  /** Buffers and bytes the pool holds between calls (tests and the memory checks). */
  static poolStats(): { buffers: number; bytes: number } {
    return scratchStats();
  }

  /** Empties the pool (tests). */
  static clearPool(): void {
    clearScratch();
  }

  /** Hands every array lent back to the pool; none of them may be read or written afterwards. */
  release(): void {
    giveBack(...this.lent);
    this.lent.length = 0;
  }
}
