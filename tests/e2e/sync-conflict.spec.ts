import { resolve } from 'node:path';
import { expect, type Page, test } from '@playwright/test';
import type { Corrections } from '../../schema/records.ts';
import { count, createExperiment, DEMO, shot, tapColony } from './helpers.ts';
import { connectedPhone, type LabServer, serverRecords, startLabServer } from './lab-server.ts';

/**
 * Two phones correct the same plate with no network, come back online, and the edit made on
 * both is shown as a conflict and settled in the app, with nothing lost: the server and both
 * phones end with the taps of both.
 */
let lab: LabServer;
test.beforeAll(async () => {
  lab = await startLabServer(1);
});
test.afterAll(() => lab.stop());

const PHOTO = resolve(DEMO, 'marrowfield-L2-day1.jpg');

const counts = async (page: Page) => [await count(page, 0), await count(page, 1)];

async function shareNow(page: Page): Promise<void> {
  await page.getByRole('link', { name: 'Back' }).tap();
  await page.getByRole('link', { name: 'Back' }).tap();
  await page.getByRole('button', { name: 'Share now' }).tap();
  await expect(page.getByText(/^0 changes waiting/)).toBeVisible();
}

async function openPlate(page: Page): Promise<void> {
  await page.getByRole('link', { name: /Offline taps/ }).tap();
  await page.getByRole('link', { name: 'Photo of start plate' }).tap();
}

/** The corrections the lab server holds now, by their heads (more than one: a conflict). */
async function serverCorrections(): Promise<Corrections[][]> {
  return (await serverRecords(lab))
    .filter((r) => r.kind === 'corrections')
    .map((r) => r.heads.map((h) => h.body as Corrections));
}

test('both phones correct one plate offline; the conflict is shown and the merge keeps both phones’ taps', async ({
  browser,
}) => {
  const a = await connectedPhone(browser, lab);
  await createExperiment(a, 'Offline taps');
  await a.getByRole('button', { name: 'Save assay' }).tap();
  await a.getByRole('link', { name: 'Photo of start plate' }).tap();
  await a.getByTestId('file-input').setInputFiles(PHOTO);
  await expect(a.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  const read = await counts(a);
  await shareNow(a);

  // The second phone gets the plate's reading and fetches its photo from the server.
  const b = await connectedPhone(browser, lab);
  await b.getByRole('button', { name: 'Share now' }).tap();
  await openPlate(b);
  await b.getByRole('button', { name: 'Fetch the photo' }).tap();
  await expect(b.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
  expect(await counts(b)).toEqual(read);

  // No network on either phone; each removes a colony of a different colour.
  await a.context().setOffline(true);
  await b.context().setOffline(true);
  await openPlate(a);
  for (const [page, cls] of [
    [a, 0],
    [b, 1],
  ] as const) {
    await expect(page.getByTestId('tally')).toBeVisible();
    await page.getByTestId('tool-remove').tap();
    await tapColony(page, cls);
    await expect.poll(() => count(page, cls)).toBe(read[cls]! - 1);
  }

  await a.context().setOffline(false);
  await b.context().setOffline(false);
  await shareNow(a);
  await shareNow(b);
  // The second push finds the first phone's taps there first: both versions are kept.
  await expect(b.getByTestId('conflict-corrections')).toBeVisible();
  // The card says which plate, with a link to it.
  await expect(
    b
      .getByTestId('conflict-corrections')
      .getByRole('link', { name: 'L1 g0 r1 · start · 1:100,000' }),
  ).toBeVisible();
  expect((await serverCorrections()).map((heads) => heads.length)).toEqual([2]);
  await shot(b, '62-sync-conflict');

  await b.getByRole('button', { name: 'Merge the taps' }).tap();
  await expect(b.getByText('Taps from both phones merged.')).toBeVisible();
  await b.getByRole('button', { name: 'Share now' }).tap();
  await expect(b.getByText(/^0 changes waiting/)).toBeVisible();
  await a.getByRole('button', { name: 'Share now' }).tap();
  await expect(a.getByTestId('conflict-corrections')).toHaveCount(0);
  await expect(b.getByTestId('conflict-corrections')).toHaveCount(0);

  // One version on the server, with both removals; both phones count the merged plate alike.
  const [heads] = await serverCorrections();
  expect(heads).toHaveLength(1);
  expect(heads![0]!.edits.filter((e) => e.op === 'remove')).toHaveLength(2);
  const merged = [read[0]! - 1, read[1]! - 1];
  for (const page of [a, b]) {
    await openPlate(page);
    await expect.poll(() => counts(page)).toEqual(merged);
  }
});
