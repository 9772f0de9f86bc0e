import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, type Locator, type Page, test } from '@playwright/test';
import {
  type Correction,
  correctionsFromTruth,
  marksOnScreen,
  truthColourAt,
} from './bench-run-plates.ts';
import { count, DEMO, openApp, shot } from './helpers.ts';

// A small phone, held in one hand: every screen must fit its width.
test.use({ viewport: { width: 360, height: 740 }, hasTouch: true, isMobile: true });

const PHOTOS = [
  'marrowfield-L2-day0',
  'marrowfield-L2-day1',
  'marrowfield-L3-day1-glare',
  'marrowfield-L4-day1-tilted',
  'marrowfield-L5-day1-rotated',
  'marrowfield-L6-day1-mostly-blue',
];
const LINES = ['L1', 'L2', 'L3', 'L4', 'L5', 'L6'];
/** Corrections made on one plate at most (the rest of a plate's misreads would be alike). */
const MOST_CORRECTIONS = 4;

/** Every tap of the run, and the ones that were corrections (a colony added, removed, switched). */
class Taps {
  all = 0;
  corrections = 0;
  async on(target: Locator) {
    this.all++;
    await target.tap();
  }
  async at(page: Page, x: number, y: number) {
    this.all++;
    await page.touchscreen.tap(x, y);
  }
}

async function fitsWidth(page: Page, name: string) {
  await shot(page, name);
  const overflow = await page.evaluate(
    () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
  );
  expect(overflow, `${name} scrolls sideways`).toBeLessThanOrEqual(0);
}

/**
 * A person scrolls until the colony is clear of the tool bar before tapping it; a tap on a
 * colony hidden under the bar would land on the bar. (Scrolling is not a tap.)
 */
async function bringIntoView(page: Page, c: Correction) {
  const { d, f } = await marksOnScreen(page);
  const y = c.y * d + f;
  const bar = await page.getByRole('toolbar', { name: 'Tools' }).boundingBox();
  const viewport = page.viewportSize()!;
  const bottom = Math.min(viewport.height, bar?.y ?? viewport.height) - 24;
  const top = 64;
  if (y > bottom || y < top)
    await page.evaluate((dy) => window.scrollBy(0, dy), y - (top + bottom) / 2);
}

const total = async (page: Page) => (await count(page, 0)) + (await count(page, 1));

/**
 * One correction by tapping; the tool is picked first when another one is held. A colour tool
 * both adds colonies of its colour and gives a colony of the other colour its colour.
 */
async function correct(page: Page, taps: Taps, c: Correction, held: { tool: string | null }) {
  const tool = c.op === 'remove' ? 'tool-remove' : `tool-add-${c.cls}`;
  if (held.tool !== tool) {
    await taps.on(page.getByTestId(tool));
    held.tool = tool;
  }
  await bringIntoView(page, c);
  const { a, d, e, f } = await marksOnScreen(page);
  const before = [await count(page, 0), await count(page, 1)];
  await taps.at(page, c.x * a + e, c.y * d + f);
  taps.corrections++;
  await expect.poll(async () => [await count(page, 0), await count(page, 1)]).not.toEqual(before);
}

