import { type ChildProcess, execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { type Browser, devices, expect, type Page } from '@playwright/test';
import { E2E_DIST } from '../../playwright.config.ts';
import {
  checkPullResponse,
  type PulledRecord,
  SYNC_BASE_PATH,
} from '../../schema/sync-protocol.ts';
import { ROOT } from './helpers.ts';

/**
 * The lab's real sync server for a spec file: the `rivalplate server` command on loopback, with
 * a fresh data folder, one lab and one token, serving this build of the app.
 */
export interface LabServer {
  url: string;
  token: string;
  stop(): Promise<void>;
}

function cli(...args: string[]): string {
  return execFileSync('node', ['bin/rivalplate.js', ...args], { cwd: ROOT, encoding: 'utf8' });
}

/** `slot` keeps spec files on ports of their own (chosen per run by playwright.config.ts). */
export async function startLabServer(slot: number): Promise<LabServer> {
  const port = Number(process.env.RIVALPLATE_E2E_SYNC_PORT) + slot;
  const data = mkdtempSync(resolve(ROOT, 'tests/artifacts/sync-data-'));
  cli('server', 'add-lab', 'Marrowfield pond', '--data', data);
  const token = cli('server', 'add-token', 'Marrowfield pond', '--data', data)
    .trim()
    .split('\n')
    .at(-1)!;
  const args = ['server', 'start', '--port', String(port), '--app', E2E_DIST, '--data', data];
  const server: ChildProcess = spawn('node', ['bin/rivalplate.js', ...args], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((ready, fail) => {
    server.stdout!.on(
      'data',
      (chunk: Buffer) => chunk.toString().includes('Sync server on') && ready(),
    );
    server.on('exit', (code) => fail(new Error(`the sync server stopped (exit ${code})`)));
  });
  return {
    url: `http://127.0.0.1:${port}`,
    token,
    async stop() {
      if (server.exitCode === null) {
        const exited = new Promise((done) => server.once('exit', done));
        server.kill('SIGTERM');
        await exited;
      }
      rmSync(data, { recursive: true, force: true });
    },
  };
}

/**
 * A phone of its own (a fresh browser context) with the app served by the lab server open, and
 * the lab server's address and `token` sent from the sharing form.
 */
export async function phoneConnecting(
  browser: Browser,
  lab: LabServer,
  token: string,
): Promise<Page> {
  const context = await browser.newContext({ ...devices['Pixel 7'], serviceWorkers: 'allow' });
  const page = await context.newPage();
  await page.goto(`${lab.url}/`);
  await page.getByRole('button', { name: 'Understood' }).tap();
  await page.getByText("Share this phone's plates with the lab server").tap();
  await page.getByLabel('Server address').fill(lab.url);
  await page.getByLabel('Token').fill(token);
  await page.getByRole('button', { name: 'Connect' }).tap();
  return page;
}

/** A phone with sharing turned on with the lab's token. */
export async function connectedPhone(browser: Browser, lab: LabServer): Promise<Page> {
  const page = await phoneConnecting(browser, lab, lab.token);
  await expect(page.getByTestId('sync-phase')).toHaveText('Shared with the lab server.');
  return page;
}

/** Every record the lab server holds, with its heads, as a phone's first pull would get them. */
export async function serverRecords(lab: LabServer): Promise<PulledRecord[]> {
  const res = await fetch(`${lab.url}${SYNC_BASE_PATH}/changes?since=0`, {
    headers: { authorization: `Bearer ${lab.token}` },
  });
  return checkPullResponse(await res.json(), 'pull').records;
}
