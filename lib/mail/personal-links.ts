/** What a host sees in place of a link that acts for the recipient (reply, sign-in, reset). */
export const PERSONAL_LINK_MASK = '[personal link: only in the recipient’s own mailbox]';

/**
 * Masks every URL that carries a token, so that a railway's outbox shows what was sent without
 * letting the host reply, sign in or reset a password as the recipient.
 */
export function maskPersonalLinks(text: string): string {
  return text.replace(/https?:\/\/\S+/g, (url) => (/[?&]token=/.test(url) ? PERSONAL_LINK_MASK : url));
}
