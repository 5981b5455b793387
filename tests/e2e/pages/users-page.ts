import type { Locator, Page } from '@playwright/test';

/** The admin's Users page: one row per account with its role, status and reset link. */
export class UsersPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
  }

  row(email: string): Locator {
    return this.page.getByRole('row').filter({ hasText: email });
  }

  /** Asks for a reset link for the person and confirms the question. */
  async emailResetLink(name: string): Promise<void> {
    await this.page.getByRole('button', { name: `E-mail a password-reset link to ${name}` }).click();
    await this.page
      .getByRole('dialog', { name: 'E-mail a password-reset link?' })
      .getByRole('button', { name: 'E-mail the link' })
      .click();
  }

  resetSent(): Locator {
    return this.page.locator('.users-view__alert').filter({ hasText: 'Password-reset link sent to' });
  }
}
