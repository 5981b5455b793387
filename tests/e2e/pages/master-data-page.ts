import { expect, type Locator, type Page } from '@playwright/test';

/** The parts list: search and open a part. */
export class PartsPage {
  constructor(private readonly page: Page) {}

  async openFromRail(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Parts' }).click();
    await expect(this.page.getByRole('heading', { name: 'Parts', level: 1 })).toBeVisible();
  }

  async openPart(partNumber: string): Promise<void> {
    await this.page.getByLabel('Search parts').fill(partNumber);
    await this.page.getByRole('table').getByRole('link', { name: partNumber, exact: true }).first().click();
    await expect(this.page.getByRole('heading', { name: partNumber, level: 1 })).toBeVisible();
  }
}

/** One part's page and its edit dialog. */
export class PartPage {
  constructor(private readonly page: Page) {}

  fact(label: string): Locator {
    return this.page.locator(`[data-test="part-${label}"]`);
  }

  async editLeadTime(days: number): Promise<void> {
    await this.page.getByRole('button', { name: 'Edit', exact: true }).click();
    const dialog = this.page.getByRole('dialog');
    await dialog.getByLabel('Lead time (working days)').fill(String(days));
    await dialog.getByRole('button', { name: 'Save', exact: true }).click();
    await expect(dialog).toBeHidden();
  }

  async openBom(): Promise<void> {
    await this.page.getByRole('button', { name: 'BOM' }).click();
  }
}

/** A multi-level BOM on a date, and its engineering-change dialog. */
export class BomPage {
  constructor(private readonly page: Page) {}

  table(): Locator {
    return this.page
      .getByRole('table')
      .filter({ has: this.page.locator('[data-test="extended-qty"]') })
      .first();
  }

  componentLink(partNumber: string): Locator {
    return this.page.locator('.el-table__body').getByRole('link', { name: partNumber, exact: true });
  }

  async showDate(isoDate: string): Promise<void> {
    const input = this.page.getByLabel('Effective on');
    await input.fill(isoDate);
    await input.press('Enter');
  }

  async changeFromDate(component: string, replacement: string, isoDate: string, qtyPer: number): Promise<void> {
    await this.page
      .getByRole('button', { name: `Engineering change of ${component}` })
      .first()
      .click();
    // By its name: the date picker's panel is a dialog too, and may still be closing.
    const dialog = this.page.getByRole('dialog', { name: /^Engineering change on / });
    await dialog.getByLabel('Replacement').click();
    await this.page.keyboard.type(replacement);
    await this.page.getByRole('option', { name: replacement, exact: true }).click();
    const date = dialog.getByLabel('Effective from');
    await date.fill(isoDate);
    await date.press('Enter');
    await dialog.getByLabel('Qty per').fill(String(qtyPer));
    await dialog.getByRole('button', { name: 'Make the change' }).click();
    await expect(dialog).toBeHidden();
  }
}

/** The audit trail with its filters. */
export class AuditPage {
  constructor(private readonly page: Page) {}

  async openFromRail(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Audit trail' }).click();
    await expect(this.page.getByRole('heading', { name: 'Audit trail', level: 1 })).toBeVisible();
  }

  async filterSubject(subject: string): Promise<void> {
    await this.page.getByLabel('Subject').fill(subject);
  }

  rows(): Locator {
    return this.page.locator('.el-table__body tr');
  }
}
