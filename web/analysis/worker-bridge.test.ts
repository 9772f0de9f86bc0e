import { expose } from 'comlink';
import { describe, expect, it } from 'vitest';
import { WorkerBridge } from './worker-bridge.ts';

/**
 * The bridge against a real comlink endpoint: the API is exposed on one end of a MessageChannel
 * in this thread, the bridge talks to the other end. `terminate` closes the channel, as ending
 * a worker does. (The end-to-end tests run the bridge with the real plate worker.)
 */
function channelWorkers() {
  const made: { terminated: boolean }[] = [];
  let release: (() => void) | null = null;
  const api = {
    echo: async (x: number) => x,
    hang: () => new Promise<number>((resolve) => (release = () => resolve(-1))),
    fail: async () => {
      throw new Error('bad plate');
    },
  };
  const create = () => {
    const { port1, port2 } = new MessageChannel();
    expose(api, port2);
    const state = { terminated: false };
    made.push(state);
    return Object.assign(port1, {
      terminate: () => {
        state.terminated = true;
        port1.close();
        port2.close();
      },
    }) as unknown as Worker;
  };
  return { create, made, release: () => release?.() };
}

describe('WorkerBridge', () => {
  it('runs calls one at a time, in order, on one worker', async () => {
    const w = channelWorkers();
    const bridge = new WorkerBridge<{ echo: (x: number) => Promise<number> }>({
      create: w.create,
      idleMs: 1000,
      timeoutMs: 1000,
    });
    const order: number[] = [];
    await Promise.all(
      [1, 2, 3].map((x) => bridge.call((api) => api.echo(x)).then((v) => order.push(v))),
    );
    expect(order).toEqual([1, 2, 3]);
    expect(w.made).toHaveLength(1);
    bridge.terminate();
  });

  it('an abort during a call terminates the worker; the next call starts a new one', async () => {
    const w = channelWorkers();
    const bridge = new WorkerBridge<{
      hang: () => Promise<number>;
      echo: (x: number) => Promise<number>;
    }>({
      create: w.create,
      idleMs: 1000,
      timeoutMs: 5000,
    });
    const controller = new AbortController();
    const running = bridge.call((api) => api.hang(), controller.signal);
    setTimeout(() => controller.abort(new Error('left the screen')), 20);
    await expect(running).rejects.toThrow('left the screen');
    expect(w.made[0]!.terminated).toBe(true);
    expect(await bridge.call((api) => api.echo(7))).toBe(7);
    expect(w.made).toHaveLength(2);
    bridge.terminate();
    w.release();
  });

  it('a call aborted while queued never runs', async () => {
    const w = channelWorkers();
    const bridge = new WorkerBridge<{ echo: (x: number) => Promise<number> }>({
      create: w.create,
      idleMs: 1000,
      timeoutMs: 1000,
    });
    const controller = new AbortController();
    controller.abort(new Error('cancelled'));
    await expect(bridge.call((api) => api.echo(1), controller.signal)).rejects.toThrow('cancelled');
    expect(w.made).toHaveLength(0);
  });

  it('a call that never answers times out and ends the worker', async () => {
    const w = channelWorkers();
    const bridge = new WorkerBridge<{ hang: () => Promise<number> }>({
      create: w.create,
      idleMs: 1000,
      timeoutMs: 50,
    });
    await expect(bridge.call((api) => api.hang())).rejects.toThrow('did not answer within 0.05 s');
    expect(w.made[0]!.terminated).toBe(true);
    w.release();
  });

  it('an error from the worker reaches the caller and keeps the worker', async () => {
    const w = channelWorkers();
    const bridge = new WorkerBridge<{ fail: () => Promise<never> }>({
      create: w.create,
      idleMs: 1000,
      timeoutMs: 1000,
    });
    await expect(bridge.call((api) => api.fail())).rejects.toThrow('bad plate');
    expect(w.made[0]!.terminated).toBe(false);
    bridge.terminate();
  });

  it('shuts the worker down after the idle time', async () => {
    const w = channelWorkers();
    const bridge = new WorkerBridge<{ echo: (x: number) => Promise<number> }>({
      create: w.create,
      idleMs: 30,
      timeoutMs: 1000,
    });
    await bridge.call((api) => api.echo(1));
    expect(w.made[0]!.terminated).toBe(false);
    await new Promise((r) => setTimeout(r, 80));
    expect(w.made[0]!.terminated).toBe(true);
  });
});
