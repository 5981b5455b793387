import type { Page } from '@playwright/test';

/** The supplier's own page and its scorecard, as a supplier contact uses them. */
export class SupplierAccountPage {
  constructor(private readonly page: Page) {}

  async openFromRail(): Promise<void> {
    await this.page.getByRole('link', { name: 'Your business' }).first().click();
  }

  forecastTable() {
    return this.page.locator('[data-test="supplier-forecast"]');
  }

  zoneCells(zone: 'firm' | 'planned' | 'forecast') {
    return this.forecastTable().locator(`td[data-zone="${zone}"]`);
  }

  downloadButton() {
    return this.page.getByRole('button', { name: 'Download CSV' });
  }

  claimsTable() {
    return this.page.locator('[data-test="receiving-claims"]');
  }

  releaseRow(number: string) {
    return this.page.locator('[data-test="own-releases"] tr.el-table__row').filter({ hasText: number });
  }

  async answer(number: string): Promise<void> {
    await this.releaseRow(number).getByRole('link', { name: 'Answer' }).click();
  }

  async openScorecard(): Promise<void> {
    await this.page.getByRole('link', { name: 'Your scorecard' }).click();
  }
}
