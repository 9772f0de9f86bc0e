import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, type Page } from '@playwright/test';

export const ROOT = resolve(import.meta.dirname, '../..');
export const SHOTS = resolve(ROOT, 'tests/artifacts/screenshots');
export const DEMO = resolve(ROOT, 'fixtures/demo');
mkdirSync(SHOTS, { recursive: true });

export async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: resolve(SHOTS, `${name}.png`), fullPage: true });
}

/** Opens the app and acknowledges the first-use biosafety note. */
export async function openApp(page: Page): Promise<void> {
  await page.goto('./');
  await expect(page.getByRole('dialog', { name: 'Before you photograph plates' })).toBeVisible();
  await page.getByRole('button', { name: 'Understood' }).tap();
  await expect(page.getByRole('heading', { name: 'Rivalplate' })).toBeVisible();
}

/** From the start screen: a new experiment of that name, created with the app's defaults. */
export async function createExperiment(page: Page, name: string): Promise<void> {
  await page.getByRole('button', { name: 'New experiment' }).tap();
  await page.getByLabel('Experiment name').fill(name);
  await page.getByRole('button', { name: 'Create experiment' }).tap();
}

export async function count(page: Page, cls: 0 | 1): Promise<number> {
  return Number(await page.getByTestId(`count-${cls}-value`).textContent());
}

/**
 * Taps the centre of the `nth` outlined single colony (not a clump) of class `cls` among those
 * inside the visible part of the review picture (zoomed in, most are outside it).
 */
export async function tapColony(page: Page, cls: 0 | 1, nth = 0): Promise<void> {
  // The picture from the top of the screen; the tool bar kept at its foot covers what is below.
  await page.evaluate(() => window.scrollTo(0, 0));
  const frame = (await page.getByTestId('review').boundingBox())!;
  const foot = (await page.locator('.tally').boundingBox())?.y ?? Number.POSITIVE_INFINITY;
  const marks = page.locator(
    `[data-testid=review] .colony-mark[data-cls="${cls}"][data-count="1"] circle:not(.halo)`,
  );
  let seen = 0;
  for (const mark of await marks.all()) {
    const box = await mark.boundingBox();
    if (!box) continue;
    const x = box.x + box.width / 2;
    const y = box.y + box.height / 2;
    const inside =
      x > frame.x + 10 &&
      x < frame.x + frame.width - 10 &&
      y > frame.y + 10 &&
      y < Math.min(frame.y + frame.height, foot) - 10;
    if (inside && seen++ === nth) return page.touchscreen.tap(x, y);
  }
  throw new Error(`no colony of class ${cls} in view`);
}

/** Waits until the service worker controls the page (the app is then precached). */
export async function waitForServiceWorker(page: Page): Promise<void> {
  await page.waitForFunction(() => navigator.serviceWorker?.controller !== null, null, {
    timeout: 60_000,
  });
}

/** Opens the review's "more" panel (redo, teaching colours, the picture) if it is closed. */
export async function openMore(page: Page): Promise<void> {
  const more = page.locator('details.review-more');
  if (!(await more.evaluate((d) => (d as HTMLDetailsElement).open)))
    await more.locator('summary').tap();
}

/** Marks the plate checked; a plate with a warning takes the second tap that says so. */
export async function markChecked(page: Page): Promise<void> {
  const button = page.getByTestId('mark-checked');
  await button.tap();
  if (/^Looked at/.test((await button.textContent()) ?? '')) await button.tap();
  await expect(button).toHaveText('Checked ✓');
}
