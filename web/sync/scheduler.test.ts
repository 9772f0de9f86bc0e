/**
 * The sync scheduler against hand-driven surroundings: time moves only when the test says, the
 * network goes away and comes back when the test says.
 */
import { describe, expect, it } from 'vitest';
import {
  createScheduler,
  DEFAULT_POLICY,
  type RoundVerdict,
  retryDelay,
  type SchedulerEnv,
} from './scheduler.ts';

function bench() {
  let clock = 0;
  let online = true;
  const timers: { at: number; fn: () => void }[] = [];
  const onlineListeners = new Set<() => void>();
  const env: SchedulerEnv = {
    setTimer(fn, ms) {
      const t = { at: clock + ms, fn };
      timers.push(t);
      return () => {
        const i = timers.indexOf(t);
        if (i >= 0) timers.splice(i, 1);
      };
    },
    isOnline: () => online,
    onOnline(fn) {
      onlineListeners.add(fn);
      return () => onlineListeners.delete(fn);
    },
    random: () => 1, // no jitter: the plain delays
  };
  const settle = () => new Promise((r) => setTimeout(r, 0));
  return {
    env,
    /** Moves time to the next timer and fires it; returns how long that was. */
    async next(): Promise<number | null> {
      timers.sort((a, b) => a.at - b.at);
      const t = timers.shift();
      if (!t) return null;
      const waited = t.at - clock;
      clock = t.at;
      t.fn();
      await settle();
      return waited;
    },
    pending: () => timers.length,
    async goOffline() {
      online = false;
    },
    async comeOnline() {
      online = true;
      for (const l of onlineListeners) l();
      await settle();
    },
    settle,
  };
}

describe('sync scheduler', () => {
  it('backs off after failures, doubling from the first retry up to the cap', () => {
    const delays = [1, 2, 3, 4, 5, 6, 7, 8].map((n) => retryDelay(n, DEFAULT_POLICY, 1));
    expect(delays).toEqual([15_000, 30_000, 60_000, 120_000, 240_000, 480_000, 900_000, 900_000]);
    expect(retryDelay(1, DEFAULT_POLICY, 0)).toBe(7_500);
  });

  it('runs at start, retries with backoff, and returns to the steady timer after a success', async () => {
    const b = bench();
    const verdicts: RoundVerdict[] = ['retry', 'retry', 'retry', 'done', 'done'];
    let rounds = 0;
    const s = createScheduler(async () => verdicts[rounds++] ?? 'done', b.env);
    s.start();
    await b.settle();
    const waits = [await b.next(), await b.next(), await b.next(), await b.next()];
    expect(waits).toEqual([15_000, 30_000, 60_000, DEFAULT_POLICY.everyMs]);
    expect(rounds).toBe(5);
    s.stop();
    expect(b.pending()).toBe(0);
  });

  it('waits for the network instead of failing while offline, and runs when it returns', async () => {
    const b = bench();
    let rounds = 0;
    const s = createScheduler(async () => {
      rounds += 1;
      return 'done';
    }, b.env);
    await b.goOffline();
    s.start();
    await b.settle();
    expect(rounds).toBe(0);
    expect(b.pending()).toBe(0);
    await b.comeOnline();
    expect(rounds).toBe(1);
    s.stop();
  });

  it('never runs two rounds at once: triggers during a round make one more round after it', async () => {
    const b = bench();
    let inFlight = 0;
    let most = 0;
    let rounds = 0;
    let release: () => void = () => {};
    const s = createScheduler(async () => {
      inFlight += 1;
      most = Math.max(most, inFlight);
      rounds += 1;
      await new Promise<void>((r) => {
        release = r;
      });
      inFlight -= 1;
      return 'done';
    }, b.env);
    s.start();
    await b.settle();
    const a = s.now();
    const c = s.now();
    release();
    await b.settle();
    release();
    await Promise.all([a, c]);
    expect(rounds).toBe(2);
    expect(most).toBe(1);
    s.stop();
  });

  it('after a refusal waits for the person; a local change runs a round after a short wait', async () => {
    const b = bench();
    let rounds = 0;
    const s = createScheduler(async () => (++rounds === 1 ? 'stop' : 'done'), b.env);
    s.start();
    await b.settle();
    expect(b.pending()).toBe(0);
    s.soon();
    s.soon();
    expect(await b.next()).toBe(DEFAULT_POLICY.afterChangeMs);
    expect(rounds).toBe(2);
    s.stop();
  });
});
