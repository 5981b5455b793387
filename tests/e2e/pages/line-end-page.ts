import { expect, type Locator, type Page } from '@playwright/test';

/** The Line end screen: a scan box for serials, the day's units ticking off, undo and close. */
export class LineEndPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Line end' }).click();
    await expect(this.page.getByRole('heading', { name: 'Line end', level: 1 })).toBeVisible();
    await expect(this.units().first()).toBeVisible();
  }

  scanBox(): Locator {
    return this.page.getByLabel('Scan or type the serial of a unit built');
  }

  /** Types a serial and Enter, the way a keyboard-wedge scanner does. */
  async report(serial: string): Promise<void> {
    await this.scanBox().fill(serial);
    await this.scanBox().press('Enter');
  }

  units(): Locator {
    return this.page.locator('[data-test="line-unit"]');
  }

  unit(serial: string): Locator {
    return this.page.locator(`[data-test="line-unit"][data-serial="${serial}"]`);
  }

  /** The serials of the units not yet built, in build order. */
  async plannedSerials(): Promise<string[]> {
    const planned = this.page.locator('[data-test="line-unit"]:not(.is-built)');
    return planned.evaluateAll((items) => items.map((item) => item.getAttribute('data-serial') ?? ''));
  }

  feedback(): Locator {
    return this.page.locator('[data-test="build-feedback"]');
  }

  builtCount(): Locator {
    return this.page.locator('[data-test="built-count"]');
  }

  async undoLast(reason: string): Promise<void> {
    await this.page.getByRole('button', { name: /^Undo last/ }).click();
    const dialog = this.page.getByRole('dialog', { name: /^Undo / });
    await expect(dialog).toBeVisible();
    await dialog.getByLabel('Reason').fill(reason);
    await dialog.getByRole('button', { name: 'Undo build' }).click();
    await expect(dialog).toBeHidden();
  }

  async openKit(serial: string): Promise<Locator> {
    await this.unit(serial)
      .getByRole('button', { name: `Kit of ${serial}` })
      .click();
    const dialog = this.page.getByRole('dialog', { name: `Kit of ${serial}` });
    await expect(dialog.locator('[data-test="kit-sheet"]')).toBeVisible();
    return dialog;
  }

  async printDayKits(): Promise<void> {
    await this.page.getByRole('button', { name: 'Print the day’s kits' }).click();
    await expect(this.page.getByRole('heading', { name: /^Kit sheets/, level: 1 })).toBeVisible();
  }
}

/** A part's stock page: on hand, the ledger and its chart. */
export class StockPartPage {
  constructor(private readonly page: Page) {}

  async open(partNumber: string): Promise<void> {
    await this.page.goto(`/stock/${encodeURIComponent(partNumber)}`);
    await expect(this.page.getByRole('heading', { name: partNumber, level: 1 })).toBeVisible();
  }

  /** The on-hand figure shown, e.g. 84 of "84 pcs" (or -3 of "-3 pcs"). */
  async onHand(): Promise<number> {
    const text = await this.page.locator('[data-test="part-on-hand"]').innerText();
    return Number(text.replace(/,/g, '').split(' ')[0]);
  }

  movements(): Locator {
    return this.page.locator('.stock-ledger-table .el-table__body-wrapper tbody tr');
  }
}

/** The printable kit sheets: one sheet per unit, each with its serial as a QR code. */
export class KitSheetsPage {
  constructor(private readonly page: Page) {}

  sheets(): Locator {
    return this.page.locator('[data-test="kit-sheet"]');
  }

  printButton(): Locator {
    return this.page.getByRole('button', { name: 'Print', exact: true });
  }
}
