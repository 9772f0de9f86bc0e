import { devices, expect, test } from '@playwright/test';
import { shot } from './helpers.ts';
import { connectedPhone, type LabServer, startLabServer } from './lab-server.ts';

/** Two phones share plates through the lab's real sync server. */
let lab: LabServer;
test.beforeAll(async () => {
  lab = await startLabServer(0);
});
test.afterAll(() => lab.stop());

test('an experiment made on one phone arrives on another through the lab server', async ({
  browser,
}) => {
  const a = await connectedPhone(browser, lab);
  await a.getByRole('button', { name: 'New experiment' }).tap();
  await a.getByLabel('Experiment name').fill('Shared run');
  await a.getByRole('button', { name: 'Create experiment' }).tap();
  await a.getByRole('button', { name: 'Save assay' }).tap();
  await a.getByRole('link', { name: 'Back' }).tap();
  await a.getByRole('button', { name: 'Share now' }).tap();
  await expect(a.getByText(/^0 changes waiting/)).toBeVisible();
  await shot(a, '60-sync-phone-a');

  const b = await connectedPhone(browser, lab);
  await b.getByRole('button', { name: 'Share now' }).tap();
  await expect(b.getByRole('link', { name: /Shared run/ })).toBeVisible();
  await b.getByRole('link', { name: /Shared run/ }).tap();
  await expect(b.getByTestId('assay-L1-g0-r1')).toBeVisible();
  await shot(b, '61-sync-phone-b');
});

test('a wrong token is refused with the server’s reason, and the phone keeps working alone', async ({
  browser,
}) => {
  const context = await browser.newContext({ ...devices['Pixel 7'], serviceWorkers: 'allow' });
  const page = await context.newPage();
  await page.goto(`${lab.url}/`);
  await page.getByRole('button', { name: 'Understood' }).tap();
  await page.getByText("Share this phone's plates with the lab server").tap();
  await page.getByLabel('Server address').fill(lab.url);
  await page.getByLabel('Token').fill('not-a-token');
  await page.getByRole('button', { name: 'Connect' }).tap();
  await expect(page.locator('.field-error')).toContainText(/token/i);
  await expect(page.getByTestId('sync-phase')).toHaveText(
    'Not shared: everything stays on this phone.',
  );
});
