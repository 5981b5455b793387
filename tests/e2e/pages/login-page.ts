import type { Page } from '@playwright/test';

/** The sign-in page, driven the way a person uses it: labels, a button, the Enter key. */
export class LoginPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.goto('/login');
  }

  async signIn(email: string, password: string): Promise<void> {
    await this.page.getByLabel('E-mail').fill(email);
    await this.page.getByLabel('Password').fill(password);
    await this.page.getByRole('button', { name: 'Sign in' }).click();
  }

  errorMessage() {
    return this.page.getByRole('alert');
  }
}
