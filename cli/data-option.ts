/** `--data DIR`, the sync server's data folder: every `server` subcommand takes it alike. */
export const DATA_OPTION = { data: { type: 'string', default: 'rivalplate-data' } } as const;
