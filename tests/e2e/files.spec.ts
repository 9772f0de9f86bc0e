import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect, test } from '@playwright/test';
import { analyse } from '../../fitness/analysis.ts';
import { readCompetitionCsv } from '../../fitness/competition-csv.ts';
import { createExperiment, openApp, ROOT, shot } from './helpers.ts';

const EXAMPLE = resolve(ROOT, 'fixtures/example-competition.csv');

/** The files of a zip whose entries are stored uncompressed (local headers read in order). */
function storedZipEntries(zip: Buffer): Map<string, string> {
  const files = new Map<string, string>();
  let at = 0;
  while (zip.readUInt32LE(at) === 0x04034b50) {
    expect(zip.readUInt16LE(at + 8)).toBe(0); // stored
    const size = zip.readUInt32LE(at + 18);
    const nameLength = zip.readUInt16LE(at + 26);
    const extra = zip.readUInt16LE(at + 28);
    const name = zip.toString('utf8', at + 30, at + 30 + nameLength);
    const start = at + 30 + nameLength + extra;
    files.set(name, zip.toString('utf8', start, start + size));
    at = start + size;
  }
  return files;
}

test('a plate CSV is imported into an experiment and its fitness computed; a bad file is named', async ({
  page,
}) => {
  await openApp(page);
  await createExperiment(page, 'Imported');
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
  // L1 at generation 2000 was competed in both colours; the engine run on the file in Node gives
  // the average the app must show, its markers named by the experiment's colours (the form's
  // default medium names them red and white, as the example file's test_marker does).
  const [both] = analyse(readCompetitionCsv(readFileSync(EXAMPLE, 'utf8')).assays).reciprocal;
  const bothRow = page.getByRole('region', { name: 'Both colours' }).getByRole('row').nth(1);
  await expect(bothRow).toContainText(`L1${both!.generation}red (n = 3)white (n = 3)`);
  await expect(bothRow).toContainText(both!.meanW.toFixed(3));
  await shot(page, '50-imported-fitness');

  // Corrected for the marker effect, a group's interval carries the controls' uncertainty: the
  // app shows what the engine run on the file in Node gives (the engine is checked against R in
  // fitness/marker-correction.test.ts).
  const corrected = analyse(readCompetitionCsv(readFileSync(EXAMPLE, 'utf8')).assays, {
    correctMarker: true,
  }).groups.find((g) => g.group === 'L3-1000')!;
  await page.getByTestId('correct-marker').tap();
  await expect(page.getByTestId('marker-effect')).toContainText(
    'The other assays were corrected by it',
  );
  const row = page.getByTestId('group-results').getByRole('row', { name: /^L3-1000 / });
  const [low, high] = corrected.W.ci!;
  await expect(row).toContainText(`${low.toFixed(3)}–${high.toFixed(3)}`);
  await expect(row).toContainText(corrected.W.mean.toFixed(3));
  await page.getByTestId('correct-marker').tap();
  await expect(page.getByTestId('marker-effect')).toContainText('Not applied to the other assays');

  // The tidy tables as a zip: each file read back from the stored entries.
  await page.getByRole('link', { name: 'Files' }).tap();
  const download = page.waitForEvent('download');
  await page.getByTestId('export-tables').tap();
  const zip = readFileSync(await (await download).path());
  const files = storedZipEntries(zip);
  expect([...files.keys()]).toEqual([
    'assays.csv',
    'groups.csv',
    'comparisons.csv',
    'models.csv',
    'model_parameters.csv',
    'curve_points.csv',
  ]);
  const models = files.get('models.csv')!.trim().split(/\r\n/);
  expect(models[0]).toMatch(/^line,model,fitted,reason,n,k,rss/);
  // Six lines (L1–L6), four models each: null, hyperbolic, power law, step.
  expect(models).toHaveLength(1 + 6 * 4);

  // Deleting the experiment takes two taps and leaves the start screen empty.
  await page.getByRole('link', { name: 'Files' }).tap();
  await page.getByRole('button', { name: 'Delete experiment' }).tap();
  await page.getByRole('button', { name: 'Tap again to delete it all' }).tap();
  await expect(page.getByText('No experiments of your own on this device yet.')).toBeVisible();
});

test('a file that is not a photo, or an empty one, gets a message naming it and nothing breaks', async ({
  page,
}) => {
  await openApp(page);
  await createExperiment(page, 'Bad files');
  await page.getByRole('button', { name: 'Save assay' }).tap();
  await page.getByRole('link', { name: 'Photo of start plate' }).tap();
  await page.getByTestId('file-input').setInputFiles({
    name: 'notes.jpg',
    mimeType: 'image/jpeg',
    buffer: Buffer.from('plate 3: 120 blue, 80 cream'),
  });
  await expect(page.getByRole('alert')).toContainText(
    'notes.jpg: not a picture this browser can read',
  );
  await page.getByText('Replace the photo').tap();
  await page
    .getByTestId('file-input')
    .last()
    .setInputFiles({ name: 'empty.jpg', mimeType: 'image/jpeg', buffer: Buffer.alloc(0) });
  await expect(page.getByRole('alert')).toContainText('empty.jpg: the file is empty');
  await shot(page, '51-bad-photo');
  // The app still works: a real photo after the bad ones is read.
  await page.getByText('Replace the photo').tap();
  await page
    .getByTestId('file-input')
    .last()
    .setInputFiles(resolve(ROOT, 'fixtures/demo/marrowfield-L2-day0.jpg'));
  await expect(page.getByTestId('tally')).toBeVisible({ timeout: 60_000 });
});

test('a stored record the app cannot read is listed on the start screen, which and why, and exported as it is', async ({
  page,
}) => {
  await openApp(page);
  // An assay as an app of a later record format would store it: this one must not half-read it.
  const later = {
    id: 'later-assay-1',
    revision: 1,
    updatedAt: '2026-05-01T08:00:00.000Z',
    format: 99,
    experimentId: 'later-exp',
    line: 'L1',
  };
  await page.evaluate(
    (record) =>
      new Promise<void>((done, failed) => {
        const open = indexedDB.open('rivalplate');
        open.onerror = () => failed(open.error);
        open.onsuccess = () => {
          const tx = open.result.transaction('assays', 'readwrite');
          tx.objectStore('assays').put(record);
          tx.oncomplete = () => {
            open.result.close();
            done();
          };
          tx.onerror = () => failed(tx.error);
        };
      }),
    later,
  );
  await page.reload();
  const card = page.getByRole('region', { name: 'Unreadable records' });
  await expect(card).toContainText('Records this phone cannot read');
  await expect(card).toContainText('later-assay-1');
  await expect(card).toContainText('written by a newer version of the app (record format 99');
  const download = page.waitForEvent('download');
  await card.getByRole('button', { name: 'Export them as they are' }).tap();
  const file = JSON.parse(readFileSync(await (await download).path(), 'utf8')) as {
    format: string;
    records: { kind: string; id: string; raw: unknown }[];
  };
  expect(file.format).toBe('rivalplate-unreadable');
  expect(file.records).toEqual([
    expect.objectContaining({ kind: 'assays', id: 'later-assay-1', raw: later }),
  ]);
});
