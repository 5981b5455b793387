import { expect, test } from '@playwright/test';
import { HorizonPage } from './pages/horizon-page';
import { LoginPage } from './pages/login-page';
import { DEMO_PASSWORD } from './pages/demo-api';

/** A number as the table shows it ("1,234.5") read back. */
function quantity(text: string | null): number {
  return Number((text ?? '').replace(/,/g, '').trim());
}

test.describe('Horizon', () => {
  test('a buyer reads demand by day and week, drills into a part, exports CSV and sees a stock change arrive live', async ({
    page,
    request,
  }) => {
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('buyer@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const horizon = new HorizonPage(page);

    await horizon.open();

    await expect(horizon.heading()).toBeVisible();
    await expect(horizon.partButtons().first()).toBeVisible();
    expect(await horizon.partButtons().count()).toBeGreaterThan(5);
    await expect(horizon.chartCanvas().first()).toBeVisible();

    await horizon.showWeeks();
    await expect(page).toHaveURL(/bucket=week/);
    await expect(horizon.weekHeaders().first()).toBeVisible();
    await page.screenshot({ path: 'test-results/horizon-weeks.png', fullPage: true });

    const partNumber = (await horizon.partButtons().first().textContent())!.trim();
    await horizon.openPart(partNumber);
    await expect(page).toHaveURL(new RegExp(`part=${encodeURIComponent(partNumber)}`));
    await expect(horizon.drawer().getByRole('heading', { name: partNumber })).toBeVisible();
    await expect(horizon.drawer().getByText('Gross-to-net by working day')).toBeVisible();
    expect(await horizon.bucketRows().count()).toBeGreaterThan(3);
    await expect(horizon.drawer().locator('canvas').first()).toBeVisible();
    await horizon.closeDrawer();
    await expect(horizon.drawer()).toBeHidden();
    await horizon.clearSearch();
    await expect(horizon.partButtons().nth(1)).toBeVisible();

    const downloadEvent = page.waitForEvent('download');
    await horizon.exportButton().click();
    const download = await downloadEvent;
    expect(download.suggestedFilename()).toMatch(/\.csv$/);
    const downloadedNote = page.getByText(`Downloaded ${download.suggestedFilename()}.`);
    await expect(downloadedNote).toBeVisible();

    // Live update: change the part's on-hand through the API while its drill-down is open.
    await horizon.showDays();
    await horizon.partButtons().filter({ hasText: partNumber }).first().click();
    const before = quantity(await horizon.firstProjectedAvailable().textContent());
    await page.evaluate(() => Object.assign(window, { horizonNotReloaded: true }));
    const signIn = await request.post('/api/auth/login', {
      data: { email: 'admin@example.com', password: DEMO_PASSWORD },
    });
    const { token } = (await signIn.json()) as { token: string };
    const plan = await request.get(`/api/plan?part=${encodeURIComponent(partNumber)}`, {
      headers: { Authorization: `Bearer ${token}` },
    });
    const { part } = (await plan.json()) as { part: { onHand: number } };
    const imported = await request.post('/api/imports/on-hand', {
      headers: { Authorization: `Bearer ${token}` },
      multipart: {
        file: {
          name: 'on-hand.csv',
          mimeType: 'text/csv',
          buffer: Buffer.from(`part_number,on_hand\n${partNumber},${part.onHand + 100}\n`),
        },
      },
    });
    expect(imported.ok()).toBe(true);

    // On-hand counts at the start of the first bucket, so more stock lifts its projected available.
    await expect
      .poll(async () => quantity(await horizon.firstProjectedAvailable().textContent()), { timeout: 15_000 })
      .toBeGreaterThan(before);
    await expect(horizon.drawer().getByTestId('part-on-hand')).toHaveText(
      new RegExp(`^${(part.onHand + 100).toLocaleString('en')}\\b`),
    );
    await expect(horizon.drawerUpdatedNote()).toBeVisible();
    expect(await page.evaluate(() => (window as unknown as { horizonNotReloaded?: boolean }).horizonNotReloaded)).toBe(
      true,
    );
    await expect(downloadedNote).toBeHidden({ timeout: 10_000 });
    await page.screenshot({ path: 'test-results/horizon.png' });
  });
});
