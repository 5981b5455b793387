import type { Locator, Page } from '@playwright/test';

/** The public page behind an e-mailed reset link. */
export class PasswordResetPage {
  constructor(private readonly page: Page) {}

  async setPassword(password: string, repeat = password): Promise<void> {
    await this.page.getByLabel('New password', { exact: true }).fill(password);
    await this.page.getByLabel('Repeat new password').fill(repeat);
    await this.page.getByRole('button', { name: 'Set password' }).click();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { level: 1 });
  }
}
