import { readFile } from 'node:fs/promises';
import { expect, test } from '@playwright/test';
import { isValidGs1 } from '../../shared/domain/gs1';
import { CardScanPage, LoopPrintPage, LoopsPage, settleForScreenshot } from './pages/loops-page';
import { LoginPage } from './pages/login-page';
import { DEMO_PASSWORD } from './pages/demo-api';

test.describe('Loops', () => {
  test('a buyer accepts a loop’s proposal, prints its cards and scans one from full to empty', async ({ page }) => {
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('buyer@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const loops = new LoopsPage(page);

    // The demo starts its loops with their recommended cards, but one lost two on the floor.
    await loops.open();
    await expect(loops.heading()).toBeVisible();
    await loops.toggleLoopsNeedingCards();
    const firstRow = loops.rows().first();
    await expect(firstRow.locator('[data-test="proposal"]')).toHaveText(/^Add \d+$/);
    const partNumber = await loops.partNumberOf(firstRow);
    await loops.toggleLoopsNeedingCards();
    await loops.search(partNumber);
    await expect(loops.rows()).toHaveCount(1);
    const recommended = Number(await loops.recommended(partNumber).textContent());
    expect(recommended).toBeGreaterThan(0);
    const active = Number(await loops.active(partNumber).textContent());
    const missing = recommended - active;
    expect(missing).toBeGreaterThan(0);
    await expect(loops.proposal(partNumber)).toHaveText(`Add ${missing}`);

    await loops.accept(partNumber, `Add ${missing}`);

    await expect(page.getByText(`${missing} cards added to ${partNumber}`)).toBeVisible();
    await expect(loops.proposal(partNumber)).toHaveText('Right-sized');
    await expect(loops.active(partNumber)).toHaveText(String(recommended));

    await loops.openPrint(partNumber);
    await expect(page).toHaveURL(/\/loops\/\d+\/print$/);
    const print = new LoopPrintPage(page);
    await expect(print.labels()).toHaveCount(recommended);
    await expect(print.labels().first()).toContainText(partNumber);
    await expect(print.labels().first()).toContainText(`card 1 of ${recommended}`);
    const qrCodes = print.labels().getByRole('img', { name: /^QR code of card/ });
    await expect(qrCodes).toHaveCount(recommended);
    // The drawing really decodes: an image that failed to load has no natural width.
    await expect
      .poll(() => qrCodes.first().evaluate((image: HTMLImageElement) => image.naturalWidth))
      .toBeGreaterThan(0);
    const cardNumbers = await print.cardNumbers();
    expect(cardNumbers).toHaveLength(recommended);
    // Printed numbers carry a GS1 mod-10 check digit (GS1 General Specifications, section 7.9).
    for (const cardNumber of cardNumbers) {
      expect(cardNumber).toMatch(/^\d{12}$/);
      expect(isValidGs1(cardNumber)).toBe(true);
    }
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/loop-print.png', fullPage: true });

    const downloadEvent = page.waitForEvent('download');
    await print.downloadPdfButton().click();
    const download = await downloadEvent;
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);
    const pdf = await readFile((await download.path())!);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');

    const scan = new CardScanPage(page);
    await scan.open();
    await expect(scan.input()).toBeFocused();
    await scan.scan(cardNumbers[0]!);

    await expect(scan.feedback()).toContainText('Full → Empty');
    await expect(scan.feedback()).toContainText(cardNumbers[0]!);
    await expect(scan.feedback()).toContainText(partNumber);
    await expect(scan.input()).toHaveValue('');
    await expect(scan.input()).toBeFocused();
    await expect(scan.history()).toContainText(`${partNumber}: Full → Empty`);
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/scan.png', fullPage: true });
    // On a phone the outcome wraps on a line of its own, whole.
    const desk = page.viewportSize()!;
    await page.setViewportSize({ width: 390, height: 844 });
    const outcome = scan.history().locator('.card-scan-history__outcome').first();
    const shown = await outcome.evaluate((element) => element.scrollWidth <= element.clientWidth + 1);
    expect(shown).toBe(true);
    expect((await outcome.boundingBox())!.width).toBeGreaterThan(200);
    await page.screenshot({ path: 'test-results/scan-390.png' });
    await page.setViewportSize(desk);

    await loops.open();
    await loops.search(partNumber);
    await expect(loops.row(partNumber).getByRole('img', { name: /1 empty/ })).toBeVisible();
    await loops.showCards(partNumber);
    await expect(loops.cardList(partNumber)).toContainText('Signal empty (Full → Empty)');
    // Back to the whole list for the picture (the scanned loop sits among the others by part number).
    await loops.search('');
    await expect(loops.rows().nth(10)).toBeVisible();
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/loops.png' });
  });
});
