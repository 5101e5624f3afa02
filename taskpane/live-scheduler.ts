/**
 * Turns a stream of "something may have changed" calls into few refreshes: no redraw storm while someone types
 * or pastes, and no waiting after a single edit.
 *
 * - The first change after a quiet spell refreshes at once (leading edge), so one edit is answered without a
 *   debounce delay.
 * - Changes that arrive while a refresh runs, or within `gapMs` after one started, are merged into one trailing
 *   refresh that starts `gapMs` after the previous one started.
 * - Refreshes never overlap: the next waits for the running one to finish.
 *
 * Pure apart from the injected clock and timer, so it is unit-tested with fake timers.
 */
export interface SchedulerClock {
  now(): number;
  setTimeout(fn: () => void, ms: number): unknown;
  clearTimeout(handle: unknown): void;
}

const realClock: SchedulerClock = {
  now: () => (typeof performance !== 'undefined' ? performance.now() : Date.now()),
  setTimeout: (fn, ms) => setTimeout(fn, ms),
  clearTimeout: (h) => clearTimeout(h as ReturnType<typeof setTimeout>),
};

/** What a refresh is told: when the oldest change it answers arrived (for measuring latency). */
export interface RefreshCause {
  firstChangeAt: number;
  /** How many change calls were merged into this refresh. */
  merged: number;
}

export class LiveScheduler {
  private running = false;
  private pending = false;
  private firstPendingAt = 0;
  private mergedCount = 0;
  private lastStart = -Infinity;
  private timer: unknown = null;
  private stopped = false;

  constructor(
    private readonly refresh: (cause: RefreshCause) => Promise<void>,
    private readonly gapMs = 200,
    private readonly clock: SchedulerClock = realClock,
  ) {}

  /** Call on every change notification; cheap and safe to call thousands of times. */
  changed(): void {
    if (this.stopped) return;
    this.note();
    this.plan();
  }

  /** Refresh now unless one is running (then right after it), ignoring the gap: for user actions. */
  now(): void {
    if (this.stopped) return;
    this.note();
    this.lastStart = -Infinity;
    this.plan();
  }

  /** Counts one more change into the refresh owed, starting its clock when none was owed. */
  private note(): void {
    if (!this.pending) {
      this.pending = true;
      this.firstPendingAt = this.clock.now();
      this.mergedCount = 0;
    }
    this.mergedCount++;
  }

  /** True when no refresh is running, waiting for its turn, or owed to a change. */
  get idle(): boolean {
    return !this.running && !this.pending && this.timer === null;
  }

  /** Stops all future refreshes. */
  stop(): void {
    this.stopped = true;
    if (this.timer !== null) this.clock.clearTimeout(this.timer);
    this.timer = null;
  }

  private plan(): void {
    if (this.running || this.timer !== null || !this.pending) return;
    const wait = Math.max(0, this.lastStart + this.gapMs - this.clock.now());
    if (wait === 0) {
      void this.start();
      return;
    }
    this.timer = this.clock.setTimeout(() => {
      this.timer = null;
      void this.start();
    }, wait);
  }

  private async start(): Promise<void> {
    if (this.stopped || this.running || !this.pending) return;
    const cause: RefreshCause = { firstChangeAt: this.firstPendingAt, merged: this.mergedCount };
    this.pending = false;
    this.running = true;
    this.lastStart = this.clock.now();
    try {
      await this.refresh(cause);
    } finally {
      this.running = false;
      this.plan();
    }
  }
}
