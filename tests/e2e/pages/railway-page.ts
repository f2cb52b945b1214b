import { expect, type Page } from '@playwright/test';

export class RailwayPage {
  constructor(private readonly page: Page) {}

  async openFromList(name: string) {
    await this.page.goto('/railways');
    await this.page.getByRole('link', { name: new RegExp(name) }).click();
    await expect(this.page.getByTestId('railway-name')).toHaveText(name);
  }

  tab(name: string) {
    return this.page.getByRole('navigation', { name: 'Railway' }).getByRole('link', { name });
  }

  async openTab(name: string) {
    await this.tab(name).click();
    await expect(this.tab(name)).toHaveAttribute('aria-current', 'page');
  }
}
