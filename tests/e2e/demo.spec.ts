import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { openApp, shot } from './helpers.ts';

test('the demo is one tap away, marked as demo data, with photos, counts and fitness trajectories', async ({
  page,
}) => {
  await openApp(page);
  await page.getByRole('button', { name: 'Set up the demo' }).tap();
  await expect(page.getByRole('heading', { name: 'Marrowfield pond project (demo)' })).toBeVisible({
    timeout: 60_000,
  });
  await expect(page.getByText('DEMO DATA — invented plates and counts')).toBeVisible();
  // The first bundled photo was read while the demo was set up, and the colours learned from it.
  await expect(page.getByRole('region', { name: 'Marker colours' })).toContainText(
    'Learned from the plates read',
  );
  await shot(page, '20-demo-bench');

  // L2 at generation 2000 carries the bundled start and end photos.
  await page.getByText('Line L2 · 6 assays').tap();
  const start = page.getByTestId('plate-L2-g2000-r1-start-100000');
  await expect(start.getByTestId('plate-count')).toContainText('(photo)');
  await start.getByRole('link', { name: 'Photo of start plate' }).tap();
  await expect(page.getByTestId('tally')).toBeVisible();
  await shot(page, '21-demo-plate');
  await page.getByRole('link', { name: 'Back' }).tap();

  // Read the bundled end photo too, then learn the colours from both plates.
  const end = page.getByTestId('plate-L2-g2000-r1-end-100000');
  await expect(end).toContainText('photo not read yet');
  await end.getByRole('link', { name: 'Photo of end plate' }).tap();
  await page.getByRole('button', { name: 'Read plate' }).tap();
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  await page.getByRole('link', { name: 'Back' }).tap();
  await page.getByRole('button', { name: 'Learn from all 2 plates read' }).tap();
  await expect(page.getByRole('region', { name: 'Marker colours' })).toContainText(
    'Learned from 2 plates; every plate re-sorted.',
  );

  await page.getByRole('link', { name: 'Fitness' }).tap();
  await expect(page.getByRole('heading', { name: 'Line L1 over generations' })).toBeVisible();
  await expect(
    page.getByRole('img', { name: 'Relative fitness of line L1 over generations' }),
  ).toBeVisible();
  await shot(page, '22-demo-fitness');
  const download = page.waitForEvent('download');
  await page
    .getByRole('region', { name: 'Line L1' })
    .getByRole('button', { name: 'Save plot (SVG)' })
    .tap();
  const svg = readFileSync(await (await download).path(), 'utf8');
  expect(svg).toMatch(/^<\?xml/);
  expect(svg).toContain('Relative fitness W (vs. ancestor)');
  expect(svg).toContain('Generations of evolution');
  // Back home, the demo is opened again rather than set up twice.
  await page.getByRole('link', { name: 'Back' }).tap();
  await expect(page.getByRole('button', { name: 'Open the demo' })).toBeVisible();
  await shot(page, '23-home-with-demo');
});
