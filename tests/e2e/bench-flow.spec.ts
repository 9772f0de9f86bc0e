import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import {
  count,
  createExperiment,
  DEMO,
  markChecked,
  openApp,
  openMore,
  shot,
  tapColony,
  waitForServiceWorker,
} from './helpers.ts';
import { nodeReading } from './node-reference.ts';

const START_PHOTO = resolve(DEMO, 'marrowfield-L2-day0.jpg');
const END_PHOTO = resolve(DEMO, 'marrowfield-L2-day1.jpg');

test('set up, photograph, correct by tapping, type the other sample, see W; then offline', async ({
  page,
  context,
}) => {
  await openApp(page);
  await shot(page, '01-home');

  // Experiment and first assay, with the form's defaults.
  await createExperiment(page, 'E2E pond run');
  await expect(page.getByRole('heading', { name: 'New assay' })).toBeVisible();
  await shot(page, '02-new-assay');
  // The day the assay is run, for the blocked analysis.
  await page.getByTestId('assay-block').fill('day 1');
  await page.getByRole('button', { name: 'Save assay' }).tap();
  const assay = page.getByTestId('assay-L1-g0-r1');
  await expect(assay).toBeVisible();

  // Start plate: photo from the fixtures, read in the worker.
  await assay.getByRole('link', { name: 'Photo of start plate' }).tap();
  await page.getByTestId('file-input').setInputFiles(START_PHOTO);
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  await shot(page, '03-review');
  // The app's reading (browser decode → worker → stored analysis → screen) must be the cv core's
  // reading of the same file in Node; the cv core's own tests check it against the truth.
  const reference = await nodeReading(START_PHOTO);
  const found = (await count(page, 0)) + (await count(page, 1));
  expect(Math.abs(found - reference.total)).toBeLessThanOrEqual(
    Math.max(3, reference.total * 0.05),
  );

  // Add on empty agar (outside the dish, top-left corner), remove, switch; undo and redo.
  const [a0, a1] = [await count(page, 0), await count(page, 1)];
  await page.getByTestId('tool-add-0').tap();
  const review = (await page.getByTestId('review').boundingBox())!;
  await page.touchscreen.tap(review.x + 8, review.y + 8);
  await expect(page.getByTestId('count-0-value')).toHaveText(String(a0 + 1));
  await page.getByTestId('tool-remove').tap();
  await tapColony(page, 1);
  await expect(page.getByTestId('count-1-value')).toHaveText(String(a1 - 1));
  await page.getByTestId('tool-switch').tap();
  await tapColony(page, 0, 1);
  await expect(page.getByTestId('count-0-value')).toHaveText(String(a0));
  await expect(page.getByTestId('count-1-value')).toHaveText(String(a1));
  await page.getByTestId('undo').tap();
  await expect(page.getByTestId('count-0-value')).toHaveText(String(a0 + 1));
  await expect(page.getByTestId('count-1-value')).toHaveText(String(a1 - 1));
  await openMore(page);
  await page.getByTestId('redo').tap();
  await expect(page.getByTestId('count-1-value')).toHaveText(String(a1));
  // One more colony added by hand, so the corrected count differs from the automatic one.
  await page.getByTestId('tool-add-0').tap();
  await page.touchscreen.tap(review.x + 20, review.y + 8);
  await expect(page.getByTestId('count-0-value')).toHaveText(String(a0 + 1));
  // The end plate still waits for a photo: checking this one offers the camera for it; closed
  // without a photo, the phone stays on this plate.
  await expect(page.getByTestId('mark-checked')).toHaveText('Checked · next photo');
  await markChecked(page);
  await shot(page, '04-corrected');
  const corrected = [await count(page, 0), await count(page, 1)];
  const picture = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Save picture' }).tap();
  const png = readFileSync(await (await picture).path());
  expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature

  // The running accuracy figure: one checked plate; every correction counts (two colonies
  // added, one removed, one switched), not the net difference of the totals.
  const total = corrected[0]! + corrected[1]!;
  await page.getByRole('link', { name: 'Back' }).tap();
  await page.getByRole('link', { name: 'Back' }).tap();
  await expect(page.getByTestId('accuracy')).toContainText(
    `On 1 checked plate of your own, you corrected ${(400 / total).toFixed(1)}% of the colonies (4 colonies added, removed or switched, of ${total} colonies)`,
  );
  await page.getByRole('link', { name: /E2E pond run/ }).tap();

  // The end sample typed in by hand.
  await assay
    .getByTestId('plate-L1-g0-r1-end-10000000')
    .getByRole('button', { name: 'Type' })
    .tap();
  await page.getByLabel('Test colonies').fill('180');
  await page.getByLabel('Reference colonies').fill('95');
  await page.getByRole('button', { name: 'Save plate' }).tap();
  await expect(
    assay.getByTestId('plate-L1-g0-r1-end-10000000').getByTestId('plate-count'),
  ).toContainText('180 test');
  await shot(page, '05-bench');

  // W on the Fitness tab, against the published definition computed here from the same counts:
  // W = ln(N_t,end·D / N_t,start) / ln(N_r,end·D / N_r,start) (Lenski et al. 1991, Am. Nat.
  // 138:1315), N = colonies × dilution fold / volume; the test strain is colour 2 by default.
  await page.getByRole('link', { name: 'Fitness' }).tap();
  const startDensity = (c: number) => (c * 100_000) / 0.1;
  const endDensity = (c: number) => (c * 10_000_000) / 0.1;
  const D = 100;
  const W =
    Math.log((endDensity(180) * D) / startDensity(corrected[1]!)) /
    Math.log((endDensity(95) * D) / startDensity(corrected[0]!));
  const cell = page.getByTestId('result-L1 g0 r1').getByTestId('W');
  await expect(cell).toHaveText(W.toFixed(3));
  await shot(page, '06-fitness');

  // CSV export: the fitness engine's columns, the corrected photo counts and the typed ones.
  await page.getByRole('link', { name: 'Files' }).tap();
  const download = page.waitForEvent('download');
  await page.getByTestId('export-plates').tap();
  const csv = readFileSync(await (await download).path(), 'utf8')
    .trim()
    .split(/\r\n/);
  expect(csv[0]).toBe(
    'assay,group,line,generation,replicate,sample,dilution_fold,volume_ul,test_colonies,reference_colonies,fold_dilution_since_start,days,test_marker,block',
  );
  // The evolved line's colour, as learned from the photo, names its marker.
  const marker = csv[1]!.split(',').at(-2)!;
  expect(marker).toMatch(/^[a-z][a-z -]*$/);
  expect(csv.slice(1)).toEqual([
    `L1 g0 r1,L1 g0,L1,0,1,start,100000,100,${corrected[1]},${corrected[0]},,1,${marker},day 1`,
    `L1 g0 r1,L1 g0,L1,0,1,end,10000000,100,180,95,100,1,${marker},day 1`,
  ]);
  const resultsDownload = page.waitForEvent('download');
  await page.getByTestId('export-results').tap();
  const results = readFileSync(await (await resultsDownload).path(), 'utf8')
    .trim()
    .split(/\r\n/);
  expect(results[0]).toBe(
    'assay,group,line,generation,replicate,W,W_ci_low,W_ci_high,r,r_per_day,m_test,m_ref,flags',
  );
  const row = results[1]!.split(',');
  expect(row.slice(0, 5)).toEqual(['L1 g0 r1', 'L1 g0', 'L1', '0', '1']);
  expect(Number(row[5])).toBeCloseTo(W, 10);
  await shot(page, '07-files');

  // Offline: reload from the service worker's cache; everything is still there and a new plate
  // is still read in the worker (opencv.js from the cache).
  await waitForServiceWorker(page);
  await context.setOffline(true);
  await page.reload();
  await expect(page.getByRole('heading', { name: 'E2E pond run' })).toBeVisible();
  await page.getByRole('link', { name: 'Fitness' }).tap();
  await expect(cell).toHaveText(W.toFixed(3)); // the fitness worker came from the cache too
  await page.getByRole('link', { name: 'Bench' }).tap();
  await expect(
    assay.getByTestId('plate-L1-g0-r1-end-10000000').getByTestId('plate-count'),
  ).toContainText('180 test');
  await assay.getByRole('link', { name: 'Photo of start plate' }).tap();
  await expect(page.getByTestId('count-0-value')).toHaveText(String(corrected[0]));
  await expect(page.getByTestId('count-1-value')).toHaveText(String(corrected[1]));
  await page.getByRole('link', { name: 'Back' }).tap();
  await assay.getByRole('button', { name: '+ another end plate' }).tap();
  await assay
    .getByTestId('plate-L1-g0-r1-end-100000000')
    .getByRole('link', { name: 'Photo of end plate' })
    .tap();
  await page.getByTestId('file-input').setInputFiles(END_PHOTO);
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  expect((await count(page, 0)) + (await count(page, 1))).toBeGreaterThan(0);
  await shot(page, '08-offline-review');
  await context.setOffline(false);
});
