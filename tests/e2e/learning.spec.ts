import { resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import { count, createExperiment, DEMO, markChecked, openApp, shot, tapColony } from './helpers.ts';

const FIRST = resolve(DEMO, 'marrowfield-L2-day0.jpg');
const SECOND = resolve(DEMO, 'marrowfield-L2-day1.jpg');

test('a checked plate teaches the experiment; the next plate is read with it; a reset returns to the defaults', async ({
  page,
}) => {
  await openApp(page);
  await createExperiment(page, 'Learning run');
  await page.getByRole('button', { name: 'Save assay' }).tap();
  const assay = page.getByTestId('assay-L1-g0-r1');
  await expect(page.getByTestId('learning-state')).toContainText('Nothing learned yet');

  // First plate: read by the default analysis, one colony removed, marked checked.
  await assay.getByRole('link', { name: 'Photo of start plate' }).tap();
  await page.getByTestId('file-input').setInputFiles(FIRST);
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('read-by')).toHaveText('Read by: the default analysis.');
  const before = (await count(page, 0)) + (await count(page, 1));
  await page.getByTestId('tool-remove').tap();
  await tapColony(page, 0);
  await expect.poll(async () => (await count(page, 0)) + (await count(page, 1))).toBe(before - 1);
  await markChecked(page);
  await expect(
    page.getByText('The experiment has now learned from 1 checked plate', { exact: false }),
  ).toBeVisible({ timeout: 30_000 });

  // The experiment says what it learned.
  await page.getByRole('link', { name: 'Back' }).tap();
  await expect(page.getByTestId('learning-state')).toContainText('Learned from 1 checked plate');

  // Second plate: read with the model.
  await assay.getByRole('link', { name: 'Photo of end plate' }).tap();
  await page.getByTestId('file-input').setInputFiles(SECOND);
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('read-by')).toHaveText('Read by: learned from 1 checked plate.');
  await shot(page, '60-read-with-learning');

  // Reset: the model is forgotten, and a re-read of this plate is the default analysis again.
  await page.getByRole('link', { name: 'Back' }).tap();
  await page.getByTestId('learning-reset').tap();
  await page.getByTestId('learning-reset').tap();
  await expect(page.getByTestId('learning-state')).toContainText('Nothing learned yet');
  await assay.getByRole('link', { name: 'Photo of end plate' }).tap();
  await expect(page.getByTestId('reread-model')).toHaveText('Re-read with the default analysis');
  await page.getByTestId('reread-model').tap();
  await expect(page.getByTestId('read-by')).toHaveText('Read by: the default analysis.', {
    timeout: 60_000,
  });
});
