import { expect, type Page } from '@playwright/test';

export class SignInPage {
  constructor(private readonly page: Page) {}

  async goto(callbackUrl?: string) {
    await this.page.goto(callbackUrl ? `/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}` : '/sign-in');
  }

  async signIn(email: string, password: string) {
    await this.page.getByLabel('E-mail address', { exact: true }).fill(email);
    await this.page.getByLabel('Password').fill(password);
    await this.page.getByRole('button', { name: 'Sign in', exact: true }).click();
  }

  async requestLink(email: string) {
    await this.page.getByLabel('E-mail address for the link').fill(email);
    await this.page.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
    await expect(this.page.getByText('a sign-in link is on its way')).toBeVisible();
  }
}
