/**
 * Engine tuning, in one place: the panel's work is the same few functions run on large arrays, and the script
 * engine compiles them for speed only after seeing them run. Two measures (measured reasons in warmUpRound's note,
 * taskpane/relationship.ts):
 * - priming, once before the first analysis of a large sheet: three rounds of the analysis on PRIME_ROWS invented
 *   rows and the pairing of the sheet's first PRIME_ROWS rows, so that every step has run once, start to end,
 *   before the engine optimises it during the first long call (about 40 ms, once);
 * - warm-up, after the first large redraw, while the page is idle: six rounds on invented data, which vary the
 *   kinds of numbers, then four on the sheet's own columns, paired and analysed as the next edit will be. One round
 *   per idle slot; a round waits while a refresh runs.
 * Nothing depends on either: a failure in a round is ignored and the panel works the same without them.
 */
import { onIdle } from './dom';
import { pairColumns } from './pairs';
import { analyseRelationship, RedrawMemory, RelationshipOptions, WARM_UP_ROWS, warmUpRound } from './relationship';
import type { NumericColumnRead } from './workbook';

const PRIME_ROWS = 6000;
const INVENTED_ROUNDS = 6;
const WARM_UP_ROUNDS = INVENTED_ROUNDS + 4;

/** What the warm-up needs to know of the panel at the moment it runs. */
export interface WarmUpHost {
  options(): RelationshipOptions;
  /** The sheet's columns as last read, or null. */
  reads(): [NumericColumnRead, NumericColumnRead] | null;
  /** True while a refresh runs or waits: a round then waits its turn. */
  busy(): boolean;
  /** The memory the panel's redraws reuse. */
  memory: RedrawMemory;
}

export class EngineWarmUp {
  private primed = false;
  private warmed = false;
  private running = false;
  private stopped = false;

  constructor(private readonly host: WarmUpHost) {}

  /** True while warm-up rounds are still owed. */
  get warming(): boolean {
    return this.running;
  }

  /** Primes before the first analysis of `rows` rows on this thread (only once, and only for large sheets). */
  primeFor(reads: [NumericColumnRead, NumericColumnRead], rows: number): boolean {
    if (this.primed || rows < WARM_UP_ROWS) return false;
    this.primed = true;
    const head = (c: NumericColumnRead): NumericColumnRead => ({ ...c, numbers: c.numbers.subarray(0, PRIME_ROWS) });
    try {
      for (let round = 0; round < 3; round++) {
        warmUpRound(round, this.host.options(), PRIME_ROWS);
        pairColumns(head(reads[0]), head(reads[1]));
      }
    } catch {
      // Nothing depends on priming.
    }
    return true;
  }

  /** After a redraw of `rows` rows on this thread: starts the idle rounds once, for large sheets. */
  afterRedraw(rows: number): void {
    if (this.warmed || rows < WARM_UP_ROWS) return;
    this.warmed = true;
    this.round(0);
  }

  stop(): void {
    this.stopped = true;
    this.running = false;
  }

  private round(k: number): void {
    this.running = !this.stopped && k < WARM_UP_ROUNDS;
    if (!this.running) return;
    onIdle(() => {
      if (this.stopped) return;
      if (this.host.busy()) {
        this.round(k);
        return;
      }
      try {
        const reads = this.host.reads();
        if (k < INVENTED_ROUNDS) warmUpRound(k, this.host.options());
        else if (reads) analyseRelationship(pairColumns(reads[0], reads[1]), this.host.options(), this.host.memory);
      } catch {
        // Nothing depends on a warm-up round.
      }
      this.round(k + 1);
    });
  }
}
