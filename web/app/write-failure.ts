/**
 * The app's one way to start a write from a tap: the write is awaited, and when it fails the
 * person is told what was not saved and why (a banner on every screen, `WriteFailureBanner`),
 * instead of the failure vanishing with a promise nobody awaited.
 */

export interface WriteFailure {
  /** What was not saved, in the person's words ("the plate marked reviewed"). */
  what: string;
  reason: string;
}

let latest: WriteFailure | null = null;
const listeners = new Set<() => void>();
const notify = () => {
  for (const l of listeners) l();
};

/** Runs `write` to its end; false (and the failure shown) when it threw. */
export async function saving(what: string, write: () => Promise<unknown>): Promise<boolean> {
  try {
    await write();
    return true;
  } catch (e) {
    latest = { what, reason: e instanceof Error ? e.message : String(e) };
    notify();
    return false;
  }
}

export const writeFailure = (): WriteFailure | null => latest;

export function dismissWriteFailure(): void {
  latest = null;
  notify();
}

export function subscribeWriteFailure(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
