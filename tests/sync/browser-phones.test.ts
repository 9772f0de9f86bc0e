/**
 * Two phones in Chromium (two browser contexts, each with its own IndexedDB), on the sync server
 * over loopback: both work offline on the same plate (Playwright's offline emulation, which also
 * fires the browser's offline and online events), come back online and sync by themselves on the
 * online event. The server and both phones end with the same data, the conflict shown on both
 * until one person resolves it. The sync client runs here bundled on its own: the app's screens
 * for sync are not part of this test.
 */
import { rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { type Browser, type BrowserContext, chromium, type Page } from '@playwright/test';
import { build } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Plate } from '../../schema/records.ts';
import type { SyncStatus } from '../../web/sync/status.ts';
import { requiredChromium } from '../support/chromium.ts';
import type { BrowserPhone } from './browser/phone-entry.ts';
import { startTestServer, type TestServer, tempDir } from './harness.ts';
import { assay, experiment, plate, revised, sample } from './marrowfield.ts';

type PhoneWindow = Window & {
  startPhone(): Promise<BrowserPhone>;
  requestBackgroundSync(): Promise<boolean>;
  phone: BrowserPhone;
};

let appDir: string;
let server: TestServer;
let browser: Browser;

beforeAll(async () => {
  const executablePath = requiredChromium();
  appDir = tempDir();
  await build({
    configFile: false,
    logLevel: 'silent',
    build: {
      outDir: appDir,
      emptyOutDir: false,
      minify: false,
      lib: {
        entry: resolve(import.meta.dirname, 'browser/phone-entry.ts'),
        formats: ['es'],
        fileName: 'phone',
      },
    },
  });
  writeFileSync(
    join(appDir, 'index.html'),
    '<!doctype html><title>phone</title><script type="module" src="./phone.js"></script>',
  );
  // The page and the sync routes from one origin, as the server serves the real app.
  server = await startTestServer({ appDir });
  browser = await chromium.launch({
    executablePath,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-sync',
    ],
  });
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
  if (appDir) rmSync(appDir, { recursive: true, force: true });
});

async function openPhone(token: string): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(server.origin);
  await page.waitForFunction(() => 'startPhone' in window);
  const problem = await page.evaluate(async (t) => {
    const w = window as unknown as PhoneWindow;
    w.phone = await w.startPhone();
    return w.phone.client.connect({ serverUrl: location.origin, token: t });
  }, token);
  expect(problem).toBeNull();
  return { context, page };
}

const status = (page: Page): Promise<SyncStatus> =>
  page.evaluate(() => (window as unknown as PhoneWindow).phone.client.status());
const syncNow = (page: Page): Promise<SyncStatus> =>
  page.evaluate(() => (window as unknown as PhoneWindow).phone.client.syncNow());
const putPlate = (page: Page, p: Plate) =>
  page.evaluate((rec) => (window as unknown as PhoneWindow).phone.records.put('plates', rec), p);
const plates = (page: Page) =>
  page.evaluate(() => (window as unknown as PhoneWindow).phone.records.all('plates'));

describe('two phones in Chromium', () => {
  it('work offline on one plate, sync on the online event, and end with the same data', async () => {
    const token = await server.lab('browser-phones');
    const a = await openPhone(token);
    const b = await openPhone(token);

    await a.page.evaluate(
      async ([e, s, as]) => {
        const { records } = (window as unknown as PhoneWindow).phone;
        await records.put('experiments', e);
        await records.put('assays', as);
        await records.put('samples', s);
      },
      [experiment(), sample('mf-L1-r1-start', 'mf-L1-r1'), assay('mf-L1-r1')] as const,
    );
    const base = plate('mf-plate-1');
    await putPlate(a.page, base);
    expect((await syncNow(a.page)).waiting).toBe(0);
    await syncNow(b.page);
    expect(await plates(b.page)).toEqual([base]);

    await a.context.setOffline(true);
    await b.context.setOffline(true);
    await putPlate(a.page, revised(base, { typedCounts: { test: 131, reference: 97 } }, 30));
    await putPlate(b.page, revised(base, { typedCounts: { test: 112, reference: 88 } }, 31));
    for (const phone of [a, b]) {
      await phone.page.waitForFunction(
        () => (window as unknown as PhoneWindow).phone.client.status().phase === 'offline',
      );
      expect((await status(phone.page)).waiting).toBe(1);
    }

    // Back online: no call from the test; the online event starts each phone's round.
    await a.context.setOffline(false);
    await a.page.waitForFunction(
      () => (window as unknown as PhoneWindow).phone.client.status().waiting === 0,
    );
    await b.context.setOffline(false);
    await b.page.waitForFunction(() => {
      const s = (window as unknown as PhoneWindow).phone.client.status();
      return s.waiting === 0 && s.conflicts.length === 1;
    });
    expect((await syncNow(a.page)).conflicts).toEqual([
      { kind: 'plates', id: 'mf-plate-1', heads: 2 },
    ]);

    // The person on phone B keeps A's test count and B's reference count.
    await b.page.evaluate(
      (p) => (window as unknown as PhoneWindow).phone.client.resolve('plates', 'mf-plate-1', p),
      { ...base, typedCounts: { test: 131, reference: 88 } },
    );
    await b.page.waitForFunction(
      () => (window as unknown as PhoneWindow).phone.client.status().waiting === 0,
    );
    expect((await syncNow(a.page)).conflicts).toEqual([]);
    expect((await syncNow(b.page)).conflicts).toEqual([]);

    const [onA, onB] = [await plates(a.page), await plates(b.page)];
    expect(onA).toEqual(onB);
    expect(onA[0]!.typedCounts).toEqual({ test: 131, reference: 88 });
    const heads = (await server.rows(
      "SELECT heads FROM records WHERE kind = 'plates' AND record_id = 'mf-plate-1'",
    )) as { heads: string }[];
    expect(JSON.parse(heads[0]!.heads)).toHaveLength(1);
    const stored = await server.rows(
      "SELECT count(*) AS n FROM revisions WHERE record_id = 'mf-plate-1'",
    );
    // The first plate, both offline edits and the resolution: nothing was thrown away.
    expect(stored).toEqual([{ n: 4 }]);
    // This page has no service worker: asking for Background Sync says no instead of waiting.
    expect(
      await a.page.evaluate(() => (window as unknown as PhoneWindow).requestBackgroundSync()),
    ).toBe(false);
    await a.context.close();
    await b.context.close();
  });
});
