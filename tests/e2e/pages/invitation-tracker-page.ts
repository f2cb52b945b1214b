import Database from 'better-sqlite3';
import { expect, type Page } from '@playwright/test';

/** The demo session's ids, read from the e2e database the web server was seeded into. */
export function demoSessionIds(): { railwayId: string; sessionId: string } {
  const db = new Database(`data/e2e-${process.env.E2E_PORT ?? 3210}.db`, { readonly: true, fileMustExist: true });
  try {
    const row = db.prepare("select id, railway_id as railwayId from sessions where title = 'December running evening'").get() as
      | { id: string; railwayId: string }
      | undefined;
    if (!row) throw new Error('demo session not seeded');
    return { railwayId: row.railwayId, sessionId: row.id };
  } finally {
    db.close();
  }
}

export class InvitationTrackerPage {
  constructor(private readonly page: Page) {}

  async goto(railwayId: string, sessionId: string) {
    await this.page.goto(`/railways/${railwayId}/sessions/${sessionId}/invitations`);
    await expect(this.page.getByRole('heading', { name: 'Invitations' })).toBeVisible();
  }

  row(email: string) {
    return this.page.locator(`[data-testid="invitation-row"][data-email="${email}"]`);
  }

  rows() {
    return this.page.getByTestId('invitation-row');
  }

  count(label: string) {
    return this.page.getByTestId(`count-${label}`).locator('dd');
  }
}

export class InvitationReplyPage {
  constructor(private readonly page: Page) {}

  async confirm(reply: 'Accept' | 'Maybe' | 'Decline') {
    await expect(this.page.getByRole('heading', { name: 'Reply to an invitation' })).toBeVisible();
    await this.page.getByRole('button', { name: reply, exact: true }).click();
    await expect(this.page.getByTestId('reply-recorded')).toContainText('Your reply is recorded');
  }
}
