import type { Metadata } from 'next';
import { ReplyForm } from '@/components/invitations/reply-form';
import { Card, Notice } from '@/components/ui/card';
import { formatInZone } from '@/lib/time-zone';
import { inspectReplyToken, REPLY_PAGE_LABELS } from '@/lib/invitations/reply';
import { MAX_REPLY_COMMENT, REPLIES, type Reply } from '@/lib/validations/invitation';

export const metadata: Metadata = { title: 'Reply to an invitation', robots: { index: false } };
export const dynamic = 'force-dynamic';

// Opening the link changes nothing: the reply is recorded when the person presses the button,
// so a mail scanner that follows links ahead of the reader cannot reply for them.
export default async function ReplyPage({ searchParams }: { searchParams: Promise<{ token?: string; reply?: string; answer?: string }> }) {
  const params = await searchParams;
  const token = params.token;
  // Links sent before the reply had one name say `answer=`; they still choose the button.
  const reply = params.reply ?? params.answer;
  const chosen: Reply = REPLIES.includes(reply as Reply) ? (reply as Reply) : 'accepted';
  const inspected = token ? inspectReplyToken(token) : null;
  return (
    <div className="space-y-4">
      <h1 className="font-display text-2xl font-bold">Reply to an invitation</h1>
      {!token ? <Notice tone="bad">This link has no reply token. Use the buttons in your invitation e-mail.</Notice> : null}
      {inspected && !inspected.ok ? (
        <Notice tone="bad">
          {inspected.error}
          {'current' in inspected && inspected.current ? ` (Recorded now: ${REPLY_PAGE_LABELS[inspected.current]}.)` : ''}
        </Notice>
      ) : null}
      {token && inspected?.ok ? (
        <Card>
          <div className="space-y-1" data-testid="reply-session">
            <p className="text-xs font-semibold uppercase tracking-widest text-brass">{inspected.found.railwayName}</p>
            <h2 className="font-display text-xl font-bold">{inspected.found.session.title}</h2>
            <p className="text-sm text-muted">
              {formatInZone(inspected.found.session.startsAt, inspected.found.session.timeZone)} · {inspected.found.session.timeZone}
              {inspected.found.session.place ? ` · ${inspected.found.session.place}` : ''}
            </p>
            <p className="text-sm">For {inspected.found.inviteeName}</p>
            {inspected.found.session.replyBy ? (
              <p className="text-sm" data-testid="reply-deadline">
                {inspected.found.session.replyBy.getTime() < Date.now() ? (
                  <>The reply deadline was {formatInZone(inspected.found.session.replyBy, inspected.found.session.timeZone)}. Your reply still counts; the host sees it marked late.</>
                ) : (
                  <>Please reply by <strong>{formatInZone(inspected.found.session.replyBy, inspected.found.session.timeZone)}</strong>.</>
                )}
              </p>
            ) : null}
          </div>
          <div className="mt-4">
            <ReplyForm
              token={token}
              chosen={chosen}
              currentLabel={REPLY_PAGE_LABELS[inspected.found.invitation.reply]}
              comment={inspected.found.invitation.comment}
              maxComment={MAX_REPLY_COMMENT}
            />
          </div>
        </Card>
      ) : null}
    </div>
  );
}
