import { expect, test } from '@playwright/test';
import { LoginPage } from './pages/login-page';
import { DEMO_PASSWORD } from './pages/demo-api';

test.describe('signing in', () => {
  test('a buyer signs in through the page and sees the shell with their role', async ({ page }) => {
    const login = new LoginPage(page);
    await login.open();

    await login.signIn('buyer@example.com', DEMO_PASSWORD);

    await expect(page).toHaveURL(/\/$/);
    const navigation = page.getByRole('navigation');
    await expect(navigation).toBeVisible();
    await expect(page.getByText('Cardloop').first()).toBeVisible();
    await expect(page.getByRole('button', { name: /sign out/i })).toBeVisible();
    await expect(navigation.getByRole('link', { name: 'Users' })).toHaveCount(0);
    await page.screenshot({ path: 'test-results/shell-buyer.png', fullPage: true });
  });

  test('a wrong password shows the server’s message and stays on the page', async ({ page }) => {
    const login = new LoginPage(page);
    await login.open();

    await login.signIn('buyer@example.com', 'not-the-password');

    await expect(login.errorMessage()).toContainText('E-mail or password is not right');
    await expect(page).toHaveURL(/\/login/);
  });

  test('an admin reaches the users page; a deep link without sign-in returns there after it', async ({ page }) => {
    await page.goto('/admin/users');
    await expect(page).toHaveURL(/\/login\?redirect=/);
    const login = new LoginPage(page);

    await login.signIn('admin@example.com', DEMO_PASSWORD);

    await expect(page).toHaveURL(/\/admin\/users/);
    await expect(page.getByRole('cell', { name: 'planner@example.com' })).toBeVisible();
    await page.screenshot({ path: 'test-results/users-admin.png', fullPage: true });
  });
});
