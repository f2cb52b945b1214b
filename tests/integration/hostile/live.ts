import type { World } from '../authz/shared';
import { makeSessionWorld } from '../authz/sessions';
import { perWorld, type HostileTarget } from './shared';

// The session is real (authz/sessions.ts's published session with two runs); the body is hostile.
const world = perWorld((w: World) => makeSessionWorld(w));
const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const post = (path: string, body: string) =>
  new Request(`http://127.0.0.1:3999${path}`, { method: 'POST', body, headers: { 'content-type': 'application/json' } });

export const LIVE_HOSTILE: HostileTarget[] = [
  {
    target: 'app/api/sessions/[sessionId]/clock/route.ts#POST',
    kind: 'json',
    setup: world,
    send: async (w, body) => {
      const { POST } = await import('@/app/api/sessions/[sessionId]/clock/route');
      const { session } = world(w);
      return (await POST(post(`/api/sessions/${session.id}/clock`, body), ctx({ sessionId: session.id }))).status;
    },
  },
];
