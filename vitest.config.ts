import { defineConfig } from 'vitest/config';

// Kept apart from vite.config.ts (the app build): the unit-test run needs none of the PWA setup.
const shared = {
  exclude: ['tests/e2e/**', 'node_modules/**'],
  environment: 'node' as const,
  // opencv.js is a CJS module whose object carries a `then`; vitest's default interop would
  // forward it and the import would never settle. (A project's own setting: the root's is not
  // passed down to the projects.)
  deps: { interopDefault: false },
  testTimeout: 60_000,
  hookTimeout: 60_000,
  pool: 'forks' as const,
};

/**
 * The sync server's suite, run a second time against PostgreSQL (a throwaway cluster started by
 * the project's global setup): the same files, the engine chosen in tests/sync/test-database.ts.
 * Files left out test what only the SQLite data folder has (its schema steps, its file cap, a
 * file copied back under running phones, the data-folder commands) or no storage at all.
 */
const SERVER_SUITE = [
  'server/http.test.ts',
  'server/photos.test.ts',
  'tests/sync/faults.test.ts',
  'tests/sync/load.test.ts',
  'tests/sync/phones.test.ts',
  'tests/sync/bad-input.test.ts',
  'tests/sync/photo-client.test.ts',
  'tests/sync/background-round.test.ts',
  'tests/sync/browser-phones.test.ts',
  'tests/sync/concurrency.test.ts',
  'cli/server-copy.test.ts',
];

export default defineConfig({
  test: {
    projects: [
      {
        test: {
          ...shared,
          name: 'sqlite',
          include: ['{cv,fitness,schema,worker,web,server,cli,fixtures,tests}/**/*.test.ts'],
          // Copies into PostgreSQL: it needs the cluster of the `postgres` project.
          exclude: [...shared.exclude, 'cli/server-copy.test.ts'],
        },
      },
      {
        test: {
          ...shared,
          name: 'postgres',
          include: SERVER_SUITE,
          globalSetup: ['tests/support/postgres-global-setup.ts'],
        },
      },
    ],
  },
});
