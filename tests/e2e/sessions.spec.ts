import { expect, test, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { AccountMenu } from './pages/account-menu';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';
import { PasswordResetPage } from './pages/password-reset-page';
import { SequencePage } from './pages/sequence-page';
import { UsersPage } from './pages/users-page';
import { DEMO_PASSWORD } from './pages/demo-api';

const DESKTOP = { width: 1440, height: 900 };
const PHONE = { width: 390, height: 844 };

/** A bearer token for an account, signed in through the API as a second device would. */
async function tokenFor(request: APIRequestContext, email: string, password: string): Promise<string> {
  const response = await request.post('/api/auth/login', { data: { email, password } });
  expect(response.status()).toBe(200);
  return ((await response.json()) as { token: string }).token;
}

async function signedInPage(browser: Browser, email: string, password: string, viewport = DESKTOP): Promise<Page> {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  const login = new LoginPage(page);
  await login.open();
  await login.signIn(email, password);
  await expect(page).toHaveURL(/\/$/);
  return page;
}

async function shoot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: `test-results/${name}.png`, fullPage: true, animations: 'disabled' });
}

test.describe('sessions and passwords', () => {
  test('a user changes their password, other devices are signed out, and an e-mailed reset link sets a new one', async ({
    browser,
    request,
  }) => {
    // A person of our own, so the demo accounts keep their password for the other journeys.
    const adminToken = await tokenFor(request, 'admin@example.com', DEMO_PASSWORD);
    const email = `jo.${Date.now()}@example.com`;
    const created = await request.post('/api/users', {
      headers: { Authorization: `Bearer ${adminToken}` },
      data: { name: 'Jo Marlow', email, role: 'planner', password: 'first-password-1' },
    });
    expect(created.status()).toBe(201);

    const laptop = await signedInPage(browser, email, 'first-password-1');
    const phone = await signedInPage(browser, email, 'first-password-1', PHONE);

    // Change password on the laptop: the form checks first, then the server judges the current one.
    const account = new AccountMenu(laptop);
    await account.openPasswordDialog();
    await account.fillPasswords('first-password-1', 'too-short');
    await account.submit();
    await expect(account.errorUnder('New password')).toHaveText('At least 10 characters');
    await account.fillPasswords('not-my-password', 'second-password-2');
    await account.submit();
    await expect(account.errorUnder('Current password')).toHaveText('Is not your current password');
    await shoot(laptop, 'password-change-1440');
    await laptop.setViewportSize(PHONE);
    await shoot(laptop, 'password-change-390');
    await laptop.setViewportSize(DESKTOP);
    await account.fillPasswords('first-password-1', 'second-password-2');
    await account.submit();
    await expect(
      laptop.getByText('Password changed. Every other device where you were signed in is now signed out.'),
    ).toBeVisible();
    await expect(account.dialog()).toBeHidden();

    // The phone's session ended on the server: its next request says so, in plain words.
    await phone.reload();
    await expect(phone).toHaveURL(/\/login/);
    await expect(phone.getByText(/Your session ended: you signed out elsewhere, your password changed/)).toBeVisible();
    await shoot(phone, 'session-ended-390');

    // The admin e-mails a reset link from the Users page.
    const admin = await signedInPage(browser, 'admin@example.com', DEMO_PASSWORD);
    const users = new UsersPage(admin);
    await users.open();
    await expect(users.row(email)).toBeVisible();
    await users.emailResetLink('Jo Marlow');
    await expect(users.resetSent()).toContainText(`Password-reset link sent to ${email}`);
    await expect(users.resetSent()).toContainText('(24 hours)');
    await settleForScreenshot(admin);
    await shoot(admin, 'users-reset-sent-1440');
    await admin.setViewportSize(PHONE);
    await shoot(admin, 'users-reset-sent-390');
    await admin.setViewportSize(DESKTOP);

    // The mail goes out through the Outbox; the demo mail server catches it within seconds.
    await admin.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click();
    const resetRow = admin
      .getByRole('row')
      .filter({ hasText: email })
      .filter({ hasText: 'Set a new Cardloop password' });
    await expect(async () => {
      await admin.getByRole('button', { name: /refresh/i }).click();
      await expect(resetRow.first()).toContainText('Sent', { timeout: 1000 });
    }).toPass({ timeout: 40_000 });
    await shoot(admin, 'outbox-1440');
    await admin.getByRole('tab', { name: 'Captured by the demo mail server' }).click();
    await admin
      .getByRole('row')
      .filter({ hasText: email })
      .getByRole('button', { name: 'Set a new Cardloop password' })
      .first()
      .click();
    const mailText = await admin.getByRole('article', { name: 'Selected message' }).locator('pre').innerText();
    const link = /https?:\/\/\S+\/reset-password\/[A-Za-z0-9_-]+/.exec(mailText)?.[0];
    expect(link).toBeDefined();

    // Jo opens the link on the phone, signed out, and sets a new password.
    await phone.goto(link!);
    const reset = new PasswordResetPage(phone);
    await expect(reset.heading()).toHaveText('Set a new password');
    await expect(phone.getByText('Jo Marlow')).toBeVisible();
    await shoot(phone, 'password-reset-form-390');
    await phone.setViewportSize(DESKTOP);
    await shoot(phone, 'password-reset-form-1440');
    await phone.setViewportSize(PHONE);
    await reset.setPassword('third-password-3');
    await expect(reset.heading()).toHaveText('Password set — sign in');
    await shoot(phone, 'password-reset-done-390');
    await phone.getByRole('link', { name: 'Go to sign-in' }).click();
    await new LoginPage(phone).signIn(email, 'third-password-3');
    await expect(phone).toHaveURL(/\/$/);

    // The laptop was signed in with the changed password: a reset ends that session too.
    await laptop.reload();
    await expect(laptop).toHaveURL(/\/login/);

    // The link works once.
    await laptop.goto(link!);
    await expect(new PasswordResetPage(laptop).heading()).toHaveText('This link was already used');
    await expect(laptop.getByText('Ask your Cardloop administrator to e-mail you a new link')).toBeVisible();
    await shoot(laptop, 'password-reset-used-1440');

    for (const page of [laptop, phone, admin]) await page.context().close();
  });

  test('a move made on a stale board is refused, says who changed the day first, and shows the day as it is', async ({
    page,
    request,
  }) => {
    await page.setViewportSize(DESKTOP);
    // Live updates would redraw the board the moment the other change lands; without them (a
    // dropped connection, or paused for too many windows) the planner keeps looking at the old order.
    await page.route('**/api/events', (route) => route.abort());
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('planner@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const sequence = new SequencePage(page);
    await sequence.open();
    const column = sequence.openColumns().first();
    const date = (await column.getAttribute('data-date'))!;
    const shown = await sequence.serials(column);
    expect(shown.length).toBeGreaterThanOrEqual(3);

    // Meanwhile the admin, on another device, puts the day's last unit first.
    const adminToken = await tokenFor(request, 'admin@example.com', DEMO_PASSWORD);
    const headers = { Authorization: `Bearer ${adminToken}` };
    const board = (await (await request.get('/api/sequence', { headers })).json()) as {
      days: { date: string; version: string; units: { serial: string }[] }[];
    };
    const day = board.days.find((candidate) => candidate.date === date)!;
    const theirs = [shown.at(-1)!, ...shown.slice(0, -1)];
    const changed = await request.put('/api/sequence/days', {
      headers,
      data: { days: [{ date, serials: theirs }], basedOn: [{ date, version: day.version }] },
    });
    expect(changed.status()).toBe(200);

    // The planner, still looking at the old order, moves the first unit down.
    await sequence.chooseWithKeyboard(shown[0]!, 'Move down');
    await sequence.saveWhatIf();

    const alert = page.getByRole('alert').filter({ hasText: 'Someone changed these days first' });
    await expect(alert).toBeVisible();
    await expect(alert).toContainText('has changed since your board was loaded. Avery Lindholm changed it at');
    await expect(alert).toContainText('The board now shows the current order');
    await expect.poll(() => sequence.serials(column)).toEqual(theirs);
    await settleForScreenshot(page);
    await shoot(page, 'sequence-stale-1440');
    await page.setViewportSize(PHONE);
    await shoot(page, 'sequence-stale-390');
  });
});
