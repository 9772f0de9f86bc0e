/**
 * When sync runs: at once when the browser comes back online, on demand, shortly after a local
 * change, on a steady timer while all is well, and after a failure on a timer that backs off
 * (doubling, capped, with jitter so a lab's phones do not all retry in the same second). Never
 * two rounds at once: a trigger during a round runs one more round after it.
 */

/** What the scheduler needs from its surroundings; the browser's is in browser-env.ts. */
export interface SchedulerEnv {
  /** Calls `fn` after `ms`; returns the function that cancels it. */
  setTimer(fn: () => void, ms: number): () => void;
  isOnline(): boolean;
  /** Calls `fn` whenever the network comes back; returns the unsubscribe function. */
  onOnline(fn: () => void): () => void;
  random(): number;
}

export interface SchedulePolicy {
  everyMs: number;
  firstRetryMs: number;
  maxRetryMs: number;
  /** Wait after a local change, so a run of taps goes up as one push. */
  afterChangeMs: number;
}

export const DEFAULT_POLICY: SchedulePolicy = {
  everyMs: 5 * 60_000,
  firstRetryMs: 15_000,
  maxRetryMs: 15 * 60_000,
  afterChangeMs: 3_000,
};

/** `done`: all well; `retry`: a passing failure; `stop`: wait for the person (or for `now`). */
export type RoundVerdict = 'done' | 'retry' | 'stop';

export interface Scheduler {
  start(): void;
  stop(): void;
  /** Runs a round now (or right after the one running); resolves when it has finished. */
  now(): Promise<void>;
  /** A local change was made: run a round after a short wait. */
  soon(): void;
}

/** The wait before retry number `failures` (1, 2, ...): doubling from the first, capped, jittered. */
export function retryDelay(failures: number, policy: SchedulePolicy, random: number): number {
  const plain = Math.min(policy.maxRetryMs, policy.firstRetryMs * 2 ** Math.max(0, failures - 1));
  return Math.round(plain * (0.5 + random / 2));
}

export function createScheduler(
  run: () => Promise<RoundVerdict>,
  env: SchedulerEnv,
  policy: SchedulePolicy = DEFAULT_POLICY,
  onPlanned: (inMs: number | null) => void = () => {},
): Scheduler {
  let failures = 0;
  let running: Promise<void> | null = null;
  let again = false;
  let cancelTimer: (() => void) | null = null;
  let stopOnline: (() => void) | null = null;
  let stopped = true;

  function plan(ms: number | null): void {
    cancelTimer?.();
    cancelTimer = null;
    if (ms !== null && !stopped) cancelTimer = env.setTimer(() => void trigger(), ms);
    onPlanned(ms);
  }

  async function loop(): Promise<void> {
    do {
      again = false;
      if (!env.isOnline()) {
        plan(null); // the online event brings it back
        return;
      }
      const verdict = await run();
      if (verdict === 'done') failures = 0;
      if (verdict === 'retry') failures += 1;
      plan(
        verdict === 'done'
          ? policy.everyMs
          : verdict === 'retry'
            ? retryDelay(failures, policy, env.random())
            : null,
      );
    } while (again && !stopped);
  }

  function trigger(): Promise<void> {
    if (stopped) return Promise.resolve();
    if (running) {
      again = true;
      return running;
    }
    running = loop().finally(() => {
      running = null;
    });
    return running;
  }

  return {
    start() {
      if (!stopped) return;
      stopped = false;
      stopOnline = env.onOnline(() => void trigger());
      void trigger();
    },
    stop() {
      stopped = true;
      stopOnline?.();
      stopOnline = null;
      plan(null);
    },
    now: trigger,
    soon() {
      if (!stopped) plan(policy.afterChangeMs);
    },
  };
}
