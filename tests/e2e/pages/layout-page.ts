import { expect, type Page } from '@playwright/test';

/** The layout screens: tabs, the add row of each table, links, CSV import and the power budget. */
export class LayoutPage {
  constructor(private readonly page: Page) {}

  tab(name: string) {
    return this.page.getByRole('navigation', { name: 'Layout' }).getByRole('link', { name, exact: true });
  }

  async openTab(name: string) {
    await this.tab(name).click();
    await expect(this.tab(name)).toHaveAttribute('aria-current', 'page');
  }

  /** Fills the add row of a table (`noun` is block, supply, driver, …) and presses its Add button. */
  async addRow(noun: string, fields: Record<string, string>, selects: Record<string, string> = {}) {
    const row = this.page.getByTestId(`${noun}-new-row`);
    const before = await this.page.getByTestId(`${noun}-row`).count();
    for (const [header, label] of Object.entries(selects)) {
      await row.getByLabel(`${header} of new ${noun}`, { exact: true }).selectOption({ label });
    }
    for (const [header, value] of Object.entries(fields)) {
      await row.getByLabel(`${header} of new ${noun}`, { exact: true }).fill(value);
    }
    await row.getByRole('button', { name: `Add ${noun}` }).click();
    await expect(this.page.getByTestId(`${noun}-row`)).toHaveCount(before + 1);
  }

  async link(from: string, to: string) {
    const rows = this.page.getByTestId('links-table').locator('tbody tr');
    const before = (await this.page.getByTestId('links-table').getByRole('button', { name: /^Delete link/ }).count());
    await this.page.getByLabel('From block').selectOption({ label: from });
    await this.page.getByLabel('To block').selectOption({ label: to });
    await this.page.getByRole('button', { name: 'Link', exact: true }).click();
    await expect(this.page.getByTestId('links-table').getByRole('button', { name: /^Delete link/ })).toHaveCount(before + 1);
    return rows;
  }

  csv(table: string) {
    return this.page.getByTestId(`csv-${table}`);
  }

  async checkCsv(table: string, text: string) {
    const panel = this.csv(table);
    if (!(await panel.getByLabel('Or paste, and fix here').isVisible())) await panel.getByText(`Import ${table} from CSV`).click();
    await panel.getByLabel('Or paste, and fix here').fill(text);
    await panel.getByRole('button', { name: 'Check file' }).click();
    await expect(panel.getByTestId('csv-preview')).toBeVisible();
  }
}
