import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { markChecked, openApp, shot } from './helpers.ts';

test('the demo is one tap away, marked as demo data, with photos, counts and fitness trajectories', async ({
  page,
}) => {
  await openApp(page);
  await page.getByRole('button', { name: 'Set up the demo' }).tap();
  await expect(page.getByRole('heading', { name: 'Marrowfield pond project (demo)' })).toBeVisible({
    timeout: 60_000,
  });
  await expect(page.getByText('DEMO DATA — invented plates and counts')).toBeVisible();
  // Every bundled photo was read while the demo was set up; the colours carry the demo's names,
  // and how they look is learned only once plates are checked.
  const colours = page.getByRole('region', { name: 'Marker colours' });
  await expect(colours).toContainText('blue');
  await expect(colours).toContainText('white');
  await expect(colours).toContainText('learned from the first plates you mark checked');
  await shot(page, '20-demo-bench');

  // L2 at generation 2000 carries the bundled start and end photos.
  await page.getByText('Line L2 · 6 assays').tap();
  const start = page.getByTestId('plate-L2-g2000-r1-start-100000');
  await expect(start.getByTestId('plate-count')).toContainText('(photo)');
  const startCount = await start.getByTestId('plate-count').textContent();
  await start.getByRole('link', { name: 'Photo of start plate' }).tap();
  await expect(page.getByTestId('tally')).toBeVisible();
  await shot(page, '21-demo-plate');
  // Checked, the plate offers the next one the experiment needs: its end plate, read already.
  await markChecked(page);
  await page.getByTestId('next-plate').tap();
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  await markChecked(page);
  await page.getByRole('link', { name: 'Back' }).tap();

  // The colours learned from the two checked plates re-sort the others; the checked keep theirs.
  await page.getByRole('button', { name: 'Learn from the 2 checked plates' }).tap();
  await expect(colours).toContainText('the checked ones keep their counts');
  await expect(colours).toContainText('Learned from checked plates');
  await expect(start.getByTestId('plate-count')).toHaveText(
    startCount!.replace('(photo)', '(photo, checked)'),
  );

  await page.getByRole('link', { name: 'Fitness' }).tap();
  await expect(page.getByRole('heading', { name: 'Line L1 over generations' })).toBeVisible();
  await expect(
    page.getByRole('img', { name: 'Relative fitness of line L1 over generations' }),
  ).toBeVisible();
  await shot(page, '22-demo-fitness');
  // The demo's replicates were run on two days: each generation's lines are also compared with
  // the day as a block, as aov(W ~ block + line) and as the REML mixed model.
  const blocked = page.getByTestId('blocked-results');
  await expect(blocked).toHaveCount(3);
  await expect(blocked.first()).toContainText('Generation 500 in blocks (day 1, day 2)');
  await expect(blocked.first().getByRole('row', { name: /^line 5 / })).toBeVisible();
  await expect(blocked.first()).toContainText('SD between blocks');
  // Every pair of the six lines at each of the three generations, by Tukey's HSD.
  await expect(page.getByTestId('tukey-pairs').locator('tbody tr')).toHaveCount(3 * 15);
  // Each line against the ancestor and each line's change between generations, folded tables.
  for (const [id, header] of [
    ['lines-vs-ancestor', 'p Holm'],
    ['line-changes', 'p (Welch)'],
  ] as const) {
    const table = page.getByTestId(id);
    await expect(table.locator('thead')).toContainText(header);
    expect(await table.locator('tbody tr').count()).toBeGreaterThanOrEqual(6);
  }
  // Whether the six lines share one curve: one shared fit against six, by the F test.
  const shared = page.getByTestId('shared-curves');
  await expect(shared).toContainText(
    /hyperbolic, one curve for L1, L2, L3, L4, L5, L6 against one per line: F\(10, \d+\) = \d/,
  );
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
