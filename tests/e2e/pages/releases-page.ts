import { expect, type Locator, type Page } from '@playwright/test';

/** The buyer's Releases desk: run button, decisions waiting at the top, the dense release table. */
export class ReleasesPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Releases' }).click();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { name: 'Releases', level: 1 });
  }

  runButton(): Locator {
    return this.page.getByRole('button', { name: 'Run releases now' });
  }

  /** Runs releases for the date in the picker (today unless changed) and resolves the server's answer. */
  async runNow(): Promise<{ date: string; releases: { number: string; supplierCode: string; lines: unknown[] }[] }> {
    const answer = this.page.waitForResponse(
      (response) => response.url().endsWith('/api/releases/run') && response.request().method() === 'POST',
    );
    await this.runButton().click();
    return (await answer).json();
  }

  rows(): Locator {
    return this.page.locator('.releases-table .el-table__body tr.el-table__row');
  }

  row(number: string): Locator {
    return this.rows().filter({ has: this.page.locator('.releases-table__number', { hasText: number }) });
  }

  async expand(number: string): Promise<void> {
    await this.row(number).locator('.el-table__expand-icon').click();
  }

  decisions(): Locator {
    return this.page.getByRole('region', { name: /need.? your decision/ });
  }

  decision(number: string): Locator {
    return this.page.locator(`[data-release="${number}"]`);
  }

  /** Accepts the supplier's changes to a release and confirms the question that follows. */
  async acceptChanges(number: string): Promise<void> {
    await this.decision(number).getByRole('button', { name: 'Accept changes' }).click();
    await this.page.getByRole('dialog').getByRole('button', { name: 'Accept changes' }).click();
  }
}

/** The supplier's public confirmation page, opened from the e-mailed link. */
export class ConfirmPage {
  constructor(private readonly page: Page) {}

  heading(): Locator {
    return this.page.getByRole('heading', { level: 1 });
  }

  quantityInputs(): Locator {
    return this.page.getByLabel(/^You will ship/);
  }

  async setQuantity(index: number, qty: number): Promise<void> {
    const input = this.quantityInputs().nth(index);
    await input.fill(String(qty));
    await input.blur();
  }

  summary(): Locator {
    return this.page.locator('.confirm-view__summary');
  }

  async send(): Promise<void> {
    await this.page.getByRole('button', { name: 'Send answer' }).click();
  }

  outcome(): Locator {
    return this.page.getByRole('status');
  }
}

/** Waits until no toast is showing and the pointer rests off the content, so screenshots are calm. */
export async function settleReleasesScreen(page: Page): Promise<void> {
  await page.mouse.move(40, 840);
  await expect(page.locator('.el-message')).toHaveCount(0, { timeout: 10_000 });
}
