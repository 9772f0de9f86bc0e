import { readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import { E2E_DIST } from '../../playwright.config.ts';
import { openApp, ROOT, waitForServiceWorker } from './helpers.ts';

const SW = resolve(ROOT, E2E_DIST, 'sw.js');

test('a new version installs in the background and is offered, not forced', async ({ page }) => {
  await openApp(page);
  await waitForServiceWorker(page);
  await page.getByRole('button', { name: 'New experiment' }).tap();
  await page.getByLabel('Experiment name').fill('Mid-work');
  const original = readFileSync(SW, 'utf8');
  try {
    // A deployment: the service worker file changes by a byte.
    writeFileSync(SW, `${original}\n// next version\n`);
    await page.evaluate(() => navigator.serviceWorker.getRegistration().then((r) => r?.update()));
    const offer = page.getByRole('button', { name: 'Switch now' });
    await expect(offer).toBeVisible({ timeout: 30_000 });
    // Nothing was reloaded under the person: the half-typed form is still on screen.
    await expect(page.getByLabel('Experiment name')).toHaveValue('Mid-work');
    await page.evaluate(() => {
      (window as unknown as { oldVersion: boolean }).oldVersion = true;
    });
    await offer.tap();
    // The new version took over and the page was reloaded into it, at the person's word.
    await page.waitForFunction(() => !(window as unknown as { oldVersion?: boolean }).oldVersion);
    await expect(offer).toHaveCount(0);
    await expect(page.getByLabel('Experiment name')).toHaveValue('Mid-work');
  } finally {
    writeFileSync(SW, original);
  }
});
