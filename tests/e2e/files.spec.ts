import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import { readCompetitionCsv } from '../../fitness/competition-csv.ts';
import { openApp, ROOT, shot } from './helpers.ts';

const EXAMPLE = resolve(ROOT, 'fixtures/example-competition.csv');

test('a plate CSV is imported into an experiment and its fitness computed; a bad file is named', async ({
  page,
}) => {
  await openApp(page);
  await page.getByRole('button', { name: 'New experiment' }).tap();
  await page.getByLabel('Experiment name').fill('Imported');
  await page.getByRole('button', { name: 'Create experiment' }).tap();
  await page.getByRole('button', { name: 'Close' }).tap();
  await page.getByRole('link', { name: 'Files' }).tap();

  await page.getByTestId('import-csv').setInputFiles({
    name: 'broken.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from('assay,group\nA1,g\n'),
  });
  await expect(page.getByRole('status')).toContainText('broken.csv');
  await expect(page.getByRole('status')).toContainText('missing column(s)');

  await page.getByTestId('import-csv').setInputFiles(EXAMPLE);
  // Reference: the fitness engine's own reader counts the assays in its example file.
  const assays = readCompetitionCsv(readFileSync(EXAMPLE, 'utf8')).assays.length;
  await expect(page.getByRole('status')).toContainText(`${assays} assays added`);
  await page.getByRole('link', { name: 'Fitness' }).tap();
  await expect(
    page.getByRole('heading', { name: `Relative fitness per assay (${assays})` }),
  ).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Line L6 over generations' })).toBeVisible();
  // The example's four marker-control assays (fixtures/example-competition.csv).
  await expect(page.getByTestId('marker-effect')).toContainText('marker-control, n = 4');
  await shot(page, '50-imported-fitness');
});
