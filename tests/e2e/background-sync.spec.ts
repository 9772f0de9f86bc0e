import { expect, test } from '@playwright/test';
import type { Experiment } from '../../schema/records.ts';
import { BACKGROUND_SYNC_TAG } from '../../web/sync/background-round.ts';
import { createExperiment, waitForServiceWorker } from './helpers.ts';
import { connectedPhone, type LabServer, serverRecords, startLabServer } from './lab-server.ts';

/**
 * Background Sync: a change made with no network is sent by the service worker when the network
 * returns, with the app already closed. Chromium fires the `sync` event when it sees the network
 * come back; the test fires it through the DevTools protocol, as emulated offline is not a
 * network change the browser itself sees.
 */
let lab: LabServer;
test.beforeAll(async () => {
  lab = await startLabServer(2);
});
test.afterAll(() => lab.stop());

const experimentNames = async () =>
  (await serverRecords(lab))
    .filter((r) => r.kind === 'experiments')
    .map((r) => (r.heads[0]!.body as Experiment).name);

test('a change made offline goes to the server from the service worker after the app is closed', async ({
  browser,
}) => {
  const page = await connectedPhone(browser, lab);
  await waitForServiceWorker(page);
  const context = page.context();
  await context.setOffline(true);
  await createExperiment(page, 'Made in the cold room');
  await page.getByRole('link', { name: 'Back' }).tap();
  await expect(page.getByTestId('sync-phase')).toContainText('No network');
  // Every screen's top bar says so too.
  await expect(page.getByTestId('sync-note')).toHaveText(/^offline · \d+ waiting$/);
  // The app asked the service worker to sync once the network is back.
  await expect
    .poll(() =>
      page.evaluate(async () => {
        const reg = (await navigator.serviceWorker.ready) as ServiceWorkerRegistration & {
          sync: { getTags(): Promise<string[]> };
        };
        return reg.sync.getTags();
      }),
    )
    .toContain(BACKGROUND_SYNC_TAG);
  expect(await experimentNames()).toEqual([]);

  // The tab is closed; only a blank page stays, to talk to the browser through.
  const blank = await context.newPage();
  await page.close();
  await context.setOffline(false);
  const cdp = await context.newCDPSession(blank);
  const registrationId = new Promise<string>((found) =>
    cdp.on('ServiceWorker.workerRegistrationUpdated', ({ registrations }) => {
      const ours = registrations.find((r) => r.scopeURL.startsWith(lab.url) && !r.isDeleted);
      if (ours) found(ours.registrationId);
    }),
  );
  await cdp.send('ServiceWorker.enable');
  await cdp.send('ServiceWorker.dispatchSyncEvent', {
    origin: lab.url,
    registrationId: await registrationId,
    tag: BACKGROUND_SYNC_TAG,
    lastChance: false,
  });
  await expect.poll(experimentNames).toEqual(['Made in the cold room']);
  expect(context.pages().map((p) => p.url())).toEqual(['about:blank']);
});
