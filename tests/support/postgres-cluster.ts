/**
 * A throwaway PostgreSQL cluster for the tests and the benchmark: Debian's PostgreSQL (15 here)
 * initialised in a temporary folder, listening on 127.0.0.1 on a free port and on a socket in that
 * folder, run as an unprivileged user when this process is root (PostgreSQL refuses to run as
 * root), and removed with everything in it by `stop`. Nothing is read from or left in the
 * machine's own clusters.
 *
 * fsync is off (the tests kill server processes and the database's processes, not the machine:
 * what PostgreSQL wrote survives in the page cache) but every commit still waits for its WAL to be
 * written, so a commit acknowledged before a database crash is there after the restart.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from './free-port.ts';

export interface Cluster {
  /** postgres://rivalplate@127.0.0.1:PORT/postgres: the superuser, on the maintenance database. */
  url: string;
  /** The cluster's folder (data, socket, log). */
  dir: string;
  /** Stops the database at once (as a crash would) and starts it again on the same port. */
  restart(): void;
  stop(): void;
}

const ROOT_HINT =
  'Install it with "apt-get install -y postgresql" (Debian; .ci/run does this), or set RIVALPLATE_PG_BIN to the folder holding initdb and pg_ctl.';

/** The folder of initdb and pg_ctl: RIVALPLATE_PG_BIN, else the newest Debian PostgreSQL. */
function binDir(): string | undefined {
  if (process.env.RIVALPLATE_PG_BIN) return process.env.RIVALPLATE_PG_BIN;
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return undefined;
  const versions = readdirSync(base)
    .filter((v) => existsSync(join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions[0] && join(base, versions[0], 'bin');
}

/**
 * Installs Debian's package when PostgreSQL is missing and this process may (root with apt-get),
 * as tests/e2e/ensure-chromium.sh does for the browser; otherwise says what to do.
 */
export function ensurePostgres(): string {
  let bin = binDir();
  if (bin) return bin;
  const canInstall =
    process.getuid?.() === 0 && spawnSync('sh', ['-c', 'command -v apt-get']).status === 0;
  if (canInstall) {
    console.error("PostgreSQL not found: installing Debian's postgresql package");
    const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
    spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
    spawnSync('apt-get', ['install', '-y', '-qq', 'postgresql'], { stdio: 'inherit', env });
    bin = binDir();
    if (bin) return bin;
  }
  throw new Error(`PostgreSQL (initdb, pg_ctl) was not found. ${ROOT_HINT}`);
}

export async function startCluster(): Promise<Cluster> {
  const bin = ensurePostgres();
  const dir = mkdtempSync(join(tmpdir(), 'rivalplate-pg-'));
  const data = join(dir, 'data');
  const log = join(dir, 'postgres.log');
  const asRoot = process.getuid?.() === 0;
  // PostgreSQL will not run as root: the cluster belongs to "nobody", who owns only this folder.
  const user = 'nobody';
  if (asRoot) {
    const uid = Number(execFileSync('id', ['-u', user], { encoding: 'utf8' }));
    const gid = Number(execFileSync('id', ['-g', user], { encoding: 'utf8' }));
    chownSync(dir, uid, gid);
  }
  const pg = (tool: string, args: string[]) => {
    const [cmd, ...rest] = asRoot
      ? ['runuser', '-u', user, '--', join(bin, tool), ...args]
      : [join(bin, tool), ...args];
    const r = spawnSync(cmd!, rest, { encoding: 'utf8', cwd: dir });
    if (r.status !== 0) {
      const logged = existsSync(log) ? readFileSync(log, 'utf8').slice(-2000) : '';
      throw new Error(
        `PostgreSQL could not be started for the tests: ${tool} ${args.join(' ')} failed (${r.error?.message ?? `status ${r.status}`}):\n${r.stderr}${r.stdout}\n${logged}\n${ROOT_HINT}`,
      );
    }
  };
  const port = await freePort();
  const options = [
    `-p ${port}`,
    `-k ${dir}`,
    '-c listen_addresses=127.0.0.1',
    '-c fsync=off',
    '-c full_page_writes=off',
    '-c max_connections=300',
  ].join(' ');
  const start = () =>
    pg('pg_ctl', ['-D', data, '-l', log, '-w', '-t', '60', '-o', options, 'start']);
  try {
    pg('initdb', [
      '-D',
      data,
      '-U',
      'rivalplate',
      '-A',
      'trust',
      '-E',
      'UTF8',
      '--locale=C',
      '--no-sync',
    ]);
    start();
  } catch (e) {
    rmSync(dir, { recursive: true, force: true });
    throw e;
  }
  return {
    url: `postgres://rivalplate@127.0.0.1:${port}/postgres`,
    dir,
    restart() {
      pg('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']);
      start();
    },
    stop() {
      try {
        pg('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
