import { expect, type Locator, type Page } from '@playwright/test';

/** The Loops screen: summary tiles, filters, the dense loop table and its row actions. */
export class LoopsPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Loops' }).click();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { name: 'Loops', level: 1 });
  }

  /** Narrows the table to loops whose proposal adds cards, or (clicked again) back to all loops. */
  async toggleLoopsNeedingCards(): Promise<void> {
    await this.page.locator('[data-test="summary-add"]').click();
  }

  async search(text: string): Promise<void> {
    await this.page.getByRole('textbox', { name: 'Search loops' }).fill(text);
  }

  rows(): Locator {
    return this.page.locator('.loops-view__table .el-table__body tr.el-table__row');
  }

  row(partNumber: string): Locator {
    return this.rows().filter({ has: this.page.locator('strong', { hasText: new RegExp(`^${escape(partNumber)}$`) }) });
  }

  async partNumberOf(row: Locator): Promise<string> {
    return ((await row.locator('strong').first().textContent()) ?? '').trim();
  }

  proposal(partNumber: string): Locator {
    return this.row(partNumber).locator('[data-test="proposal"]');
  }

  recommended(partNumber: string): Locator {
    return this.row(partNumber).locator('[data-test="recommended"]');
  }

  active(partNumber: string): Locator {
    return this.row(partNumber).locator('[data-test="active"]');
  }

  /** Accepts the row's proposal and confirms the question that follows. */
  async accept(partNumber: string, confirmLabel: string): Promise<void> {
    await this.page.getByRole('button', { name: `Accept the proposal for ${partNumber}` }).click();
    await this.page.getByRole('dialog').getByRole('button', { name: confirmLabel }).click();
  }

  async openPrint(partNumber: string): Promise<void> {
    await this.page.getByRole('button', { name: `Print labels of ${partNumber}` }).click();
  }

  async showCards(partNumber: string): Promise<void> {
    await this.page.getByRole('button', { name: `Cards of ${partNumber}` }).click();
  }

  cardList(partNumber: string): Locator {
    return this.page.getByRole('region', { name: `Cards of ${partNumber}` });
  }
}

/** Waits until passing notices have gone, so a screenshot shows the page itself; the pointer moves off the controls. */
export async function settleForScreenshot(page: Page): Promise<void> {
  await page.mouse.move(40, 840);
  await expect(page.locator('.el-message')).toHaveCount(0, { timeout: 10_000 });
}

/** The print view of one loop's card labels. */
export class LoopPrintPage {
  constructor(private readonly page: Page) {}

  labels(): Locator {
    return this.page.locator('[data-test="card-label"]');
  }

  /** The 12 digits of each label, read without the spaces between their groups. */
  async cardNumbers(): Promise<string[]> {
    const texts = await this.page.locator('[data-test="card-number"]').allTextContents();
    return texts.map((text) => text.replace(/\s/g, ''));
  }

  downloadPdfButton(): Locator {
    return this.page.getByRole('button', { name: 'Download PDF' });
  }
}

/** The scan screen, driven like a keyboard-wedge scanner: digits, then Enter. */
export class CardScanPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scan cards' }).click();
  }

  input(): Locator {
    return this.page.getByLabel('Card number');
  }

  async scan(cardNumber: string): Promise<void> {
    await this.page.keyboard.type(cardNumber);
    await this.page.keyboard.press('Enter');
  }

  feedback(): Locator {
    return this.page.locator('[data-test="scan-feedback"]');
  }

  history(): Locator {
    return this.page.locator('[data-test="scan-history"]');
  }
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
