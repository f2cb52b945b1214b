import http from 'node:http';

/** The request header that carries the socket's peer address inside this process. */
export const PEER_HEADER = 'x-fishplate-peer';

const globalForPeer = globalThis as unknown as { fishplatePeerInstalled?: boolean };

/**
 * Route handlers and server actions see only headers, not the socket, and Next fills in
 * X-Forwarded-For only when the client did not send one. So every HTTP server in this process
 * stamps each request with its socket's peer address under PEER_HEADER before anything else reads
 * it — replacing any value the client sent — and lib/client-key.ts decides from it whether the
 * forwarding headers come from a configured proxy. Installed once, at server start.
 */
export function installPeerAddressHeader(): void {
  if (globalForPeer.fishplatePeerInstalled) return;
  globalForPeer.fishplatePeerInstalled = true;
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function emitWithPeer(this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === 'request') {
      const request = args[0] as http.IncomingMessage;
      request.headers[PEER_HEADER] = request.socket?.remoteAddress ?? '';
    }
    return (emit as (this: http.Server, event: string | symbol, ...rest: unknown[]) => boolean).call(this, event, ...args);
  } as typeof emit;
}
