'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { replyByToken } from '@/app/(public)/reply/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';

type Answer = 'accepted' | 'tentative' | 'declined';
const LABELS: Record<Answer, string> = { accepted: 'Accept', tentative: 'Maybe', declined: 'Decline' };
const DONE: Record<string, string> = { accepted: 'accepted', tentative: 'maybe', declined: 'declined' };

/** Three buttons that record an answer with a reply token; after an answer, the fresh token lets the person change it. */
export function ReplyForm({ token, chosen, currentLabel }: { token: string; chosen: Answer; currentLabel: string }) {
  const [state, action, pending] = useActionState(replyByToken, null);
  const current = state?.ok && state.data ? state.data : null;
  const activeToken = current?.nextToken ?? token;
  return (
    <div className="space-y-4">
      {!current ? (
        <p className="text-sm">
          Your answer so far: <strong>{currentLabel}</strong>
        </p>
      ) : null}
      {current ? (
        <Notice tone="good">
          <span data-testid="reply-recorded">Your answer is recorded: {DONE[current.answer] ?? current.answer}.</span>
          {current.joined ? ` You are now an operator of ${current.railwayName}: sign in with a link sent to this address to see your runs.` : ''}
        </Notice>
      ) : null}
      {state && !state.ok ? <Notice tone="bad">{state.error}</Notice> : null}
      <p className="text-sm text-muted">{current ? 'Changed your mind? Answer again:' : `Press to confirm your answer (${LABELS[chosen]} is what your link said):`}</p>
      <form action={action} className="flex flex-col gap-2 sm:flex-row">
        <input type="hidden" name="token" value={activeToken} />
        {(['accepted', 'tentative', 'declined'] as const).map((answer) => (
          <Button
            key={answer}
            type="submit"
            name="answer"
            value={answer}
            disabled={pending}
            variant={!current && answer === chosen ? 'primary' : answer === 'declined' ? 'danger' : 'secondary'}
            className="flex-1 py-3"
          >
            {LABELS[answer]}
          </Button>
        ))}
      </form>
      <p className="text-xs text-muted">
        Already have an account? <Link href="/my-runs" className="text-verdigris underline">See your runs</Link> after signing in.
      </p>
    </div>
  );
}
