/**
 * The sync server as its own process, started the way an operator starts it
 * (`rivalplate server start`), so a test can kill it outright and start it again on the same
 * data folder.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { resolve } from 'node:path';
import { createInterface } from 'node:readline';
import { SYNC_BASE_PATH } from '../../schema/sync-protocol.ts';

const BIN = resolve(import.meta.dirname, '../../bin/rivalplate.js');

export interface ChildServer {
  sync: string;
  process: ChildProcess;
  /** Resolves at the first log line whose message is `msg`. */
  nextLog(msg: string): Promise<void>;
  /** SIGKILL: no shutdown code runs, as in a crash or a power cut of the process. */
  kill(): Promise<void>;
  /** SIGTERM and wait for the clean exit. */
  stop(): Promise<void>;
}

/** `port` 0 takes any free port; a fixed one lets a restarted server keep its address. */
export function startChildServer(
  dataDir: string,
  port = 0,
  timeoutMs = 20_000,
): Promise<ChildServer> {
  const child = spawn(
    process.execPath,
    [BIN, 'server', 'start', '--port', String(port), '--data', dataDir],
    {
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  const waiting = new Map<string, () => void>();
  let stderr = '';
  child.stderr!.on('data', (d) => {
    stderr += d;
  });
  const exited = new Promise<void>((done) => child.once('exit', () => done()));

  return new Promise((ready, fail) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      fail(new Error(`the server did not start within ${timeoutMs} ms: ${stderr}`));
    }, timeoutMs);
    child.once('exit', (code) => {
      clearTimeout(timer);
      fail(new Error(`the server exited with ${code} before it started: ${stderr}`));
    });
    createInterface({ input: child.stdout! }).on('line', (line) => {
      const started = /^Sync server on (\S+) /.exec(line);
      if (started) {
        clearTimeout(timer);
        ready({
          sync: started[1]! + SYNC_BASE_PATH,
          process: child,
          nextLog: (msg) => new Promise((seen) => waiting.set(msg, seen)),
          async kill() {
            child.kill('SIGKILL');
            await exited;
          },
          async stop() {
            child.kill('SIGTERM');
            await exited;
          },
        });
        return;
      }
      if (!line.startsWith('{')) return;
      const msg = (JSON.parse(line) as { msg?: string }).msg ?? '';
      const seen = waiting.get(msg);
      if (seen) {
        waiting.delete(msg);
        seen();
      }
    });
  });
}
