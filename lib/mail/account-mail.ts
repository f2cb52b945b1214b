import 'server-only';
import crypto from 'node:crypto';
import { env } from '@/lib/env';
import { enqueueMail } from '@/lib/mail/outbox';

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function linkMail(lines: { intro: string; action: string; url: string; after: string }) {
  const text = `${lines.intro}\n\n${lines.action}:\n${lines.url}\n\n${lines.after}\n\n— Fishplate`;
  const html = `<p>${escapeHtml(lines.intro)}</p><p><a href="${escapeHtml(lines.url)}">${escapeHtml(
    lines.action,
  )}</a></p><p>${escapeHtml(lines.after)}</p><p>— Fishplate</p>`;
  return { text, html };
}

export function absoluteUrl(pathname: string): string {
  return new URL(pathname, env().NEXTAUTH_URL).toString();
}

/** Queues a one-time sign-in link. */
export function queueSignInLinkMail(to: string, token: string): void {
  const url = absoluteUrl(`/sign-in/link?token=${encodeURIComponent(token)}`);
  enqueueMail({
    railwayId: null,
    dedupeKey: `sign-in:${crypto.randomUUID()}`,
    kind: 'sign-in-link',
    toAddress: to,
    subject: 'Your Fishplate sign-in link',
    ...linkMail({
      intro: 'Someone (we hope you) asked to sign in to Fishplate with this address.',
      action: 'Sign in to Fishplate',
      url,
      after: 'The link works once and expires in 15 minutes. If you did not ask for it, ignore this message.',
    }),
  });
}

/** Queues a password-reset link. */
export function queueResetMail(to: string, token: string): void {
  const url = absoluteUrl(`/reset-password?token=${encodeURIComponent(token)}`);
  enqueueMail({
    railwayId: null,
    dedupeKey: `reset:${crypto.randomUUID()}`,
    kind: 'reset-password',
    toAddress: to,
    subject: 'Reset your Fishplate password',
    ...linkMail({
      intro: 'Someone (we hope you) asked to reset the Fishplate password for this address.',
      action: 'Choose a new password',
      url,
      after: 'The link works once and expires in an hour. If you did not ask for it, your password is unchanged.',
    }),
  });
}

/** Queues the message telling someone they were added to a railway, with a sign-in link. */
export function queueMemberWelcomeMail(input: {
  railwayId: string;
  railwayName: string;
  to: string;
  role: string;
  invitedBy: string;
  token: string;
}): void {
  const url = absoluteUrl(`/sign-in/link?token=${encodeURIComponent(input.token)}`);
  enqueueMail({
    railwayId: input.railwayId,
    dedupeKey: `member:${input.railwayId}:${input.to}:${crypto.randomUUID()}`,
    kind: 'member-welcome',
    toAddress: input.to,
    subject: `${input.invitedBy} added you to ${input.railwayName} on Fishplate`,
    ...linkMail({
      intro: `${input.invitedBy} added you to ${input.railwayName} as ${input.role}. Fishplate plans the railway's operating sessions and sends the crew their invitations.`,
      action: 'Sign in to Fishplate',
      url,
      after: 'The link works once and expires in 15 minutes; afterwards, ask for a new one on the sign-in page.',
    }),
  });
}
