import { expect, test } from '@playwright/test';
import { DockPage } from './pages/dock-page';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';
import { OverChoice } from './pages/over-choice';
import { SupplierAccountPage } from './pages/supplier-account-page';
import { DEMO_PASSWORD, onHandOf, plantToday, tokenOf } from './pages/demo-api';

const EXTRA = 3;

test.use({ viewport: { width: 1440, height: 900 } });

test.describe('Dock, more than ordered', () => {
  test('receiving counts more than a line ordered, sees what keeping or sending back would do, sends the extra back', async ({
    page,
    request,
    browser,
  }) => {
    const buyer = await tokenOf(request, 'buyer@example.com');
    const run = await request.post('/api/releases/run', {
      headers: { Authorization: `Bearer ${buyer}` },
      data: { date: plantToday() },
    });
    expect(run.status()).toBe(200);
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('receiving@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const dock = new DockPage(page);
    await dock.open();

    // Not the battery supplier's delivery: the line-risk journey reads its expedite line later.
    const card = dock.cards(dock.column('expected')).filter({ hasNotText: 'Ferncombe' }).first();
    await expect(card).toBeVisible();
    const releaseNumber = (await card.getAttribute('data-release'))!;
    const supplierCode = /-([A-Z0-9]+)$/.exec(releaseNumber)![1];
    const dialog = await dock.openCheckIn(card);
    // The line due last: any other open line of its part is due before it, so keeping would fill that one.
    const line = dock.lines().last();
    const partNumber = (await line.getAttribute('data-part'))!;
    const ordered = await dock.orderedQty(line);
    const receiving = await tokenOf(request, 'receiving@example.com');
    const before = await onHandOf(request, receiving, partNumber);
    const choice = new OverChoice(line);

    await dock.count(line, ordered + EXTRA);

    // The demo's suppliers allow nothing over the order (0 %), so any extra asks the clerk.
    await expect(choice.root()).toBeVisible();
    await expect(choice.root()).toContainText(`Over: ${EXTRA} pcs more than ordered`);
    await expect(choice.keepWords()).toContainText(
      /go to R\d{6}-[A-Z0-9]+, line due \w{3} \d{1,2} \w{3}|stay in stock/,
    );
    await expect(choice.returnWords()).toHaveText(
      `${EXTRA} pcs go back to the supplier; this line closes at ${ordered} pcs.`,
    );
    await dock.recordCounts();
    await expect(choice.problem()).toContainText(`Choose Keep them or Send them back for the ${EXTRA} extra`);

    // Keyboard only: the arrow key moves the choice, Enter records.
    await choice.keep().focus();
    await page.keyboard.press('Space');
    await page.keyboard.press('ArrowDown');
    await expect(choice.sendBack()).toBeChecked();
    await expect(choice.problem()).toBeHidden();
    await settleForScreenshot(page);
    await line.screenshot({ path: 'test-results/dock-over-choice.png' });
    await page.setViewportSize({ width: 390, height: 844 });
    await line.scrollIntoViewIfNeeded();
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/dock-over-choice-phone.png' });
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.keyboard.press('Enter');

    await expect(choice.result()).toContainText(`Counted ${ordered + EXTRA} pcs (over)`);
    await expect(choice.result()).toContainText(`${ordered} pcs added to stock. ${EXTRA} pcs back to the supplier.`);
    expect(await dock.onHandShown(line)).toBe(before + ordered);
    expect(await onHandOf(request, receiving, partNumber)).toBe(before + ordered);
    const ledger = await request.get(`/api/stock/${encodeURIComponent(partNumber)}/movements`, {
      headers: { Authorization: `Bearer ${receiving}` },
    });
    const movements = ((await ledger.json()) as { movements: { kind: string; qty: number; refType: string | null }[] })
      .movements;
    expect(movements.slice(-2).map(({ kind, qty, refType }) => ({ kind, qty, refType }))).toEqual([
      { kind: 'receipt', qty: ordered + EXTRA, refType: 'release' },
      { kind: 'return', qty: -EXTRA, refType: 'receipt' },
    ]);
    const claims = await request.get(`/api/suppliers/${supplierCode}/claims`, {
      headers: { Authorization: `Bearer ${buyer}` },
    });
    expect(((await claims.json()) as { discrepancy: string; overAction: string | null }[])[0]).toMatchObject({
      discrepancy: 'over',
      overAction: 'return',
    });

    // The rest of the delivery is still on its way: the card goes back to Expected.
    if ((await dock.lines().count()) > 1) {
      // The select's shown value covers its input; the click goes to the same control.
      await dialog.getByLabel('Move to column').click({ force: true });
      await page.getByRole('option', { name: 'Expected' }).click();
      await expect(dock.column('expected').locator(`[data-release="${releaseNumber}"]`)).toBeVisible();
    }
    await settleForScreenshot(page);
    await dialog.screenshot({ path: 'test-results/dock-over-done.png' });

    // The supplier sees the claim among its own, with what the dock did with the extra.
    const admin = await tokenOf(request, 'admin@example.com');
    const users = (await (
      await request.get('/api/users', { headers: { Authorization: `Bearer ${admin}` } })
    ).json()) as { email: string; role: string; supplierCode: string | null }[];
    const contact = users.find((user) => user.role === 'supplier' && user.supplierCode === supplierCode)!;
    const supplierPage = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    const supplierLogin = new LoginPage(supplierPage);
    await supplierLogin.open();
    await supplierLogin.signIn(contact.email, DEMO_PASSWORD);
    const account = new SupplierAccountPage(supplierPage);
    await account.openFromRail();
    const claim = account.claimsTable().getByRole('row').filter({ hasText: releaseNumber });
    await expect(claim).toContainText(`Over: ${EXTRA} sent back`);
    await expect(claim).toContainText(`${ordered + EXTRA} / ${ordered}`);
    await account.claimsTable().scrollIntoViewIfNeeded();
    await settleForScreenshot(supplierPage);
    await supplierPage.screenshot({ path: 'test-results/dock-over-claim.png' });
    await supplierPage.setViewportSize({ width: 390, height: 844 });
    await account.claimsTable().scrollIntoViewIfNeeded();
    await settleForScreenshot(supplierPage);
    await supplierPage.screenshot({ path: 'test-results/dock-over-claim-phone.png' });
    await supplierPage.close();
  });
});
