import { defineConfig } from 'vitest/config';

// Kept apart from vite.config.ts (the app build): the unit-test run needs none of the PWA setup.
export default defineConfig({
  test: {
    include: ['{cv,fitness,schema,worker,web,server,cli,fixtures,tests}/**/*.test.ts'],
    exclude: ['tests/e2e/**', 'node_modules/**'],
    environment: 'node',
    // opencv.js is a CJS module whose object carries a `then`; vitest's default interop would
    // forward it and the import would never settle.
    deps: { interopDefault: false },
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
