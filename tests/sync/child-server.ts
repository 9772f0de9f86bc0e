/**
 * The sync server as its own process, started the way an operator starts it
 * (`rivalplate server start`), so a test can kill it outright and start it again on the same
 * data folder.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { resolve } from 'node:path';
import { createInterface } from 'node:readline';
import { SYNC_BASE_PATH } from '../../schema/sync-protocol.ts';
import { isPostgresUrl } from '../../server/open-store.ts';

const BIN = resolve(import.meta.dirname, '../../bin/rivalplate.js');

/** The part of the server's request log the tests look at. */
export interface LogLine {
  msg?: string;
  req?: { method?: string; url?: string };
}

/** The log line of a push request arriving, before its body is read. */
export const pushArrives = (line: LogLine) =>
  line.msg === 'incoming request' && line.req?.url === '/sync/v1/push';

/** The log line of a push whose body passed the checks, as the server starts applying it. */
export const pushStarted = (line: LogLine) => line.msg === 'push started';

export interface ChildServer {
  sync: string;
  process: ChildProcess;
  /**
   * Resolves at the next log line that `matches` (the server logs one JSON object a line). Lines
   * of requests that were answered before the call may still be on their way: match on what only
   * the awaited request logs.
   */
  nextLog(matches: (line: LogLine) => boolean): Promise<void>;
  /** SIGKILL: no shutdown code runs, as in a crash or a power cut of the process. */
  kill(): Promise<void>;
  /** SIGTERM and wait for the clean exit. */
  stop(): Promise<void>;
}

/** `rivalplate server start` arguments that serve this database (a folder or a postgres:// URL). */
export const databaseArgs = (where: string): string[] =>
  isPostgresUrl(where) ? ['--db', where] : ['--data', where];

/** Servers still running when the test process ends (a failed test) are ended with it. */
const running = new Set<ChildProcess>();
process.once('exit', () => {
  for (const child of running) child.kill('SIGKILL');
});

/**
 * `dataDir`: a data folder or a postgres:// URL (test-database.ts). `port` 0 takes any free port;
 * a fixed one lets a restarted server keep its address.
 */
export function startChildServer(
  dataDir: string,
  port = 0,
  timeoutMs = 20_000,
): Promise<ChildServer> {
  const child = spawn(
    process.execPath,
    [BIN, 'server', 'start', '--port', String(port), ...databaseArgs(dataDir)],
    {
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  const waiting = new Set<{ matches: (line: LogLine) => boolean; seen: () => void }>();
  let stderr = '';
  child.stderr!.on('data', (d) => {
    stderr += d;
  });
  running.add(child);
  const exited = new Promise<void>((done) =>
    child.once('exit', () => {
      running.delete(child);
      done();
    }),
  );

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
          nextLog: (matches) =>
            new Promise((seen) => {
              waiting.add({ matches, seen });
            }),
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
      // Parsed only while a test waits for a line (a benchmark's load is not spent on the log).
      if (!line.startsWith('{') || waiting.size === 0) return;
      const parsed = JSON.parse(line) as LogLine;
      for (const w of waiting) {
        if (!w.matches(parsed)) continue;
        waiting.delete(w);
        w.seen();
      }
    });
  });
}
