import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { listCaughtMailTo } from '@/db/queries/caught-mail';
import { CaughtMailList } from '@/components/mail/caught-mail-list';
import { Card, Notice } from '@/components/ui/card';
import { requireUser } from '@/lib/auth';
import { env } from '@/lib/env';
import { formatInZone } from '@/lib/time-zone';

export const metadata: Metadata = { title: 'My mail' };
export const dynamic = 'force-dynamic';

/**
 * The signed-in person's own mail, as caught by the local mail catcher (only while there is no
 * SMTP_URL: with a real mail server, mail is in the person's own mailbox). No one else's mail is
 * ever listed here; signed out, `npm run mail:read -- ADDRESS` on the server shows the same.
 */
export default async function MyMailPage() {
  const user = await requireUser();
  if (env().SMTP_URL) notFound();
  const mail = listCaughtMailTo(user.email);
  return (
    <div className="space-y-6">
      <h1 className="font-display text-3xl font-bold">My mail</h1>
      <Notice tone="info">
        Fishplate is not connected to a mail server, so it keeps the e-mail it sends on this machine. Here is what
        was sent to <strong className="break-all">{user.email}</strong>, and to no one else.
      </Notice>
      <Card title={`Caught for you (${mail.length})`}>
        <CaughtMailList
          testId="my-mail"
          items={mail.map((m) => ({ id: m.id, subject: m.subject, meta: `${formatInZone(m.receivedAt, 'UTC')} UTC`, text: m.text }))}
        />
      </Card>
    </div>
  );
}
