/** The refresh scheduler, on a hand-driven clock: timing rules only, so the checks are about order and counts. */
import { LiveScheduler, RefreshCause, SchedulerClock } from '../../../taskpane/live-scheduler';

class ManualClock implements SchedulerClock {
  t = 0;
  private timers: { at: number; fn: () => void; id: number }[] = [];
  private next = 1;
  now(): number {
    return this.t;
  }
  setTimeout(fn: () => void, ms: number): unknown {
    const id = this.next++;
    this.timers.push({ at: this.t + ms, fn, id });
    return id;
  }
  clearTimeout(h: unknown): void {
    this.timers = this.timers.filter((x) => x.id !== h);
  }
  async advance(ms: number): Promise<void> {
    const end = this.t + ms;
    for (;;) {
      this.timers.sort((a, b) => a.at - b.at);
      const due = this.timers[0];
      if (!due || due.at > end) break;
      this.timers.shift();
      this.t = due.at;
      due.fn();
      await flush();
    }
    this.t = end;
    await flush();
  }
}

const flush = async (): Promise<void> => {
  for (let i = 0; i < 5; i++) await Promise.resolve();
};

function setup(workMs = 0): { clock: ManualClock; s: LiveScheduler; calls: RefreshCause[]; finishers: (() => void)[] } {
  const clock = new ManualClock();
  const calls: RefreshCause[] = [];
  const finishers: (() => void)[] = [];
  const s = new LiveScheduler(
    (cause) => {
      calls.push(cause);
      if (workMs === 0) return Promise.resolve();
      return new Promise<void>((resolve) => finishers.push(resolve));
    },
    200,
    clock,
  );
  return { clock, s, calls, finishers };
}

describe('LiveScheduler', () => {
  test('a single change after a quiet spell refreshes at once', async () => {
    const { clock, s, calls } = setup();
    clock.t = 1000;
    s.changed();
    await flush();
    expect(calls).toHaveLength(1);
    expect(calls[0].firstChangeAt).toBe(1000);
  });

  test('a burst of changes gives one immediate and one trailing refresh', async () => {
    const { clock, s, calls } = setup();
    clock.t = 1000;
    for (let i = 0; i < 50; i++) {
      s.changed();
      await clock.advance(2);
    }
    await clock.advance(500);
    expect(calls).toHaveLength(2);
    expect(calls[1].merged).toBe(49);
    expect(calls[1].firstChangeAt).toBe(1002);
  });

  test('typing for two seconds refreshes about every gap, never faster', async () => {
    const { clock, s, calls } = setup();
    const starts: number[] = [];
    const orig = calls.push.bind(calls);
    calls.push = (...c: RefreshCause[]) => {
      starts.push(clock.now());
      return orig(...c);
    };
    for (let i = 0; i < 100; i++) {
      s.changed();
      await clock.advance(20);
    }
    await clock.advance(500);
    expect(calls.length).toBeGreaterThanOrEqual(9);
    expect(calls.length).toBeLessThanOrEqual(12);
    for (let i = 1; i < starts.length; i++) expect(starts[i] - starts[i - 1]).toBeGreaterThanOrEqual(200);
  });

  test('refreshes never overlap: changes during a slow refresh wait for it', async () => {
    const { clock, s, calls, finishers } = setup(1);
    s.changed();
    await flush();
    s.changed();
    s.changed();
    await clock.advance(1000);
    expect(calls).toHaveLength(1);
    finishers[0]();
    await flush();
    await clock.advance(0);
    expect(calls).toHaveLength(2);
    expect(s.idle).toBe(false);
    finishers[1]();
    await flush();
    expect(s.idle).toBe(true);
  });

  test('now() skips the gap; stop() ends everything', async () => {
    const { clock, s, calls } = setup();
    s.changed();
    await flush();
    s.now();
    await flush();
    expect(calls).toHaveLength(2);
    s.changed();
    s.stop();
    await clock.advance(1000);
    expect(calls).toHaveLength(2);
  });
});
