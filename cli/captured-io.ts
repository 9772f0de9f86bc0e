import type { CommandIo } from './io.ts';

/** A CommandIo that keeps what a command prints, for tests and for callers embedding a command. */
export function capturedIo(
  cwd: string,
): CommandIo & { stdout: () => string; stderr: () => string; printed: () => string[] } {
  const out: string[] = [];
  const err: string[] = [];
  return {
    out: (t) => out.push(t),
    err: (t) => err.push(t),
    isTty: false,
    cwd,
    stdout: () => out.join(''),
    stderr: () => err.join('\n'),
    printed: () => [...out],
  };
}
