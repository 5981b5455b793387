import type { Locator, Page } from '@playwright/test';

/** The buyer's Horizon screen: filters, demand chart, demand table and a part's drill-down. */
export class HorizonPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation').getByRole('link', { name: 'Horizon' }).click();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { name: 'Horizon', level: 1 });
  }

  /** The canvas ECharts draws the demand chart into. */
  chartCanvas(): Locator {
    return this.page.getByRole('img', { name: /^Gross demand by/ }).locator('canvas');
  }

  /** Links on the part numbers of the demand table, one per row. */
  partButtons(): Locator {
    return this.page.locator('.horizon-table .el-table__body-wrapper').getByRole('button');
  }

  /** Header cells of the demand table that name an ISO week, such as 2026-W49. */
  weekHeaders(): Locator {
    return this.page.locator('.horizon-table .el-table__header-wrapper th').filter({ hasText: /\d{4}-W\d{2}/ });
  }

  async showWeeks(): Promise<void> {
    await this.page.getByRole('radiogroup').getByText('ISO weeks').click();
  }

  async showDays(): Promise<void> {
    await this.page.getByRole('radiogroup').getByText('Days').click();
  }

  /** Types a part number into the search box and presses Enter, which opens its drill-down. */
  async openPart(partNumber: string): Promise<void> {
    const search = this.page.getByRole('textbox', { name: 'Part search' });
    await search.fill(partNumber);
    await search.press('Enter');
  }

  async clearSearch(): Promise<void> {
    await this.page.getByRole('textbox', { name: 'Part search' }).fill('');
  }

  drawer(): Locator {
    return this.page.getByRole('dialog');
  }

  /** The gross-to-net rows of the open drill-down, one per working day. */
  bucketRows(): Locator {
    return this.drawer().locator('.horizon-part-drawer__table .el-table__body-wrapper tr');
  }

  /** The projected available figure of the first working day in the drill-down. */
  firstProjectedAvailable(): Locator {
    return this.bucketRows().first().locator('td').nth(3);
  }

  async closeDrawer(): Promise<void> {
    await this.drawer().getByRole('button', { name: /close/i }).click();
  }

  exportButton(): Locator {
    return this.page.getByRole('button', { name: 'Export CSV' });
  }

  /** The note a live refresh leaves in the drill-down's header. */
  drawerUpdatedNote(): Locator {
    return this.drawer().getByText(/Updated (just now|a minute ago|\d+ minutes ago)/);
  }
}
