import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, type Page, test } from '@playwright/test';
import { count, createExperiment, DEMO, openApp, openMore, shot, tapColony } from './helpers.ts';

const PHOTO = resolve(DEMO, 'marrowfield-L2-day1.jpg');

async function readOnePlate(page: Page) {
  await openApp(page);
  await createExperiment(page, 'Tools');
  await page.getByRole('button', { name: 'Save assay' }).tap();
  await page.getByRole('link', { name: 'Photo of start plate' }).tap();
  await page.getByTestId('file-input').setInputFiles(PHOTO);
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
}

const total = async (page: Page) => (await count(page, 0)) + (await count(page, 1));

test('pinch to zoom, and a tap while zoomed still hits the colony under the finger', async ({
  page,
  context,
}) => {
  await readOnePlate(page);
  const box = (await page.getByTestId('review').boundingBox())!;
  // The review opens on the dish: its outline spans the picture's width.
  const dish = (await page.locator('[data-testid=review] ellipse.dish').boundingBox())!;
  expect(dish.width / box.width).toBeGreaterThan(0.9);
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  // Two fingers spreading apart, through the DevTools protocol (Playwright taps with one).
  const cdp = await context.newCDPSession(page);
  const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', d: number) =>
    cdp.send('Input.dispatchTouchEvent', {
      type,
      touchPoints:
        type === 'touchEnd'
          ? []
          : [
              { x: cx - d, y: cy, id: 1 },
              { x: cx + d, y: cy, id: 2 },
            ],
    });
  await touch('touchStart', 20);
  for (const d of [40, 60, 80]) await touch('touchMove', d);
  await touch('touchEnd', 0);
  const transform = await page
    .locator('[data-testid=review] svg > g, [data-testid=review] > g')
    .first()
    .getAttribute('transform');
  const scale = Number(/scale\(([\d.]+)\)/.exec(transform ?? '')?.[1]);
  expect(scale).toBeGreaterThan(2.5);
  await shot(page, '40-zoomed');

  const before = await total(page);
  await page.getByTestId('tool-remove').tap();
  await tapColony(page, 0, 0);
  await expect.poll(() => total(page)).toBe(before - 1);
});

test('teach colours by tapping one colony of each; drag the dish smaller and re-read inside it', async ({
  page,
}) => {
  await readOnePlate(page);
  await openMore(page);
  await page.getByTestId('tool-teach').tap();
  // The first colony tapped is of colour 1, the second of colour 2 (the experiment's names).
  await tapColony(page, 0);
  await expect(page.getByText('Now tap one white colony.').first()).toBeVisible();
  await tapColony(page, 1);
  await expect(page.getByText('Colours taught.')).toBeVisible({ timeout: 30_000 });

  const before = await total(page);
  const rim = page.locator('[data-testid=review] .dish-handle[data-handle=rim]');
  const centre = (await page
    .locator('[data-testid=review] .dish-handle[data-handle=centre]')
    .boundingBox())!;
  const r = (await rim.boundingBox())!;
  const from = { x: r.x + r.width / 2, y: r.y + r.height / 2 };
  const c0 = { x: centre.x + centre.width / 2, y: centre.y + centre.height / 2 };
  // Halfway to the centre along the handle's own axis (the outline may be turned).
  const to = { x: c0.x + (from.x - c0.x) / 2, y: c0.y + (from.y - c0.y) / 2 };
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move((from.x + to.x) / 2, to.y);
  await page.mouse.move(to.x, to.y);
  await page.mouse.up();
  // The side handle sets the second axis alone: the outline gets more oval, keeps its first axis.
  const ellipse = page.locator('[data-testid=review] ellipse.dish');
  const rx = Number(await ellipse.getAttribute('rx'));
  const ry = Number(await ellipse.getAttribute('ry'));
  const side = (await page
    .locator('[data-testid=review] .dish-handle[data-handle=side]')
    .boundingBox())!;
  const s0 = { x: side.x + side.width / 2, y: side.y + side.height / 2 };
  await page.mouse.move(s0.x, s0.y);
  await page.mouse.down();
  // A fifth of the way towards the centre.
  await page.mouse.move(s0.x + (c0.x - s0.x) * 0.1, s0.y + (c0.y - s0.y) * 0.1);
  await page.mouse.move(s0.x + (c0.x - s0.x) * 0.2, s0.y + (c0.y - s0.y) * 0.2);
  await page.mouse.up();
  expect(Number(await ellipse.getAttribute('ry'))).toBeLessThan(ry);
  expect(Number(await ellipse.getAttribute('rx'))).toBe(rx);
  await page.getByRole('button', { name: 'Re-read inside the moved dish' }).tap();
  // Half the radius, a quarter of the area: far fewer colonies inside.
  await expect.poll(() => total(page), { timeout: 60_000 }).toBeLessThan(before * 0.6);
  await shot(page, '41-smaller-dish');
  await page.getByRole('link', { name: 'Back' }).tap();
  await expect(page.getByRole('region', { name: 'Marker colours' })).toContainText(
    'Taught by tapping',
  );
});

test('a photo stored sideways with an EXIF orientation is read upright', async ({ page }) => {
  const rotated = resolve(DEMO, 'marrowfield-L5-day1-rotated.jpg');
  // Reference: the generator's truth file gives the dish in upright pixels of a 1600 × 1200
  // picture; the file itself is stored 1200 × 1600 with EXIF orientation 6.
  const truth = JSON.parse(readFileSync(rotated.replace('.jpg', '.truth.json'), 'utf8'));
  await openApp(page);
  await createExperiment(page, 'Sideways');
  await page.getByRole('button', { name: 'Save assay' }).tap();
  await page.getByRole('link', { name: 'Photo of start plate' }).tap();
  await page.getByTestId('file-input').setInputFiles(rotated);
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  const image = page.locator('[data-testid=review] image');
  await expect(image).toHaveAttribute('width', '1600');
  await expect(image).toHaveAttribute('height', '1200');
  const dish = page.locator('[data-testid=review] ellipse.dish');
  expect(Math.abs(Number(await dish.getAttribute('cx')) - truth.dish.cx)).toBeLessThan(20);
  expect(Math.abs(Number(await dish.getAttribute('cy')) - truth.dish.cy)).toBeLessThan(20);
  await shot(page, '42-exif-upright');
});
