/**
 * `--data DIR`, the sync server's data folder (SQLite), or `--db postgres://...`, a PostgreSQL
 * database used instead: every `server` subcommand takes them alike.
 */
export const DATA_OPTION = {
  data: { type: 'string', default: 'rivalplate-data' },
  db: { type: 'string' },
} as const;
