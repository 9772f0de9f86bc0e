import { expect, test } from '@playwright/test';
import { createExperiment, shot } from './helpers.ts';
import { connectedPhone, type LabServer, phoneConnecting, startLabServer } from './lab-server.ts';

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
  await createExperiment(a, 'Shared run');
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
  const page = await phoneConnecting(browser, lab, 'not-a-token');
  await expect(page.locator('.field-error')).toContainText(/token/i);
  await expect(page.getByTestId('sync-phase')).toHaveText(
    'Not shared: everything stays on this phone.',
  );
});
