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

/**
 * Queues the message offering someone membership of a railway. It carries no sign-in link and no
 * token: the person joins by accepting on their Railways page while signed in with this address,
 * so reading this message (in the railway's outbox, say) gives no one access to their account.
 */
export function queueMembershipOfferMail(input: {
  railwayId: string;
  railwayName: string;
  to: string;
  role: string;
  invitedBy: string;
  hasAccount: boolean;
}): void {
  const url = absoluteUrl(input.hasAccount ? '/railways' : '/sign-up');
  enqueueMail({
    railwayId: input.railwayId,
    dedupeKey: `member-offer:${input.railwayId}:${input.to}:${crypto.randomUUID()}`,
    kind: 'member-offer',
    toAddress: input.to,
    subject: `${input.invitedBy} invited you to join ${input.railwayName} on Fishplate`,
    ...linkMail({
      intro: `${input.invitedBy} invited you to join ${input.railwayName} as ${input.role}. Fishplate plans the railway's operating sessions and sends the crew their invitations.`,
      action: input.hasAccount ? 'Sign in and accept on your Railways page' : 'Create an account with this address, then accept',
      url,
      after: 'Nothing changes until you accept while signed in with this address. If you do not want to join, decline there or ignore this message.',
    }),
  });
}

/** Queues the link that finishes creating an account (nothing is usable until it is followed). */
export function queueConfirmSignUpMail(to: string, token: string): void {
  const url = absoluteUrl(`/sign-up/confirm?token=${encodeURIComponent(token)}`);
  enqueueMail({
    railwayId: null,
    dedupeKey: `sign-up:${crypto.randomUUID()}`,
    kind: 'sign-up',
    toAddress: to,
    subject: 'Finish creating your Fishplate account',
    ...linkMail({
      intro: 'Someone (we hope you) asked to create a Fishplate account with this address.',
      action: 'Finish creating my account',
      url,
      after: 'The link works once and expires in a day. If you did not ask for it, ignore this message: no account is made.',
    }),
  });
}

/** Tells the owner of an address that someone tried to create a second account with it. */
export function queueAccountExistsMail(to: string): void {
  enqueueMail({
    railwayId: null,
    dedupeKey: `sign-up-exists:${crypto.randomUUID()}`,
    kind: 'sign-up-exists',
    toAddress: to,
    subject: 'You already have a Fishplate account',
    ...linkMail({
      intro: 'Someone (we hope you) tried to create a Fishplate account with this address, which already has one.',
      action: 'Sign in, or reset your password',
      url: absoluteUrl('/sign-in'),
      after: 'Nothing was changed. If it was not you, no action is needed.',
    }),
  });
}
