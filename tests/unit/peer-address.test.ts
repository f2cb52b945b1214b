// lib/peer-address.ts stamps every request a node:http server receives with its socket's peer
// address, replacing whatever the client sent under that header. A real server on a free port of
// 127.0.0.1, closed at the end of each test. The module is loaded again for each test (vi.resetModules,
// then import): its header name is a module-level value, which a mutation test run switches only
// in a module evaluated after its beforeAll.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

const installed = globalThis as unknown as { fishplatePeerInstalled?: boolean };
const originalEmit = http.Server.prototype.emit;
let install: () => void;

beforeEach(async () => {
  delete installed.fishplatePeerInstalled;
  vi.resetModules();
  ({ installPeerAddressHeader: install } = await import('@/lib/peer-address'));
});

afterEach(() => {
  http.Server.prototype.emit = originalEmit;
  delete installed.fishplatePeerInstalled;
});

/** Sends one request with the given headers; answers the x-fishplate-peer value the server saw. */
async function seenPeer(headers: Record<string, string>): Promise<string | undefined> {
  const server = http.createServer((req, res) => res.end(JSON.stringify({ peer: req.headers['x-fishplate-peer'] ?? null })));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  try {
    const { port } = server.address() as AddressInfo;
    const res = await fetch(`http://127.0.0.1:${port}/`, { headers });
    return ((await res.json()) as { peer?: string }).peer;
  } finally {
    await new Promise((resolve) => server.close(resolve));
  }
}

describe('installPeerAddressHeader', () => {
  it('stamps x-fishplate-peer with the socket address, over a value the client made up', async () => {
    install();
    expect(await seenPeer({ 'x-fishplate-peer': '203.0.113.66' })).toBe('127.0.0.1');
    expect(await seenPeer({})).toBe('127.0.0.1');
  });

  it('installs once however often it is called', () => {
    install();
    const wrapped = http.Server.prototype.emit;
    expect(wrapped).not.toBe(originalEmit);
    install();
    expect(http.Server.prototype.emit).toBe(wrapped);
  });
});
