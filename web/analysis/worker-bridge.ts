import { type Remote, releaseProxy, wrap } from 'comlink';

export interface BridgeOptions {
  /** Makes a fresh worker; called on first use and after every terminate. */
  create: () => Worker;
  /** Terminate after this long with nothing to do, giving the memory of opencv.js back. */
  idleMs: number;
  /** A call that has not answered in this long is abandoned and the worker terminated. */
  timeoutMs: number;
}

/**
 * Owns one worker's life. Calls run one at a time in order. WASM cannot be interrupted, so
 * aborting a running call (or its time-out) terminates the worker; the next call starts a new one.
 */
export class WorkerBridge<Api> {
  private worker: Worker | null = null;
  private remote: Remote<Api> | null = null;
  private queue: Promise<unknown> = Promise.resolve();
  private idleTimer: ReturnType<typeof setTimeout> | undefined;

  constructor(private readonly options: BridgeOptions) {}

  call<R>(work: (api: Remote<Api>) => Promise<R>, signal?: AbortSignal): Promise<R> {
    const run = this.queue.then(() => this.runOne(work, signal));
    this.queue = run.catch(() => undefined);
    return run;
  }

  terminate(): void {
    clearTimeout(this.idleTimer);
    this.remote?.[releaseProxy]();
    this.worker?.terminate();
    this.worker = null;
    this.remote = null;
  }

  private async runOne<R>(
    work: (api: Remote<Api>) => Promise<R>,
    signal?: AbortSignal,
  ): Promise<R> {
    signal?.throwIfAborted();
    clearTimeout(this.idleTimer);
    if (!this.remote) {
      this.worker = this.options.create();
      this.remote = wrap<Api>(this.worker);
    }
    const remote = this.remote;
    let stopped = false;
    let reject: (reason: unknown) => void = () => undefined;
    const stopping = new Promise<never>((_, r) => {
      reject = r;
    });
    const stop = (reason: unknown) => {
      stopped = true;
      reject(reason);
    };
    const onAbort = () => stop(signal?.reason);
    signal?.addEventListener('abort', onAbort, { once: true });
    const timer = setTimeout(
      () =>
        stop(new Error(`the analysis did not answer within ${this.options.timeoutMs / 1000} s`)),
      this.options.timeoutMs,
    );
    try {
      return await Promise.race([work(remote), stopping]);
    } catch (e) {
      // After an abort or a time-out the worker may still be busy in WASM: end it.
      if (stopped) this.terminate();
      throw e;
    } finally {
      clearTimeout(timer);
      signal?.removeEventListener('abort', onAbort);
      if (this.remote) this.idleTimer = setTimeout(() => this.terminate(), this.options.idleMs);
    }
  }
}
