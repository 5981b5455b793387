import type { Locator, Page } from '@playwright/test';

/** The Imports screen, driven as a buyer or planner uses it: the rail, a kind, a file, one button. */
export class ImportsPage {
  constructor(private readonly page: Page) {}

  async openFromRail(): Promise<void> {
    await this.page.getByRole('navigation').getByRole('link', { name: 'Imports' }).click();
    await this.page.getByRole('heading', { name: 'Imports', level: 1 }).waitFor();
  }

  /** Picks what the file holds by the words on its card, e.g. "On-hand counts". */
  async chooseKind(label: string): Promise<void> {
    await this.page.getByRole('radiogroup', { name: 'What the file holds' }).getByText(label, { exact: true }).click();
  }

  kind(label: string): Locator {
    return this.page.getByRole('radio', { name: new RegExp(`^${label}`) });
  }

  /** Puts a CSV into the drop area's file input, as choosing it in the file dialog does. */
  async chooseCsv(fileName: string, text: string): Promise<void> {
    await this.page
      .locator('.imports-view__drop input[type="file"]')
      .setInputFiles({ name: fileName, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf-8') });
  }

  importButton(): Locator {
    return this.page.getByRole('button', { name: /import \d+ rows?$/i });
  }

  problemReport(): Locator {
    return this.page.getByRole('region', { name: /nothing was imported/ });
  }

  /** The cells of each row of the problem table, top to bottom. */
  async problemRows(): Promise<string[][]> {
    const rows = this.problemReport().locator('.el-table__body tr');
    return rows.evaluateAll((elements) =>
      elements.map((row) => [...row.querySelectorAll('td')].map((cell) => cell.textContent?.trim() ?? '')),
    );
  }

  previewRowsWithProblems(): Locator {
    return this.page.getByRole('region', { name: 'Preview' }).locator('tr.has-problem');
  }

  result(): Locator {
    return this.page.locator('.el-result');
  }
}
