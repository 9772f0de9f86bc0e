import { expect, type Page, test } from '@playwright/test';
import { openApp, shot } from './helpers.ts';

// The smallest phone the app is made for: no screen may scroll sideways or clip a label.
test.use({ viewport: { width: 360, height: 740 }, hasTouch: true, isMobile: true });

async function fitsWidth(page: Page, name: string) {
  await shot(page, name);
  const overflow = await page.evaluate(
    () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
  );
  expect(overflow, `${name} scrolls sideways`).toBeLessThanOrEqual(0);
}

test('the demo screens at 360 × 740', async ({ page }) => {
  await openApp(page);
  await page.getByRole('button', { name: 'Set up the demo' }).tap();
  await expect(page.getByRole('heading', { name: 'Marrowfield pond project (demo)' })).toBeVisible({
    timeout: 120_000,
  });
  await fitsWidth(page, '80-demo-bench');
  // The colours can be renamed later; their counts stay with them.
  const colours = page.getByRole('region', { name: 'Marker colours' });
  await colours.getByText('Rename the colours').tap();
  await colours.getByLabel('Colour 1').fill('ancestor blue');
  await colours.getByRole('button', { name: 'Save names' }).tap();
  await expect(colours.locator('.chip').first()).toHaveText('ancestor blue');
  await page.getByText('Line L2 · 6 assays').tap();
  await page
    .getByTestId('plate-L2-g2000-r1-start-100000')
    .getByRole('link', { name: 'Photo of start plate' })
    .tap();
  await expect(page.getByTestId('tally')).toBeVisible();
  await expect(page.getByTestId('count-0')).toContainText('ancestor blue');
  await page.locator('details.review-more summary').tap();
  await fitsWidth(page, '81-demo-review-more');
  await page.getByRole('link', { name: 'Back' }).tap();
  await page.getByRole('link', { name: 'Fitness' }).tap();
  await expect(page.getByRole('heading', { name: 'Line L1 over generations' })).toBeVisible({
    timeout: 60_000,
  });
  // The demo's photo counts are not checked: marked, and they can be hidden.
  await expect(page.getByTestId('unchecked-note')).toBeVisible();
  await fitsWidth(page, '82-demo-fitness');
  await page.getByTestId('checked-only').tap();
  await expect(page.getByTestId('unchecked-note')).toContainText('Showing checked counts only');
  await expect(page.getByTestId('unchecked')).toHaveCount(0);
  await page.getByRole('link', { name: 'Files' }).tap();
  await fitsWidth(page, '83-demo-files');
  await page.getByRole('link', { name: 'Back' }).tap();
  await fitsWidth(page, '84-home-with-demo');
});
