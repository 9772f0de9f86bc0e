import { expect, test } from '@playwright/test';
import { openApp } from './helpers.ts';

test('what is typed survives the tab closing before it is saved', async ({ page, context }) => {
  await openApp(page);
  await page.getByRole('button', { name: 'New experiment' }).tap();
  await page.getByLabel('Experiment name').fill('Half-typed run');
  // The tab goes away and the app is opened again in a new one.
  await page.close();
  const again = await context.newPage();
  await again.goto('./');
  await expect(again.getByLabel('Experiment name')).toHaveValue('Half-typed run');
  await again.getByRole('button', { name: 'Create experiment' }).tap();
  await again.getByLabel('Generation', { exact: true }).fill('750');
  await again.reload();
  await expect(again.getByLabel('Generation', { exact: true })).toHaveValue('750');
  await again.getByRole('button', { name: 'Save assay' }).tap();
  const end = again.getByTestId('plate-L1-g750-r1-end-10000000');
  await end.getByRole('button', { name: 'Type' }).tap();
  await again.getByLabel('Test colonies').fill('61');
  await again.reload();
  await expect(again.getByLabel('Test colonies')).toHaveValue('61');
  await again.getByLabel('Reference colonies').fill('40');
  await again.getByRole('button', { name: 'Save plate' }).tap();
  await expect(end.getByTestId('plate-count')).toContainText('61 test · 40 ref');
  // Saved: the drafts are gone, a new form starts from the prefill.
  await again.reload();
  await expect(again.getByLabel('Test colonies')).toHaveCount(0);
});
