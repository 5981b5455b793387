import { expect, test, type APIRequestContext } from '@playwright/test';
import { DockPage } from './pages/dock-page';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';
import { DEMO_PASSWORD, onHandOf, plantToday, tokenOf } from './pages/demo-api';

/** The demo's scheduled parts have planned releases due, so today's run sends releases (again: nothing twice). */
async function runTodaysReleases(request: APIRequestContext): Promise<void> {
  const buyer = await tokenOf(request, 'buyer@example.com');
  const run = await request.post('/api/releases/run', {
    headers: { Authorization: `Bearer ${buyer}` },
    data: { date: plantToday() },
  });
  expect(run.status()).toBe(200);
}

interface ReleaseRow {
  number: string;
  supplierCode: string;
  status: string;
  lines: { id: number; qty: number; needDate: string; partNumber: string }[];
}

/** The ship-notice link of a release: the supplier answers it from the e-mailed link as asked. */
async function confirmAsAsked(request: APIRequestContext, adminToken: string, release: ReleaseRow): Promise<string> {
  let token = '';
  // The outbox sends every 10 s; the demo mail server keeps what it caught.
  await expect(async () => {
    const response = await request.get('/api/dev/mail', { headers: { Authorization: `Bearer ${adminToken}` } });
    const mails = (await response.json()) as { subject: string; text: string }[];
    const mail = mails.find((candidate) => candidate.subject.includes(release.number));
    expect(mail, `the mail of ${release.number}`).toBeDefined();
    token = /\/confirm\/([A-Za-z0-9_-]+)/.exec(mail!.text)![1]!;
  }).toPass({ timeout: 40_000, intervals: [1_000] });
  const today = plantToday();
  const answer = await request.post(`/api/confirm/${token}`, {
    data: {
      lines: release.lines.map((line) => ({
        id: line.id,
        confirmedQty: line.qty,
        shipDate: line.needDate > today ? line.needDate : today,
      })),
    },
  });
  expect(answer.status()).toBe(200);
  return ((await answer.json()) as { shippingToken: string }).shippingToken;
}

test.use({ viewport: { width: 1024, height: 768 } });

