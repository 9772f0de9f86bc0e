/** The lines `server list-tokens` prints: one aligned row per token, times in UTC. */
import type { TokenInfo } from '../server/storage/sync-store.ts';

const HEADINGS = ['id', 'made', 'last used', 'revoked', 'label'];

/** An ISO time to the minute: enough to tell apart tokens made on one day. */
const minute = (iso: string) => iso.slice(0, 16).replace('T', ' ');

export function tokenTable(tokens: TokenInfo[]): string[] {
  const rows = [
    HEADINGS,
    ...tokens.map((t) => [
      t.id,
      minute(t.createdAt),
      t.lastUsedOn ?? 'never',
      t.revokedAt ? minute(t.revokedAt) : 'no',
      t.label ?? '',
    ]),
  ];
  const widths = HEADINGS.map((_, i) => Math.max(...rows.map((r) => r[i]!.length)));
  return rows.map((r) =>
    r
      .map((cell, i) => cell.padEnd(widths[i]!))
      .join('  ')
      .trimEnd(),
  );
}
