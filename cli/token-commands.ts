/**
 * `rivalplate server add-token | list-tokens | revoke-token`: a lab's bearer tokens. They work on
 * the data folder while the server runs; the server reads tokens afresh on every request.
 */
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { DATABASE_FILE } from '../server/data-folder.ts';
import { openStore } from '../server/open-store.ts';
import type { Lab, SyncStore, TokenInfo } from '../server/storage/sync-store.ts';
import { isTokenId, newToken, tokenHash } from '../server/tokens.ts';
import { DATA_OPTION } from './data-option.ts';
import type { CommandIo } from './io.ts';
import { UsageError } from './options.ts';
import { tokenTable } from './token-table.ts';

/** Long enough for "Ana's phone, bench 3", short enough to keep list-tokens on one line. */
const LABEL_MAX = 60;

/** `--label`: one line the operator will recognise in list-tokens, or none at all. */
function tokenLabel(text: string | undefined): string | undefined {
  if (text === undefined) return undefined;
  const label = text.trim();
  if (!label) throw new UsageError('--label is empty; leave it out for a token without a label');
  if (/\p{Cc}/u.test(label))
    throw new UsageError('--label: expected one line of text, without control characters');
  const length = [...label].length;
  if (length > LABEL_MAX)
    throw new UsageError(`--label: expected at most ${LABEL_MAX} characters, got ${length}`);
  return label;
}

/** Refuses a call without exactly the words `sub` takes (`names`), none of them blank. */
function expectWords(positionals: string[], sub: string, names: string[]): void {
  if (positionals.length !== names.length || positionals.some((p) => !p.trim()))
    throw new UsageError(`expected "server ${sub} ${names.join(' ')}"`);
}

/**
 * Runs `work` on the lab of a data folder that exists already: a mistyped --data or lab name
 * gets a message and status 1, and no empty database is left behind.
 */
async function withLab(
  io: CommandIo,
  { data, db }: { data: string; db?: string | undefined },
  labName: string,
  work: (store: SyncStore, lab: Lab) => Promise<number>,
): Promise<number> {
  const dir = resolve(io.cwd, data);
  // add-lab trims the name it stores, so a lab is found whatever spaces surround its name here.
  const name = labName.trim();
  if (db === undefined && !existsSync(join(dir, DATABASE_FILE))) {
    io.err(
      `rivalplate server: no sync database in ${dir}; add a lab there first with "server add-lab", or give the server's folder with --data`,
    );
    return 1;
  }
  const { store } = await openStore({ dataDir: dir, db });
  try {
    const lab = await store.findLab(name);
    if (!lab) {
      io.err(`rivalplate server: no lab named "${name}"; add it first with "server add-lab"`);
      return 1;
    }
    return await work(store, lab);
  } finally {
    await store.close();
  }
}

const named = (t: TokenInfo) => (t.label === null ? t.id : `${t.id} ("${t.label}")`);

export async function addToken(args: string[], io: CommandIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: { ...DATA_OPTION, label: { type: 'string' } },
  });
  expectWords(positionals, 'add-token', ['LAB']);
  const label = tokenLabel(values.label);
  return withLab(io, values, positionals[0]!, async (store, lab) => {
    const token = newToken();
    const made = await store.addToken(lab.id, tokenHash(token), label);
    // The token goes last, alone on its line, so a script can take the last line of the output.
    io.out(
      `Token ${named(made)} for lab "${lab.name}"; shown this once, the server keeps only its hash:\n${token}`,
    );
    return 0;
  });
}

export async function listTokens(args: string[], io: CommandIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: DATA_OPTION,
  });
  expectWords(positionals, 'list-tokens', ['LAB']);
  return withLab(io, values, positionals[0]!, async (store, lab) => {
    const tokens = await store.listTokens(lab.id);
    io.out(
      tokens.length === 0
        ? `Lab "${lab.name}" has no tokens; make one with "server add-token".`
        : [`Tokens of lab "${lab.name}" (times in UTC):`, ...tokenTable(tokens)].join('\n'),
    );
    return 0;
  });
}

export async function revokeToken(args: string[], io: CommandIo): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: DATA_OPTION,
  });
  expectWords(positionals, 'revoke-token', ['LAB', 'ID']);
  const id = positionals[1]!.trim().toLowerCase();
  if (!isTokenId(id))
    throw new UsageError(
      `"${positionals[1]}" is not a token id: ids are the 8 characters (0-9, a-f) that "server list-tokens" shows`,
    );
  return withLab(io, values, positionals[0]!, async (store, lab) => {
    const before = await store.revokeToken(lab.id, id);
    if (before.length === 0) {
      io.err(
        `rivalplate server: lab "${lab.name}" has no token ${id}; "server list-tokens" shows its tokens`,
      );
      return 1;
    }
    const fresh = before.filter((t) => t.revokedAt === null);
    if (fresh.length === 0) {
      io.out(
        `Token ${named(before[0]!)} of lab "${lab.name}" was revoked already, on ${before[0]!.revokedAt!.slice(0, 10)}; nothing changed.`,
      );
      return 0;
    }
    // Two tokens share an id only if their hashes share the first 32 bits: both go, to be safe.
    const shared =
      before.length > 1 ? ` (${before.length} tokens share this id; all are revoked)` : '';
    io.out(
      `Token ${fresh.map(named).join(', ')} of lab "${lab.name}" revoked${shared}: the server refuses it from its next request on.`,
    );
    return 0;
  });
}
