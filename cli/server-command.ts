/**
 * `rivalplate server ...`: run the lab's sync server and manage its labs and tokens.
 *
 *   server start [--port N] [--host H] [--data DIR] [--app DIR] [--tls-cert F --tls-key F]
 *                [--max-db-mb N]
 *   server add-lab NAME [--no-photos] [--photo-max-mb N] [--max-mb N]
 *   server add-token LAB [--label TEXT]
 *   server list-tokens LAB
 *   server revoke-token LAB ID
 *   server copy --from DIR --to URL
 *
 * Each takes --data DIR (SQLite, the default) or --db postgres://... (PostgreSQL).
 */
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { SYNC_LIMITS } from '../schema/sync-protocol.ts';
import { buildSyncServer } from '../server/app.ts';
import { CopyError, copyToPostgres } from '../server/copy-to-postgres.ts';
import { DataFolderError } from '../server/data-folder.ts';
import { DB_PASSWORD_ENV, isPostgresUrl, openStore } from '../server/open-store.ts';
import { SyncRefusal } from '../server/refusal.ts';
import { DATA_OPTION } from './data-option.ts';
import type { CommandIo } from './io.ts';
import { UsageError } from './options.ts';
import { addToken, listTokens, revokeToken } from './token-commands.ts';

const USAGE = `Usage:
  rivalplate server start [--port 8640] [--host 127.0.0.1] [--data DIR | --db URL] [--app DIR]
                          [--tls-cert FILE --tls-key FILE] [--max-db-mb N]
  rivalplate server add-lab NAME [--no-photos] [--photo-max-mb 20] [--max-mb 2048] [--data DIR | --db URL]
  rivalplate server add-token LAB [--label TEXT] [--data DIR | --db URL]
  rivalplate server list-tokens LAB [--data DIR | --db URL]
  rivalplate server revoke-token LAB ID [--data DIR | --db URL]
  rivalplate server copy --from DIR --to URL

add-token prints the token once, on its last line; list-tokens shows each token's id, label,
dates and whether it is revoked; revoke-token takes an id from that list.

--data DIR keeps everything in one SQLite file in DIR (default rivalplate-data). --db URL keeps
it in PostgreSQL instead (postgres://USER@HOST:PORT/DATABASE), so several server processes can
serve one database; the password may be in the URL or, better, in $${DB_PASSWORD_ENV}.
copy moves a data folder's labs, tokens, records and photos into an empty PostgreSQL database.`;
const DEFAULT_PORT = 8640;
/** A lab's share of the server unless `add-lab --max-mb` says otherwise. */
const DEFAULT_LAB_MB = 2048;
const MB = 1024 * 1024;

/** A whole number option, or an error message naming it. */
function wholeNumber(name: string, text: string | undefined, fallback: number): number | string {
  if (text === undefined) return fallback;
  const n = Number(text);
  return Number.isInteger(n) && n > 0
    ? n
    : `--${name} expects a whole number above 0, got "${text}"`;
}

async function start(args: string[], io: CommandIo): Promise<number> {
  const { values } = parseArgs({
    args,
    options: {
      port: { type: 'string' },
      host: { type: 'string', default: '127.0.0.1' },
      ...DATA_OPTION,
      app: { type: 'string', default: 'dist' },
      'tls-cert': { type: 'string' },
      'tls-key': { type: 'string' },
      'max-db-mb': { type: 'string' },
    },
  });
  // Port 0 asks the system for a free port; the line printed on start says which it chose.
  const port = values.port === '0' ? 0 : wholeNumber('port', values.port, DEFAULT_PORT);
  const maxMb = wholeNumber('max-db-mb', values['max-db-mb'], 0);
  if (typeof port === 'string' || typeof maxMb === 'string') {
    io.err(`rivalplate server: ${typeof port === 'string' ? port : maxMb}`);
    return 2;
  }
  if (Boolean(values['tls-cert']) !== Boolean(values['tls-key'])) {
    io.err('rivalplate server: --tls-cert and --tls-key go together');
    return 2;
  }
  const tls = values['tls-cert']
    ? { cert: readFileSync(values['tls-cert']), key: readFileSync(values['tls-key']!) }
    : undefined;
  const dataDir = resolve(io.cwd, values.data);
  if (values.db !== undefined && maxMb) {
    io.err(
      'rivalplate server: --max-db-mb caps the SQLite file; PostgreSQL is sized by its own means',
    );
    return 2;
  }
  const { store, where } = await openStore({
    dataDir,
    db: values.db,
    maxBytes: maxMb ? maxMb * MB : undefined,
  });
  const appDir = resolve(io.cwd, values.app);
  const app = await buildSyncServer({
    store,
    appDir,
    log: true,
    ...(tls ? { tls } : {}),
  });
  const url = await app.listen({ port, host: values.host });
  io.out(`Sync server on ${url} (data in ${where})`);
  if (!existsSync(join(appDir, 'index.html')))
    io.err(
      `No built app in ${appDir}: phones get only the sync routes until "npx vite build" is run`,
    );

  // Stops on Ctrl-C or a service manager's TERM, closing the database cleanly.
  await new Promise<void>((done) => {
    const stop = () => {
      process.off('SIGINT', stop);
      process.off('SIGTERM', stop);
      done();
    };
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
  });
  await app.close();
  await store.close();
  return 0;
}

