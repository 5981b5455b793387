import { expect, test, type Page } from '@playwright/test';
import type { OutboxMessage } from '../../shared/schemas/outbox';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';
import { DEMO_PASSWORD } from './pages/demo-api';

const DESKTOP = { width: 1440, height: 900 };
const PHONE = { width: 390, height: 844 };

/*
 * The demo's embedded mail server takes every message, so it never fails on its own. To see how
 * the screens show mail that does not get through, this journey answers the outbox and release
 * reads in the browser with notices the way the server reports failing ones.
 */

function minutesAgo(minutes: number): string {
  return new Date(Date.now() - minutes * 60_000).toISOString();
}

const failingSince = minutesAgo(50);
const lastError = 'connect ECONNREFUSED 127.0.0.1:2525';

const failingNotice: OutboxMessage = {
  id: 71,
  to: 'oldwick.orders@example.com',
  subject: 'Release R261202-OMW from Cardloop demo plant',
  status: 'failing',
  ref: 'release:R261202-OMW',
  attempts: 4,
  lastError,
  createdAt: failingSince,
  sentAt: null,
  firstFailedAt: failingSince,
  nextAttemptAt: new Date(Date.now() + 8 * 60_000).toISOString(),
};
const waitingNotice: OutboxMessage = {
  ...failingNotice,
  id: 72,
  to: 'saltmarsh.orders@example.com',
  subject: 'Release R261202-SRM from Cardloop demo plant',
  status: 'pending',
  ref: 'release:R261202-SRM',
  attempts: 0,
  lastError: null,
  firstFailedAt: null,
  createdAt: minutesAgo(1),
  nextAttemptAt: minutesAgo(1),
};
const sentNotice: OutboxMessage = {
  ...waitingNotice,
  id: 70,
  to: 'elmstead.orders@example.com',
  subject: 'Release R261202-ECW from Cardloop demo plant',
  status: 'sent',
  ref: 'release:R261202-ECW',
  attempts: 1,
  createdAt: minutesAgo(90),
  sentAt: minutesAgo(89),
  nextAttemptAt: null,
};

function releaseWith(notice: OutboxMessage, supplierCode: string, supplierName: string) {
  return {
    number: `R261202-${supplierCode}`,
    supplierCode,
    status: 'sent',
    lines: [
      {
        id: notice.id,
        partNumber: 'ACT-DK36',
        qty: 20,
        needDate: '2026-12-09',
        description: 'Brush deck lift actuator 36 V',
        uom: 'H87',
        hazardous: false,
        origin: 'plan',
        cardNumber: null,
        confirmedQty: null,
        shipDate: null,
        receivedQty: 0,
        closed: false,
      },
    ],
    id: notice.id,
    supplierName,
    releaseDate: '2026-12-02',
    sentAt: notice.createdAt,
    confirmedAt: null,
    carrier: null,
    trackingNumber: null,
    supplierNote: null,
    notice,
  };
}

async function answerMailReads(page: Page): Promise<void> {
  await page.route(/\/api\/outbox\/health$/, (route) =>
    route.fulfill({ json: { pending: 1, failing: 1, failingSince } }),
  );
  await page.route(/\/api\/outbox$/, (route) => route.fulfill({ json: [waitingNotice, failingNotice, sentNotice] }));
  await page.route(/\/api\/releases(\?.*)?$/, (route) => {
    const status = new URL(route.request().url()).searchParams.get('status');
    const releases = [
      releaseWith(failingNotice, 'OMW', 'Oldwick Mechanical Works'),
      releaseWith(waitingNotice, 'SRM', 'Saltmarsh Rotomoulding'),
      releaseWith(sentNotice, 'ECW', 'Elmstead Cable Works'),
    ];
    return route.fulfill({ json: status ? releases.filter((release) => release.status === status) : releases });
  });
}

async function shoot(page: Page, name: string): Promise<void> {
  await settleForScreenshot(page);
  await page.setViewportSize(DESKTOP);
  await page.screenshot({ path: `test-results/${name}-1440.png`, fullPage: true, animations: 'disabled' });
  await page.setViewportSize(PHONE);
  await page.screenshot({ path: `test-results/${name}-390.png`, fullPage: true, animations: 'disabled' });
  await page.setViewportSize(DESKTOP);
}

test('an admin sees mail that does not reach the mail server: a banner, the Outbox and the releases', async ({
  page,
}) => {
  await page.setViewportSize(DESKTOP);
  await answerMailReads(page);
  const login = new LoginPage(page);
  await login.open();
  await login.signIn('admin@example.com', DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);

  const banner = page.getByRole('alert').filter({ hasText: 'not reached the mail server' });
  await expect(banner).toContainText('1 notice has not reached the mail server since');
  await expect(banner).toContainText('Cardloop keeps trying.');
  await shoot(page, 'mail-banner');

  await banner.getByRole('link', { name: 'Open the Outbox' }).click();
  await expect(page).toHaveURL(/\/admin\/outbox$/);
  const failingRow = page.getByRole('row').filter({ hasText: 'R261202-OMW' });
  await expect(failingRow).toContainText('Failing');
  await expect(failingRow).toContainText('Failing since');
  await expect(failingRow).toContainText('4 attempts');
  await expect(failingRow).toContainText(`Last error: ${lastError}`);
  await expect(failingRow.getByRole('button', { name: /^Send again/ })).toBeVisible();
  const sentRow = page.getByRole('row').filter({ hasText: 'R261202-ECW' });
  await expect(sentRow.getByRole('button', { name: /^Send again/ })).toHaveCount(0);
  await expect(sentRow.getByRole('button', { name: /^Read/ })).toBeVisible();
  // The Outbox says it itself; the shell's banner stays away there.
  await expect(page.getByRole('alert').filter({ hasText: 'Open the Outbox' })).toHaveCount(0);
  await shoot(page, 'outbox-failing');

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Releases' }).click();
  const failingRelease = page.locator('.releases-table tr.el-table__row').filter({ hasText: 'R261202-OMW' });
  await expect(failingRelease).toContainText('E-mail failing since');
  await expect(failingRelease).toContainText('— retrying');
  await expect(page.locator('.releases-table tr.el-table__row').filter({ hasText: 'R261202-SRM' })).toContainText(
    'E-mail waiting',
  );
  await expect(page.locator('.releases-table tr.el-table__row').filter({ hasText: 'R261202-ECW' })).toContainText(
    'E-mail sent',
  );
  await page.getByRole('button', { name: 'Actions for R261202-OMW' }).click();
  await expect(page.getByRole('menuitem', { name: 'Send e-mail again (same link)' })).toBeVisible();
  await expect(page.getByRole('menuitem', { name: 'Resend with a new link' })).toBeVisible();
  await page.keyboard.press('Escape');
  await failingRelease.locator('.el-table__expand-icon').click();
  await expect(page.getByText(`E-mail to ${failingNotice.to}:`)).toBeVisible();
  await shoot(page, 'releases-mail');
});
