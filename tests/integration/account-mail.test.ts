import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import { outbox, type OutboxMessage } from '@/db/schema';
import {
  absoluteUrl,
  queueAccountExistsMail,
  queueConfirmSignUpMail,
  queueMembershipOfferMail,
  queueResetMail,
  queueSignInLinkMail,
} from '@/lib/mail/account-mail';
import { makeWorld } from './world';

// The account mails (lib/mail/account-mail.ts) as they wait in the outbox: subject, both bodies, the link.
// NEXTAUTH_URL is http://127.0.0.1:3999 (tests/integration/setup.ts).
const ORIGIN = 'http://127.0.0.1:3999';

let counter = 0;
const address = (label: string) => `${label}-${(counter += 1)}@test.example`;

function queuedFor(to: string): OutboxMessage[] {
  return getDb().select().from(outbox).where(eq(outbox.toAddress, to)).all();
}

function onlyMailTo(to: string): OutboxMessage {
  const rows = queuedFor(to);
  expect(rows).toHaveLength(1);
  return rows[0]!;
}

// Numeric character references, the only kind the mails write (HTML Living Standard 13.1.4, "character
// references": &#x; with decimal digits is the code point).
const decodeReferences = (html: string) => html.replace(/&#(\d+);/g, (_, code: string) => String.fromCodePoint(Number(code)));

/**
 * Reads a mail's HTML body: four paragraphs, the second a link. In text between tags a raw `<` or `&`
 * would start a tag or a reference, and in a double-quoted attribute value a raw `"` would end it
 * (HTML Living Standard 13.1.2.3 and 13.1.3; OWASP XSS Prevention Cheat Sheet, rules 1 and 2): escaped
 * text holds none of < > & " ' except as a reference.
 */
function readHtml(html: string | null) {
  const match = /^<p>([^<>]*)<\/p><p><a href="([^<>"]*)">([^<>]*)<\/a><\/p><p>([^<>]*)<\/p><p>([^<>]*)<\/p>$/.exec(html ?? '');
  expect(match, html ?? '(no html)').not.toBeNull();
  const parts = match!.slice(1);
  for (const part of parts) expect(part.replace(/&#\d+;/g, '')).not.toMatch(/[&<>"']/);
  const [intro, href, action, after, signature] = parts.map(decodeReferences);
  return { intro: intro!, href: href!, action: action!, after: after!, signature: signature! };
}

/** The plain-text body: intro, "action:" and the URL on its own line, the closing words, the signature. */
function readText(text: string) {
  const [intro, actionAndUrl, after, signature, ...rest] = text.split('\n\n');
  expect(rest).toEqual([]);
  const [action, url, ...more] = (actionAndUrl ?? '').split('\n');
  expect(more).toEqual([]);
  expect(action).toMatch(/:$/);
  return { intro, action: action!.slice(0, -1), url, after, signature };
}

/** Both bodies say the same thing: the HTML, decoded, is the text paragraph for paragraph. */
function bodiesOf(mail: OutboxMessage) {
  const text = readText(mail.text);
  const html = readHtml(mail.html);
  expect({ intro: html.intro, action: html.action, url: html.href, after: html.after, signature: html.signature }).toEqual(text);
  expect(text.signature).toBe('— Fishplate');
  return text;
}

describe('absoluteUrl', () => {
  it('resolves an app path against NEXTAUTH_URL (WHATWG URL: an absolute path replaces the base’s path)', () => {
    expect(absoluteUrl('/sign-in')).toBe(`${ORIGIN}/sign-in`);
    expect(absoluteUrl('/reply?token=a%2Bb&reply=yes')).toBe(`${ORIGIN}/reply?token=a%2Bb&reply=yes`);
  });
});

describe('account mails', () => {
  // A token with characters a query value must percent-encode (RFC 3986 3.4: "+" "/" "=" "&" have
  // meanings there); the link must carry it back unchanged.
  const token = 'ab+c/d=e&f';

  // The links that act for the recipient, each with the lifetime of its token (lib/tokens.ts: sign-in 15
  // minutes, reset an hour, sign-up a day): the mail must not promise more.
  const tokenMails = [
    {
      name: 'sign-in link',
      queue: queueSignInLinkMail,
      kind: 'sign-in-link',
      subject: 'Your Fishplate sign-in link',
      key: 'sign-in',
      intro: 'Someone (we hope you) asked to sign in to Fishplate with this address.',
      action: 'Sign in to Fishplate',
      after: 'The link works once and expires in 15 minutes. If you did not ask for it, ignore this message.',
      page: '/sign-in/link',
    },
    {
      name: 'password reset',
      queue: queueResetMail,
      kind: 'reset-password',
      subject: 'Reset your Fishplate password',
      key: 'reset',
      intro: 'Someone (we hope you) asked to reset the Fishplate password for this address.',
      action: 'Choose a new password',
      after: 'The link works once and expires in an hour. If you did not ask for it, your password is unchanged.',
      page: '/reset-password',
    },
    {
      name: 'finishing a sign-up',
      queue: queueConfirmSignUpMail,
      kind: 'sign-up',
      subject: 'Finish creating your Fishplate account',
      key: 'sign-up',
      intro: 'Someone (we hope you) asked to create a Fishplate account with this address.',
      action: 'Finish creating my account',
      after: 'The link works once and expires in a day. If you did not ask for it, ignore this message: no account is made.',
      page: '/sign-up/confirm',
    },
  ];

  for (const mail of tokenMails) {
    it(`${mail.name}: its subject, its wording, and a link to ${mail.page} that carries the token back`, () => {
      const to = address(mail.key);
      mail.queue(to, token);
      const row = onlyMailTo(to);
      expect(row).toMatchObject({ railwayId: null, kind: mail.kind, subject: mail.subject });
      expect(row.dedupeKey).toMatch(new RegExp(`^${mail.key}:[0-9a-f-]{36}$`));
      const body = bodiesOf(row);
      expect(body).toMatchObject({ intro: mail.intro, action: mail.action, after: mail.after });
      const url = new URL(body.url!);
      expect(url.origin + url.pathname).toBe(`${ORIGIN}${mail.page}`);
      expect(url.searchParams.get('token')).toBe(token);
      expect([...url.searchParams.keys()]).toEqual(['token']);
    });
  }

  it('an address that already has an account: its subject and wording, and a plain sign-in link (no token)', () => {
    const to = address('exists');
    queueAccountExistsMail(to);
    const mail = onlyMailTo(to);
    expect(mail).toMatchObject({ railwayId: null, kind: 'sign-up-exists', subject: 'You already have a Fishplate account' });
    expect(mail.dedupeKey).toMatch(/^sign-up-exists:[0-9a-f-]{36}$/);
    const body = bodiesOf(mail);
    expect(body.intro).toBe('Someone (we hope you) tried to create a Fishplate account with this address, which already has one.');
    expect(body.action).toBe('Sign in, or reset your password');
    expect(body.after).toBe('Nothing was changed. If it was not you, no action is needed.');
    expect(body.url).toBe(`${ORIGIN}/sign-in`);
  });

  it('every request is its own message: the same mail asked for twice is queued twice', () => {
    // The outbox keeps one message per dedupe key (db/queries/outbox.ts); a second sign-in link asked
    // for a minute later must still go out, so each account mail has a key of its own.
    const to = address('twice');
    queueSignInLinkMail(to, token);
    queueSignInLinkMail(to, token);
    queueResetMail(to, token);
    queueResetMail(to, token);
    queueConfirmSignUpMail(to, token);
    queueConfirmSignUpMail(to, token);
    queueAccountExistsMail(to);
    queueAccountExistsMail(to);
    const offer = { railwayId: makeWorld().railway.id, railwayName: 'Twice Junction', to, role: 'operator', invitedBy: 'Ida Twice', hasAccount: true };
    queueMembershipOfferMail(offer);
    queueMembershipOfferMail(offer);
    const kinds = queuedFor(to).map((m) => m.kind).sort();
    expect(kinds).toEqual(['member-offer', 'member-offer', 'reset-password', 'reset-password', 'sign-in-link', 'sign-in-link', 'sign-up', 'sign-up', 'sign-up-exists', 'sign-up-exists']);
  });
});

describe('membership offer', () => {
  // Names people type, with every character HTML gives a meaning to (OWASP XSS Prevention Cheat Sheet,
  // rule 1: & < > " ' in element content).
  const railwayName = 'Smith & Daughters’ <Quarry> "Loop" line';
  const invitedBy = "Ann O'Neil <b>";

  function offer(hasAccount: boolean) {
    const to = address('offer');
    const railwayId = makeWorld().railway.id;
    queueMembershipOfferMail({ railwayId, railwayName, to, role: 'planner', invitedBy, hasAccount });
    const mail = queuedFor(to)[0]!;
    return { to, railwayId, mail };
  }

  it('names who invited them, the railway and the role; the subject is plain text, the HTML escapes every name', () => {
    const { to, railwayId, mail } = offer(true);
    expect(mail).toMatchObject({ railwayId, kind: 'member-offer', toAddress: to });
    expect(mail.dedupeKey).toMatch(new RegExp(`^member-offer:${railwayId}:${to}:[0-9a-f-]{36}$`));
    // A subject is unstructured text (RFC 5322 2.2.1, 3.6.5): the names go in as typed; nodemailer encodes
    // it for the wire (RFC 2047), which tests/integration/mail.test.ts checks.
    expect(mail.subject).toBe(`Ann O'Neil <b> invited you to join Smith & Daughters’ <Quarry> "Loop" line on Fishplate`);
    const body = bodiesOf(mail);
    expect(body.intro).toBe(
      `Ann O'Neil <b> invited you to join Smith & Daughters’ <Quarry> "Loop" line as planner. Fishplate plans the railway's operating sessions and sends the crew their invitations.`,
    );
    // Each special character is a character reference in the HTML, the names never markup.
    expect(mail.html).toContain('Ann O&#39;Neil &#60;b&#62; invited you to join Smith &#38; Daughters’ &#60;Quarry&#62; &#34;Loop&#34; line as planner.');
    expect(mail.html).not.toContain('<b>');
    expect(mail.html).not.toContain('<Quarry>');
    expect(body.after).toBe(
      'Nothing changes until you accept while signed in with this address. If you do not want to join, decline there or ignore this message.',
    );
  });

  it('sends someone with an account to their Railways page, and someone without one to sign up', () => {
    const member = bodiesOf(offer(true).mail);
    expect(member.action).toBe('Sign in and accept on your Railways page');
    expect(member.url).toBe(`${ORIGIN}/railways`);
    const newcomer = bodiesOf(offer(false).mail);
    expect(newcomer.action).toBe('Create an account with this address, then accept');
    expect(newcomer.url).toBe(`${ORIGIN}/sign-up`);
  });

  it('carries no token: reading the railway’s outbox gives no one access to the account', () => {
    for (const hasAccount of [true, false]) {
      const { mail } = offer(hasAccount);
      expect(mail.text).not.toMatch(/token=/);
      expect(mail.html).not.toMatch(/token=/);
    }
  });
});