test('a bench run of 12 plates from the camera screen to checked counts', async ({ page }) => {
  test.setTimeout(600_000);
  await openApp(page);
  await fitsWidth(page, '60-home');

  // The experiment, with the indicator medium of the demo plates (blue and white colonies).
  await page.getByRole('button', { name: 'New experiment' }).tap();
  await page.getByLabel('Experiment name').fill('Bench run');
  await page.getByLabel('Evolved lines').fill(LINES.join(', '));
  await page.getByLabel('Indicator medium').selectOption('x-gal');
  await fitsWidth(page, '61-new-experiment');
  await page.getByRole('button', { name: 'Create experiment' }).tap();
  await expect(page.getByRole('heading', { name: 'New assay' })).toBeVisible();
  await fitsWidth(page, '62-new-assay');
  for (const [i, line] of LINES.entries()) {
    await page.getByRole('combobox', { name: 'Line' }).selectOption(line);
    // Each line at generation 0 is a group of its own: its replicates start at 1.
    await expect(page.getByLabel('Replicate', { exact: true })).toHaveValue('1');
    const last = i === LINES.length - 1;
    await page.getByRole('button', { name: last ? 'Save assay' : 'Save, next replicate' }).tap();
  }
  await expect(page.getByTestId('assay-L6-g0-r1')).toBeAttached();
  await fitsWidth(page, '63-bench');

  // The run: from the first plate's camera screen, each checked plate offers the next.
  await page
    .getByTestId('assay-L1-g0-r1')
    .getByRole('link', { name: 'Photo of start plate' })
    .tap();
  const taps = new Taps();
  let warned = 0;
  let stepped = false;
  const plates = LINES.length * 2;
  const photoFile = (n: number) => resolve(DEMO, `${PHOTOS[n % PHOTOS.length]}.jpg`);
  // The first plate's photo from its camera screen; each later one from the check before it.
  await expect(page.getByTestId('place')).toBeVisible();
  await fitsWidth(page, '64-camera');
  const first = page.waitForEvent('filechooser');
  await taps.on(page.getByText('From photos'));
  await (await first).setFiles(photoFile(0));
  for (let n = 0; n < plates; n++) {
    const photo = PHOTOS[n % PHOTOS.length]!;
    await expect(page.getByTestId('tally')).toBeVisible({ timeout: 90_000 });
    await expect(page.getByTestId('place')).toHaveCount(0);
    if (n === 0) await fitsWidth(page, '65-review');

    // The colonies the reading was unsure of, once, one by one, answered as the plate shows them.
    const truthFile = resolve(DEMO, `${photo}.truth.json`);
    const unsure = page.getByTestId('step-unsure');
    if (!stepped && (await unsure.isVisible())) {
      stepped = true;
      await taps.on(unsure);
      await fitsWidth(page, '66-unsure');
      const step = page.getByTestId('unsure');
      for (let k = 0; k < 3 && (await step.isVisible()); k++) {
        const ring = step.locator('circle');
        const [x, y] = [
          Number(await ring.getAttribute('cx')),
          Number(await ring.getAttribute('cy')),
        ];
        const shown = Number(
          await step
            .locator('[aria-pressed=true]')
            .getAttribute('data-testid')
            .then((t) => t?.slice(-1)),
        );
        const real = truthColourAt(truthFile, (await marksOnScreen(page)).marks, x, y);
        await taps.on(step.getByTestId(real === null ? 'answer-none' : `answer-${real}`));
        if (real !== shown) taps.corrections++;
      }
    }

    const screen = await marksOnScreen(page);
    const fixes = correctionsFromTruth(truthFile, screen.marks, screen.a, MOST_CORRECTIONS);
    const held = { tool: null as string | null };
    // One tool after the other: each colour (adding and recolouring), then removing.
    const order = (c: Correction) => (c.op === 'remove' ? 2 : c.cls);
    for (const c of [...fixes].sort((a, b) => order(a) - order(b)))
      await correct(page, taps, c, held);
    expect(await total(page)).toBeGreaterThan(0);

    // The check: with a plate still waiting, the same tap opens the camera for it.
    const last = n === plates - 1;
    const chooser = last ? null : page.waitForEvent('filechooser');
    const check = page.getByTestId('mark-checked');
    await expect(check).toHaveText(last ? 'Mark checked' : 'Checked · next photo');
    await taps.on(check);
    if (/^Looked at/.test((await check.textContent()) ?? '')) {
      // A plate with a warning on the whole plate: the second tap says what the person looked at.
      warned++;
      if (warned === 1) await fitsWidth(page, '67-check-warning');
      await taps.on(check);
    }
    if (chooser) {
      await (await chooser).setFiles(photoFile(n + 1));
      // The next plate's place, large, while its photo is read.
      await expect(page.getByTestId('place')).toBeVisible();
      if (n === 0) await fitsWidth(page, '68-next-reading');
    } else {
      await expect(check).toHaveText('Checked ✓');
      await expect(page.getByTestId('next-plate')).toHaveCount(0);
    }
  }

  const beyond = (taps.all - taps.corrections) / plates;
  // Every tap of the run is counted, the ones that open the next plate's camera included; only
  // the photo picker's own choice of a file (the phone's, outside the app) is not a tap here.
  console.log(
    `bench run: ${plates} plates, ${taps.all} taps, ${taps.corrections} corrections, ${warned} plates with a warning on the whole plate`,
  );
  console.log(`taps beyond corrections per plate: ${beyond.toFixed(2)}`);
  expect(beyond).toBeLessThanOrEqual(3);

  // Every plate of the experiment is checked; the Fitness tab has all six assays from checked counts.
  await page.getByRole('link', { name: 'Back' }).tap();
  await expect(page.getByText('photo, checked')).toHaveCount(plates);
  await page.getByRole('link', { name: 'Fitness' }).tap();
  await expect(page.getByTestId('assay-results')).toBeVisible({ timeout: 60_000 });
  // Every count was checked: nothing is marked as resting on unchecked counts.
  await expect(page.getByTestId('unchecked')).toHaveCount(0);
  await fitsWidth(page, '69-fitness');

  // The plate table names the evolved line's colour as the experiment does.
  await page.getByRole('link', { name: 'Files' }).tap();
  const download = page.waitForEvent('download');
  await page.getByTestId('export-plates').tap();
  const csv = readFileSync(await (await download).path(), 'utf8')
    .trim()
    .split(/\r\n/);
  const markerAt = csv[0]!.split(',').indexOf('test_marker');
  expect(new Set(csv.slice(1).map((row) => row.split(',')[markerAt]))).toEqual(new Set(['white']));
  await expect(page.getByText(/^Saved bench-run-plates\.csv/)).toBeVisible();
  await fitsWidth(page, '70-files');
});