test.describe('Dock', () => {
  test('a ship notice becomes its own card; checking it in leaves the rest of the release Expected', async ({
    page,
    request,
  }) => {
    await runTodaysReleases(request);
    const admin = await tokenOf(request, 'admin@example.com');
    const listed = await request.get('/api/releases?status=sent', { headers: { Authorization: `Bearer ${admin}` } });
    // Not the battery supplier's: the line-risk journey reads its planted shortage later.
    const release = ((await listed.json()) as ReleaseRow[]).find(
      (candidate) =>
        candidate.supplierCode !== 'FBS' && candidate.lines.reduce((total, line) => total + line.qty, 0) >= 2,
    );
    expect(release, 'a sent release of another supplier with something left to ship').toBeDefined();
    const shippingToken = await confirmAsAsked(request, admin, release!);
    const first = release!.lines[0]!;
    const shippedQty = release!.lines.length > 1 ? first.qty : Math.floor(first.qty / 2);
    const notice = await request.post(`/api/shipping/${shippingToken}`, {
      headers: { 'Idempotency-Key': `e2e-dock-${release!.number}` },
      data: {
        lines: [{ lineId: first.id, qty: shippedQty }],
        carrier: 'Road Freight Example',
        trackingNumber: 'TRK-E2E-0001',
        shipDate: plantToday(),
      },
    });
    expect(notice.status()).toBe(201);
    const noticeId = ((await notice.json()) as { notice: { id: number } }).notice.id;
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('receiving@example.com', DEMO_PASSWORD);
    const dock = new DockPage(page);
    await dock.open();
    const shipment = dock.card(`shipment-${noticeId}`);
    const rest = dock.cardsOf(release!.number).and(page.locator('[data-kind="expected"]'));

    await expect(dock.column('expected').locator(`[data-card="shipment-${noticeId}"]`)).toBeVisible();
    await expect(shipment).toContainText('Shipment, sent');
    await expect(shipment).toContainText('Road Freight Example · TRK-E2E-0001');
    await expect(rest.first()).toBeVisible();
    await dock.dragCard(shipment, dock.column('at_dock'));
    await expect(dock.column('at_dock').locator(`[data-card="shipment-${noticeId}"]`)).toBeVisible();
    const dialog = await dock.openCheckIn(shipment);
    await expect(dialog).toHaveAccessibleName(`Check in shipment of ${release!.number}`);
    await expect(dock.lines()).toHaveCount(1);
    expect(await dock.orderedQty(dock.lines().first())).toBe(shippedQty);
    // A negative count is named as such under its line, stays in the box and records nothing.
    const shippedLine = dock.lines().first();
    await dock.count(shippedLine, -4);
    await dock.recordCounts();
    await expect(shippedLine.getByRole('alert')).toHaveText('Must be 0 or more.');
    await expect(shippedLine.getByLabel(/^Counted/)).toHaveValue('-4');
    await dock.count(dock.lines().first(), shippedQty);
    await dock.recordCounts();
    await expect(dialog.locator('[data-test="check-in-done"]')).toContainText('This card is now in Counted');
    await dialog.getByRole('button', { name: 'Done' }).click();

    await expect(dock.column('counted').locator(`[data-card="shipment-${noticeId}"]`)).toBeVisible();
    // What was not on the truck is still awaited, in Expected.
    await expect(rest.first()).toBeVisible();
    for (const card of await rest.all()) {
      await expect(
        dock.column('expected').locator(`[data-card="${await card.getAttribute('data-card')}"]`),
      ).toBeVisible();
    }
    await settleForScreenshot(page);
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.screenshot({ path: 'test-results/dock-shipments-1440.png', fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: 'test-results/dock-shipments-390.png', fullPage: true });
  });

  test('receiving moves a delivery to the dock, counts it in and sees the new on-hand', async ({ page, request }) => {
    await runTodaysReleases(request);
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('receiving@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const dock = new DockPage(page);

    await dock.open();
    const expected = dock.column('expected');
    await expect(dock.cards(expected).first()).toBeVisible();
    // Not the battery supplier's delivery: its expedite line is the demo's planted shortage, which the
    // line-risk journey reads later. A hazardous delivery when there is one, so the check-in shows its caution.
    const others = dock.cards(expected).filter({ hasNotText: 'Ferncombe' });
    const hazardous = others.filter({ hasText: 'Hazardous' });
    const card = (await hazardous.count()) > 0 ? hazardous.first() : others.first();
    const releaseNumber = (await card.getAttribute('data-release'))!;
    const key = (await card.getAttribute('data-card'))!;

    await dock.dragCard(card, dock.column('at_dock'));

    await expect(dock.column('at_dock').locator(`[data-card="${key}"]`)).toBeVisible();
    await expect(dock.status()).toContainText(`${releaseNumber} (no ship notice) moved to At dock`);
    await page.reload();
    await expect(dock.column('at_dock').locator(`[data-card="${key}"]`)).toBeVisible();

    const dialog = await dock.openCheckIn(dock.card(key));
    const lines = dock.lines();
    const lineCount = await lines.count();
    expect(lineCount).toBeGreaterThan(0);
    const counted = new Map<string, number>();
    const partNumbers: string[] = [];
    for (let index = 0; index < lineCount; index += 1) {
      const line = lines.nth(index);
      const partNumber = (await line.getAttribute('data-part'))!;
      const ordered = await dock.orderedQty(line);
      await dock.count(line, ordered);
      counted.set(partNumber, (counted.get(partNumber) ?? 0) + ordered);
      partNumbers.push(partNumber);
    }
    const receiving = await tokenOf(request, 'receiving@example.com');
    const before = new Map<string, number>();
    for (const partNumber of counted.keys()) before.set(partNumber, await onHandOf(request, receiving, partNumber));
    if (await dialog.locator('[data-test="hazard-caution"]').count()) {
      await expect(dialog.locator('[data-test="hazard-caution"]')).toContainText(
        'check the packaging for damage or leaks',
      );
    }

    await dock.recordCounts();

    await expect(dialog.locator('[data-test="check-in-done"]')).toContainText('This card is now in Counted');
    await expect(dialog.locator('[data-test="on-hand"]')).toHaveCount(lineCount);
    // Conservation: a part's on-hand after the check-in is its on-hand before plus what was
    // counted; the last line of each part reports it, since the counts go in one after another.
    for (const [partNumber, qty] of counted) {
      const lastLine = lines.nth(partNumbers.lastIndexOf(partNumber));
      expect(await dock.onHandShown(lastLine)).toBe(before.get(partNumber)! + qty);
      expect(await onHandOf(request, receiving, partNumber)).toBe(before.get(partNumber)! + qty);
    }
    await dialog.locator('.el-dialog__body').evaluate((body) => body.scrollTo(0, 0));
    await settleForScreenshot(page);
    await page.mouse.move(8, 400);
    await page.screenshot({ path: 'test-results/dock-checkin.png' });

    await dialog.getByRole('button', { name: 'Done' }).click();
    await expect(dialog).toBeHidden();
    await expect(dock.column('counted').locator(`[data-card="${key}"]`)).toBeVisible();
    // The release is received, or part received when it has lines due on other days.
    await expect(dock.card(key).locator('[data-test="dock-status"]')).toHaveText(/^(Received|Partly received)$/);
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/dock.png', fullPage: true });
  });
});
