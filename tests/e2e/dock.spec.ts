import { expect, test, type APIRequestContext } from '@playwright/test';
import { DockPage } from './pages/dock-page';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';

const DEMO_PASSWORD = 'cardloop-demo';

// The plant's calendar day on the server's clock, which runs on this machine.
function plantToday(): string {
  const now = new Date();
  return new Date(now.getTime() - now.getTimezoneOffset() * 60_000).toISOString().slice(0, 10);
}

async function tokenOf(request: APIRequestContext, email: string): Promise<string> {
  const signIn = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(signIn.status()).toBe(200);
  return ((await signIn.json()) as { token: string }).token;
}

async function onHandOf(request: APIRequestContext, token: string, partNumber: string): Promise<number> {
  const response = await request.get('/api/parts', { headers: { Authorization: `Bearer ${token}` } });
  const parts = (await response.json()) as { partNumber: string; onHand: number }[];
  return parts.find((part) => part.partNumber === partNumber)!.onHand;
}

test.use({ viewport: { width: 1024, height: 768 } });

test.describe('Dock', () => {
  test('receiving moves a delivery to the dock, counts it in and sees the new on-hand', async ({ page, request }) => {
    // The demo's scheduled parts have planned releases due, so today's run sends releases.
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
    const expected = dock.column('expected');
    await expect(dock.cards(expected).first()).toBeVisible();
    // Not the battery supplier's delivery: its expedite line is the demo's planted shortage, which the
    // line-risk journey reads later. A hazardous delivery when there is one, so the check-in shows its caution.
    const others = dock.cards(expected).filter({ hasNotText: 'Ferncombe' });
    const hazardous = others.filter({ hasText: 'Hazardous' });
    const card = (await hazardous.count()) > 0 ? hazardous.first() : others.first();
    const releaseNumber = (await card.getAttribute('data-release'))!;

    await dock.dragCard(card, dock.column('at_dock'));

    await expect(dock.column('at_dock').locator(`[data-release="${releaseNumber}"]`)).toBeVisible();
    await expect(dock.status()).toContainText(`${releaseNumber} moved to At dock`);
    await page.reload();
    await expect(dock.column('at_dock').locator(`[data-release="${releaseNumber}"]`)).toBeVisible();

    const dialog = await dock.openCheckIn(dock.card(releaseNumber));
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

    await expect(dialog.locator('[data-test="check-in-done"]')).toContainText('The release is now in Counted');
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
    await expect(dock.column('counted').locator(`[data-release="${releaseNumber}"]`)).toBeVisible();
    await expect(dock.card(releaseNumber).locator('[data-test="dock-status"]')).toHaveText('Received');
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/dock.png', fullPage: true });
  });
});
