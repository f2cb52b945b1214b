'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { replyByToken } from '@/app/(public)/reply/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { inputClass } from '@/components/ui/field';

type Reply = 'accepted' | 'tentative' | 'declined';
const LABELS: Record<Reply, string> = { accepted: 'Accept', tentative: 'Maybe', declined: 'Decline' };
const DONE: Record<string, string> = { accepted: 'accepted', tentative: 'maybe', declined: 'declined' };

/** Three buttons that record a reply with a reply token; after a reply, the fresh token lets the person change it. */
export function ReplyForm({
  token,
  chosen,
  currentLabel,
  comment,
  maxComment,
}: {
  token: string;
  chosen: Reply;
  currentLabel: string;
  comment: string;
  maxComment: number;
}) {
  const [state, action, pending] = useActionState(replyByToken, null);
  const current = state?.ok && state.data ? state.data : null;
  const activeToken = current?.nextToken ?? token;
  return (
    <div className="space-y-4">
      {!current ? (
        <p className="text-sm">
          Your reply so far: <strong>{currentLabel}</strong>
        </p>
      ) : null}
      {current ? (
        <Notice tone="good">
          <span data-testid="reply-recorded">Your reply is recorded: {DONE[current.reply] ?? current.reply}.</span>
          {current.joined ? ` You are now an operator of ${current.railwayName}: sign in with a link sent to this address to see your runs.` : ''}
          {current.late ? ' It came after the reply deadline, so the host sees it marked late.' : ''}
        </Notice>
      ) : null}
      {state && !state.ok ? <Notice tone="bad">{state.error}</Notice> : null}
      <p className="text-sm text-muted">{current ? 'Changed your mind? Reply again:' : `Press to confirm your reply (${LABELS[chosen]} is what your link said):`}</p>
      <form action={action} className="space-y-3">
        <input type="hidden" name="token" value={activeToken} />
        <label className="block text-sm">
          <span className="font-semibold">A note for the host</span> <span className="text-muted">(optional, up to {maxComment} characters; only the host sees it)</span>
          <textarea name="comment" rows={2} maxLength={maxComment} defaultValue={comment} className={`${inputClass} mt-1`} placeholder="e.g. I can come after 19:00" />
        </label>
        <div className="flex flex-col gap-2 sm:flex-row">
        {(['accepted', 'tentative', 'declined'] as const).map((reply) => (
          <Button
            key={reply}
            type="submit"
            name="reply"
            value={reply}
            disabled={pending}
            variant={!current && reply === chosen ? 'primary' : reply === 'declined' ? 'danger' : 'secondary'}
            className="flex-1 py-3"
          >
            {LABELS[reply]}
          </Button>
        ))}
        </div>
      </form>
      <p className="text-xs text-muted">
        Already have an account? <Link href="/my-runs" className="text-verdigris underline">See your runs</Link> after signing in.
      </p>
    </div>
  );
}
