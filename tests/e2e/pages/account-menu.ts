import { expect, type Locator, type Page } from '@playwright/test';

/** The signed-in person's menu in the top bar and its "Change password" dialog. */
export class AccountMenu {
  constructor(private readonly page: Page) {}

  async openPasswordDialog(): Promise<Locator> {
    await this.page.getByRole('button', { name: /^Account of / }).click();
    await this.page.getByRole('menuitem', { name: 'Change password' }).click();
    const dialog = this.dialog();
    await expect(dialog).toBeVisible();
    return dialog;
  }

  dialog(): Locator {
    return this.page.getByRole('dialog', { name: 'Change password' });
  }

  async fillPasswords(current: string, next: string, repeat = next): Promise<void> {
    const dialog = this.dialog();
    await dialog.getByLabel('Current password').fill(current);
    await dialog.getByLabel('New password', { exact: true }).fill(next);
    await dialog.getByLabel('Repeat new password').fill(repeat);
  }

  async submit(): Promise<void> {
    await this.dialog().getByRole('button', { name: 'Change password' }).click();
  }

  /** The message Element Plus shows under a form input. */
  errorUnder(label: string): Locator {
    return this.dialog()
      .locator('.el-form-item')
      .filter({ has: this.page.getByLabel(label, { exact: true }) })
      .locator('.el-form-item__error');
  }
}
