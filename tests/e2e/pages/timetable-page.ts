import { expect, type Locator, type Page } from '@playwright/test';

/** The timetable builder of one session. */
export class TimetablePage {
  constructor(private readonly page: Page) {}

  get findings(): Locator {
    return this.page.getByTestId('findings-panel');
  }

  finding(kind: string): Locator {
    return this.page.locator(`[data-testid="finding"][data-kind="${kind}"]`);
  }

  /** The group of findings of one kind (a disclosure with a count). */
  findingGroup(kind: string): Locator {
    return this.page.locator(`[data-testid="finding-group"][data-kind="${kind}"]`);
  }

  get errorCount(): Locator {
    return this.page.getByTestId('error-count');
  }

  get graph(): Locator {
    return this.page.getByTestId('train-graph');
  }

  get graphClashes(): Locator {
    return this.page.getByTestId('graph-clash');
  }

  get clashingGraphRuns(): Locator {
    return this.page.locator('[data-testid="graph-run"][data-clash="true"]');
  }

  get selectedGraphRuns(): Locator {
    return this.page.locator('[data-testid="graph-run"][data-selected="true"]');
  }

  /** Duplicates a session from the Sessions list to a new date and waits for the draft copy's builder. */
  async duplicateFromSessions(railwayUrl: string, title: string, date: string) {
    await this.page.goto(`${railwayUrl}/sessions`);
    const row = this.page.getByTestId('session-row').filter({ hasText: title }).first();
    await row.getByText('Duplicate as a starting point…').click();
    await row.getByLabel(`New date for a copy of ${title}`).fill(date);
    await row.getByRole('button', { name: 'Duplicate' }).click();
    await expect(this.page.getByTestId('session-title')).toContainText('draft');
  }

  /**
   * Opens the earliest session of that title. The list is in date order, and the tests that duplicate
   * the demo session date their copies years later, so this is the seeded one.
   */
  async openFromSessions(railwayUrl: string, title: string) {
    await this.page.goto(`${railwayUrl}/sessions`);
    await this.page.getByRole('link', { name: title, exact: true }).first().click();
    await expect(this.page.getByTestId('session-title')).toContainText(title);
    await expect(this.graph).toBeVisible();
  }

  async showView(name: 'Train graph' | 'Calendar' | 'Load' | 'Print') {
    await this.page.getByRole('tab', { name }).click();
    await expect(this.page.getByRole('tab', { name })).toHaveAttribute('aria-selected', 'true');
  }

  runRow(text: string): Locator {
    return this.page.getByTestId('run-row').filter({ hasText: text });
  }

  /** Types a new fast-clock departure into a run's row and confirms it. */
  async setDeparture(row: Locator, fast: string) {
    const input = row.getByTestId('run-depart');
    await input.fill(fast);
    await input.press('Enter');
  }

  async repairTiming() {
    await this.page.getByTestId('repair-timing').click();
    const dialog = this.page.getByTestId('retime-dialog');
    await expect(dialog.getByTestId('retime-move').first()).toBeVisible();
    return dialog;
  }
}
