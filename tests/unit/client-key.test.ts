// lib/client-key.ts: which address the limits count a request against. The socket peer (stamped by
// lib/peer-address.ts), unless that peer is a configured proxy: then X-Forwarded-For is read from the
// right (the de-facto convention: each proxy appends the address it received from; RFC 7239 §5.2
// describes the same order for Forwarded), skipping our own proxies.
import { describe, expect, it } from 'vitest';
import { clientAddress, clientAddressFrom } from '@/lib/client-key';

const PROXY = '10.0.0.2';
const from = (peer: string | null, xff?: string, trusted: string[] = [PROXY]) => {
  const h = new Headers();
  if (peer !== null) h.set('x-fishplate-peer', peer);
  if (xff !== undefined) h.set('x-forwarded-for', xff);
  return clientAddressFrom(h, trusted);
};

describe('clientAddressFrom', () => {
  it('is "unknown" without a peer address (a request not from a socket)', () => {
    expect(from(null)).toBe('unknown');
    expect(from('  ')).toBe('unknown');
  });

  it('takes the socket peer, and ignores X-Forwarded-For from anyone but a trusted proxy', () => {
    expect(from('198.51.100.7', '203.0.113.1')).toBe('198.51.100.7');
    expect(from('198.51.100.7', '203.0.113.1', [])).toBe('198.51.100.7');
  });

  it('counts an IPv4-mapped IPv6 peer as its IPv4 address (RFC 4291 §2.5.5.2), but keeps the hex form as written', () => {
    expect(from('::FFFF:198.51.100.7')).toBe('198.51.100.7');
    expect(from('::ffff:c633:6407')).toBe('::ffff:c633:6407');
    expect(from('::ffff:10.0.0.2', '203.0.113.1')).toBe('203.0.113.1'); // the trusted proxy, written mapped
  });

  it('behind a trusted proxy reads X-Forwarded-For from the right, skipping our proxies and empty items', () => {
    expect(from(PROXY, '203.0.113.1')).toBe('203.0.113.1');
    expect(from(PROXY, '192.0.2.66, 203.0.113.1')).toBe('203.0.113.1'); // the left one is the client's own claim
    expect(from(PROXY, '203.0.113.1, 10.0.0.3', [PROXY, '10.0.0.3'])).toBe('203.0.113.1');
    expect(from(PROXY, '203.0.113.1, ,')).toBe('203.0.113.1');
  });

  it('falls back to the proxy itself when the header is missing or names only our proxies', () => {
    expect(from(PROXY)).toBe(PROXY);
    expect(from(PROXY, '')).toBe(PROXY);
    expect(from(PROXY, `${PROXY}, ${PROXY}`)).toBe(PROXY);
  });

  it('reads at most the last 20 hops (a bound on work per request)', () => {
    const ours = Array.from({ length: 20 }, () => PROXY);
    expect(from(PROXY, ['203.0.113.9', ...ours].join(','))).toBe(PROXY);
    expect(from(PROXY, ['203.0.113.9', ...ours.slice(1)].join(','))).toBe('203.0.113.9');
  });
});

describe('clientAddress', () => {
  it('is "unknown" outside a request (scripts, tests)', async () => {
    expect(await clientAddress()).toBe('unknown');
  });
});
