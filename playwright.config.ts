import { defineConfig, devices } from '@playwright/test';
import { CAMERA_FRAME } from './tests/e2e/camera-frame.ts';
import { requiredChromium } from './tests/support/chromium.ts';

/**
 * End-to-end tests of the bench app in the machine's Chromium (Debian's package; Playwright
 * downloads no browser here). `npm run test:e2e` builds the app into tests/artifacts/e2e-dist
 * first, so a build others run into dist/ at the same time cannot swap files under the tests.
 */
// Ports of this run. Several runs share the machine (other checkouts, CI clones), so a fixed
// port would collide: each run picks its own from its process id, and writes it to the
// environment so the test workers Playwright forks see the same numbers.
process.env.RIVALPLATE_E2E_PORT ??= String(20_000 + (process.pid % 20_000));
process.env.RIVALPLATE_E2E_SYNC_PORT ??= String(Number(process.env.RIVALPLATE_E2E_PORT) + 20_000);
const PORT = Number(process.env.RIVALPLATE_E2E_PORT);
export const E2E_DIST = 'tests/artifacts/e2e-dist';
// Found by the lookup ensure-chromium.sh made before this run (tests/support/chromium.ts).
const CHROMIUM = requiredChromium();
// Flags seen to work for headless Debian Chromium on this machine (no GPU, no sandbox in CI).
const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--use-fake-device-for-media-stream',
  '--use-fake-ui-for-media-stream',
];

export default defineConfig({
  testDir: 'tests/e2e',
  testMatch: '*.spec.ts',
  globalSetup: './tests/e2e/global-setup.ts',
  outputDir: 'tests/artifacts/e2e-results',
  // The machine has two shared cores; one browser at a time keeps timings honest.
  workers: 1,
  fullyParallel: false,
  timeout: 120_000,
  expect: { timeout: 30_000 },
  reporter: [['list']],
  use: {
    ...devices['Pixel 7'],
    baseURL: `http://127.0.0.1:${PORT}/`,
    serviceWorkers: 'allow',
    trace: 'retain-on-failure',
    launchOptions: {
      executablePath: CHROMIUM,
      args: CHROMIUM_ARGS,
    },
  },
  projects: [
    { name: 'phone', testIgnore: 'camera.spec.ts' },
    {
      // The fake camera serves one fixed frame made from a demo plate (global-setup.ts).
      name: 'camera',
      testMatch: 'camera.spec.ts',
      use: {
        launchOptions: {
          executablePath: CHROMIUM,
          args: [...CHROMIUM_ARGS, `--use-file-for-fake-video-capture=${CAMERA_FRAME}`],
        },
      },
    },
  ],
  webServer: {
    command: `npx vite preview --outDir ../${E2E_DIST} --port ${PORT} --strictPort --bypass-lock`,
    url: `http://127.0.0.1:${PORT}/`,
    reuseExistingServer: false,
    timeout: 60_000,
  },
});
