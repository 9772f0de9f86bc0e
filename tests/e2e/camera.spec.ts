import { expect, test } from '@playwright/test';
import { count, createExperiment, openApp, shot } from './helpers.ts';

test('the live view shows the camera with the dish ring, and a captured frame is read', async ({
  page,
}) => {
  await openApp(page);
  await createExperiment(page, 'Camera run');
  await page.getByRole('button', { name: 'Save assay' }).tap();
  await page.getByRole('link', { name: 'Photo of start plate' }).tap();
  await page.getByRole('button', { name: 'Live view' }).tap();
  const take = page.getByRole('button', { name: 'Take photo' });
  await expect(take).toBeEnabled();
  await expect(page.locator('.camera video')).toHaveJSProperty('videoWidth', 1600);
  await shot(page, '30-live-view');
  await take.tap();
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  // The fake camera shows a demo plate (global-setup.ts): its dish is found and colonies counted.
  await expect(page.getByText('Dish not found')).toHaveCount(0);
  expect((await count(page, 0)) + (await count(page, 1))).toBeGreaterThan(50);
  await shot(page, '31-live-view-read');
});
