import { readFile } from 'node:fs/promises';
import { expect, test } from '@playwright/test';
import { LoginPage } from './pages/login-page';
import { SupplierAccountPage } from './pages/supplier-account-page';
import { DEMO_PASSWORD } from './pages/demo-api';

// The demo's battery supplier (FBS) contact: lead time 7 working days, so the plan's horizon
// holds firm, planned and forecast days.
const SUPPLIER_CONTACT = 'ferncombe.lena@example.net';

test('a supplier signs in, reads its forecast by zone, downloads it as CSV and opens its scorecard', async ({
  page,
}) => {
  const login = new LoginPage(page);
  await login.open();
  await login.signIn(SUPPLIER_CONTACT, DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);
  const account = new SupplierAccountPage(page);

  await account.openFromRail();

  await expect(page).toHaveURL(/\/supplier$/);
  await expect(account.forecastTable()).toBeVisible();
  await expect(account.zoneCells('firm').first()).toBeVisible();
  await expect(account.zoneCells('planned').first()).toBeVisible();
  await expect(account.zoneCells('forecast').first()).toBeVisible();
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.screenshot({ path: 'test-results/supplier-account-1440.png', fullPage: true });

  const downloading = page.waitForEvent('download');
  await account.downloadButton().click();
  const download = await downloading;
  expect(download.suggestedFilename()).toMatch(/^forecast-FBS-\d{4}-\d{2}-\d{2}\.csv$/);
  const csv = await readFile((await download.path())!, 'utf8');
  const [header, ...rows] = csv.trim().split(/\r?\n/);
  expect(header).toBe('part_number,description,uom,date,qty,zone');
  expect(rows.length).toBeGreaterThan(0);
  expect(new Set(rows.map((row) => row.split(',').at(-1)))).toEqual(new Set(['firm', 'planned', 'forecast']));

  await account.openScorecard();
  await expect(page).toHaveURL(/\/suppliers\/performance$/);
  await expect(page.getByRole('heading', { name: 'Supplier performance' })).toBeVisible();
  // Its own figures only: no supplier to choose.
  await expect(page.getByRole('combobox', { name: 'Supplier' })).toHaveCount(0);
  await page.screenshot({ path: 'test-results/supplier-scorecard-1440.png', fullPage: true });

  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto('/supplier');
  await expect(account.forecastTable()).toBeVisible();
  await page.screenshot({ path: 'test-results/supplier-account-390.png', fullPage: true });
});
