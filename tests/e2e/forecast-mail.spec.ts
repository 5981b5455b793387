import { expect, test } from '@playwright/test';
import { LoginPage } from './pages/login-page';
import { DEMO_PASSWORD } from './pages/demo-api';

test('a buyer e-mails a supplier its forecast and the admin sees it delivered by the demo mail server', async ({
  page,
}) => {
  const login = new LoginPage(page);
  await login.open();
  await login.signIn('buyer@example.com', DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);

  await page.goto('/horizon?supplier=HSS');
  await expect(page.getByRole('heading', { name: 'Horizon', level: 1 })).toBeVisible();
  await page.getByRole('button', { name: 'E-mail forecast' }).click();
  await page.getByRole('button', { name: 'Send forecast' }).click();
  await expect(page.getByText(/Forecast for \d+ parts queued to /)).toBeVisible();

  await page.getByRole('button', { name: /sign out/i }).click();
  await login.signIn('admin@example.com', DEMO_PASSWORD);
  await page.getByRole('navigation').getByRole('link', { name: 'Outbox' }).click();
  const row = page.getByRole('row', { name: /Demand forecast .* for Heronbank/ });
  await expect(row).toBeVisible();
  // The outbox job runs every ten seconds; reload until the demo server has taken the message.
  await expect(async () => {
    await page.getByRole('button', { name: /refresh/i }).click();
    await expect(page.getByRole('row', { name: /Demand forecast .* for Heronbank/ })).toContainText('Sent', {
      timeout: 1000,
    });
  }).toPass({ timeout: 30_000 });

  await page.getByRole('tab', { name: 'Captured by the demo mail server' }).click();
  await expect(page.getByRole('cell', { name: /Demand forecast .* for Heronbank/ })).toBeVisible();
  await page.screenshot({ path: 'test-results/forecast-mail.png', fullPage: true, animations: 'disabled' });
});
