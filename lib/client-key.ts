import 'server-only';
import { headers } from 'next/headers';
import { env } from '@/lib/env';
import { PEER_HEADER } from '@/lib/peer-address';

/** `::ffff:192.0.2.1` and `192.0.2.1` are one client. */
function normalise(address: string): string {
  const trimmed = address.trim().toLowerCase();
  return trimmed.startsWith('::ffff:') && trimmed.includes('.') ? trimmed.slice(7) : trimmed;
}

/**
 * The caller's address for limits. The socket's own peer address (stamped on every request by
 * lib/peer-address.ts, overwriting whatever the client sent under that name), unless that peer is
 * one of TRUSTED_PROXIES: then X-Forwarded-For is read from the right, skipping trusted proxies,
 * and the first address not ours is the client. With no trusted proxy configured, forwarding
 * headers are ignored, so made-up X-Forwarded-For values do not make new clients.
 */
export function clientAddressFrom(h: Headers, trustedProxies: readonly string[]): string {
  const peer = normalise(h.get(PEER_HEADER) ?? '');
  if (!peer) return 'unknown';
  const trusted = new Set(trustedProxies.map(normalise));
  if (!trusted.has(peer)) return peer;
  const hops = (h.get('x-forwarded-for') ?? '').split(',').map(normalise).filter(Boolean).slice(-20);
  for (let i = hops.length - 1; i >= 0; i--) if (!trusted.has(hops[i]!)) return hops[i]!;
  return peer;
}

/** The caller's address for this request ("unknown" outside a request, as in scripts and tests). */
export async function clientAddress(): Promise<string> {
  let h: Headers;
  try {
    h = await headers();
  } catch {
    return 'unknown';
  }
  return clientAddressFrom(h, env().TRUSTED_PROXIES);
}