async function addLab(args: string[], io: CommandIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      ...DATA_OPTION,
      'no-photos': { type: 'boolean', default: false },
      'photo-max-mb': { type: 'string' },
      'max-mb': { type: 'string' },
    },
  });
  const name = positionals[0]?.trim();
  const photoCap = SYNC_LIMITS.photoBytes / MB;
  const photoMb = wholeNumber('photo-max-mb', values['photo-max-mb'], 20);
  const labMb = wholeNumber('max-mb', values['max-mb'], DEFAULT_LAB_MB);
  const wrong =
    typeof photoMb === 'string'
      ? photoMb
      : typeof labMb === 'string'
        ? labMb
        : photoMb > photoCap
          ? `--photo-max-mb is at most ${photoCap}, got ${photoMb}`
          : null;
  if (!name || positionals.length > 1 || wrong !== null) {
    io.err(wrong !== null ? `rivalplate server: ${wrong}` : USAGE);
    return 2;
  }
  const { store } = await openStore({ dataDir: resolve(io.cwd, values.data), db: values.db });
  try {
    await store.addLab(name, {
      photosEnabled: !values['no-photos'],
      photoMaxBytes: (photoMb as number) * MB,
      maxBytes: (labMb as number) * MB,
    });
    io.out(
      `Lab "${name}" added (photos ${values['no-photos'] ? 'stay on the phones' : `up to ${photoMb} MB each`}; up to ${labMb} MB on this server).`,
    );
    return 0;
  } finally {
    await store.close();
  }
}

async function copy(args: string[], io: CommandIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: { from: { type: 'string' }, to: { type: 'string' } },
  });
  if (!values.from || !values.to || positionals.length > 0)
    throw new UsageError('expected "server copy --from DATA_DIR --to postgres://..."');
  if (!isPostgresUrl(values.to))
    throw new UsageError(`--to expects a postgres:// URL, got "${values.to.slice(0, 40)}"`);
  try {
    const report = await copyToPostgres(
      resolve(io.cwd, values.from),
      values.to,
      process.env[DB_PASSWORD_ENV],
    );
    const rows = report.tables.map((t) => `${t.rows} ${t.name}`).join(', ');
    io.out(
      `Copied ${report.source} to ${report.target}: ${rows} (${(report.bytes / MB).toFixed(1)} MB of photos). Counts and SHA-256 of every table match.\nStart the server with --db on it; phones keep their tokens and go on from where they were.`,
    );
    return 0;
  } catch (e) {
    if (e instanceof CopyError) {
      io.err(`rivalplate server copy: ${e.message}`);
      return 1;
    }
    throw e;
  }
}

const SUBCOMMANDS: Record<string, (args: string[], io: CommandIo) => Promise<number>> = {
  start,
  'add-lab': addLab,
  'add-token': addToken,
  'list-tokens': listTokens,
  'revoke-token': revokeToken,
  copy,
};

export async function run(args: string[], io: CommandIo): Promise<number> {
  const [sub, ...rest] = args;
  // Asked for, the usage is the answer (exit 0), as with every other command's --help.
  if (
    sub === '--help' ||
    sub === '-h' ||
    sub === 'help' ||
    rest.includes('--help') ||
    rest.includes('-h')
  ) {
    io.out(USAGE);
    return 0;
  }
  const command = sub ? SUBCOMMANDS[sub] : undefined;
  if (!command) {
    io.err(USAGE);
    return 2;
  }
  try {
    return await command(rest, io);
  } catch (e) {
    // parseArgs reports unknown or malformed options by throwing; a refusal names a bad name.
    if (
      e instanceof SyncRefusal ||
      e instanceof UsageError ||
      (e as { code?: string }).code?.startsWith('ERR_PARSE_ARGS')
    ) {
      io.err(`rivalplate server: ${(e as Error).message}`);
      return 2;
    }
    if (e instanceof DataFolderError) {
      io.err(`rivalplate server: ${e.message}`);
      return 1;
    }
    throw e;
  }
}
