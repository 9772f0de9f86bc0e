import { type ChildProcess, execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, devices, expect, type Page, test } from '@playwright/test';
import { E2E_DIST } from '../../playwright.config.ts';
import { ROOT, shot } from './helpers.ts';

/**
 * Two phones share plates through the lab's real sync server (the `rivalplate server` command,
 * serving this build of the app, on loopback with a fresh data folder).
 */
// Chosen per run by playwright.config.ts.
const PORT = Number(process.env.RIVALPLATE_E2E_SYNC_PORT);
const URL = `http://127.0.0.1:${PORT}`;
let server: ChildProcess;
let token: string;
let data: string;

function cli(...args: string[]): string {
  return execFileSync('node', ['bin/rivalplate.js', ...args], { cwd: ROOT, encoding: 'utf8' });
}

test.beforeAll(async () => {
  data = mkdtempSync(resolve(ROOT, 'tests/artifacts/sync-data-'));
  cli('server', 'add-lab', 'Marrowfield pond', '--data', data);
  token = cli('server', 'add-token', 'Marrowfield pond', '--data', data).trim().split('\n').at(-1)!;
  server = spawn(
    'node',
    [
      'bin/rivalplate.js',
      'server',
      'start',
      '--port',
      String(PORT),
      '--app',
      E2E_DIST,
      '--data',
      data,
    ],
    {
      cwd: ROOT,
      stdio: ['ignore', 'pipe', 'inherit'],
    },
  );
  await new Promise<void>((ready, fail) => {
    server.stdout!.on(
      'data',
      (chunk: Buffer) => chunk.toString().includes('Sync server on') && ready(),
    );
    server.on('exit', (code) => fail(new Error(`the sync server stopped (exit ${code})`)));
  });
});

test.afterAll(async () => {
  if (server && server.exitCode === null) {
    const exited = new Promise((done) => server.once('exit', done));
    server.kill('SIGTERM');
    await exited;
  }
  rmSync(data, { recursive: true, force: true });
});

async function phone(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ ...devices['Pixel 7'], serviceWorkers: 'allow' });
  const page = await context.newPage();
  await page.goto(`${URL}/`);
  await page.getByRole('button', { name: 'Understood' }).tap();
  await page.getByText("Share this phone's plates with the lab server").tap();
  await page.getByLabel('Server address').fill(URL);
  await page.getByLabel('Token').fill(token);
  await page.getByRole('button', { name: 'Connect' }).tap();
  await expect(page.getByTestId('sync-phase')).toHaveText('Shared with the lab server.');
  return page;
}

test('an experiment made on one phone arrives on another through the lab server', async ({
  browser,
}) => {
  const a = await phone(browser);
  await a.getByRole('button', { name: 'New experiment' }).tap();
  await a.getByLabel('Experiment name').fill('Shared run');
  await a.getByRole('button', { name: 'Create experiment' }).tap();
  await a.getByRole('button', { name: 'Save assay' }).tap();
  await a.getByRole('link', { name: 'Back' }).tap();
  await a.getByRole('button', { name: 'Share now' }).tap();
  await expect(a.getByText(/^0 changes waiting/)).toBeVisible();
  await shot(a, '60-sync-phone-a');

  const b = await phone(browser);
  await b.getByRole('button', { name: 'Share now' }).tap();
  await expect(b.getByRole('link', { name: /Shared run/ })).toBeVisible();
  await b.getByRole('link', { name: /Shared run/ }).tap();
  await expect(b.getByTestId('assay-L1-g0-r1')).toBeVisible();
  await shot(b, '61-sync-phone-b');
});

test('a wrong token is refused with the server’s reason, and the phone keeps working alone', async ({
  browser,
}) => {
  const context = await browser.newContext({ ...devices['Pixel 7'], serviceWorkers: 'allow' });
  const page = await context.newPage();
  await page.goto(`${URL}/`);
  await page.getByRole('button', { name: 'Understood' }).tap();
  await page.getByText("Share this phone's plates with the lab server").tap();
  await page.getByLabel('Server address').fill(URL);
  await page.getByLabel('Token').fill('not-a-token');
  await page.getByRole('button', { name: 'Connect' }).tap();
  await expect(page.locator('.field-error')).toContainText(/token/i);
  await expect(page.getByTestId('sync-phase')).toHaveText(
    'Not shared: everything stays on this phone.',
  );
});
