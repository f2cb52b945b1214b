import type { Metadata } from 'next';
import { listCaughtMailForRailway } from '@/db/queries/caught-mail';
import { listOutbox } from '@/db/queries/outbox';
import { CaughtMailList } from '@/components/mail/caught-mail-list';
import { NotAllowed } from '@/components/railway/not-allowed';
import { Badge, Card, Notice } from '@/components/ui/card';
import { env } from '@/lib/env';
import { formatInZone } from '@/lib/time-zone';
import { maskPersonalLinks } from '@/lib/mail/personal-links';
import { memberForPage } from '@/lib/auth/pages';
import { getRailway } from '@/db/queries/railways';

export const metadata: Metadata = { title: 'Mail outbox' };
export const dynamic = 'force-dynamic';

const STATUS_TONE = { queued: 'warn', sending: 'info', sent: 'good', failed: 'bad' } as const;

export default async function MailPage({ params }: { params: Promise<{ railwayId: string }> }) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'host', `/railways/${railwayId}/mail`);
  if (!member) return <NotAllowed needs="host" />;
  const zone = getRailway(railwayId)?.timeZone ?? 'UTC';
  const localCatcher = !env().SMTP_URL;
  const outgoing = listOutbox(railwayId);
  const caught = localCatcher ? listCaughtMailForRailway(railwayId) : [];
  return (
    <div className="space-y-6">
      <h1 className="sr-only">Mail outbox</h1>
      {localCatcher ? (
        <Notice tone="info">
          Fishplate is not connected to a mail server (no <code>SMTP_URL</code>), so it catches its own e-mail on this
          machine and shows here what this railway sent. Links that act for the recipient (reply buttons) are masked:
          each person reads their own mail under <strong>My mail</strong>, and sign-in and password-reset mail is never
          shown here. Set <code>SMTP_URL</code> to send real e-mail; this view then shows delivery status only.
        </Notice>
      ) : null}
      <Card title="Delivery status">
        {outgoing.length === 0 ? (
          <p className="text-sm text-muted">No e-mail has been sent for this railway yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead className="text-muted">
                <tr>
                  <th className="py-2 pr-3">To</th>
                  <th className="py-2 pr-3">Subject</th>
                  <th className="py-2 pr-3">Status</th>
                  <th className="py-2">Queued</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-line">
                {outgoing.map((m) => (
                  <tr key={m.id}>
                    <td className="py-2 pr-3">{m.toAddress}</td>
                    <td className="py-2 pr-3">
                      {m.subject}
                      {m.lastError ? <span className="block text-xs text-signal">Last try: {m.lastError}</span> : null}
                    </td>
                    <td className="py-2 pr-3">
                      <Badge tone={STATUS_TONE[m.status]}>{m.status}</Badge>
                      {m.attempts > 1 ? <span className="ml-1 text-xs text-muted">{m.attempts} tries</span> : null}
                    </td>
                    <td className="py-2 text-muted">{formatInZone(m.createdAt, zone)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Card>
      {localCatcher ? (
        <Card title={`Caught on this machine (${caught.length})`}>
          <CaughtMailList
            testId="caught-mail"
            items={caught.map((m) => ({
              id: m.id,
              subject: m.subject,
              meta: `to ${m.toAddresses.replace(/^,|,$/g, '').replaceAll(',', ', ')} · ${formatInZone(m.receivedAt, zone)}`,
              text: maskPersonalLinks(m.text),
            }))}
          />
        </Card>
      ) : null}
    </div>
  );
}
