import 'server-only';
import { readClockNow } from '@/lib/live/clock';
import type { Session } from '@/lib/live/types';
import { buildLiveState } from '@/lib/live/state';
import { MyLiveRuns } from './my-live-runs';

/** On My runs: the session's live panel once its clock has been started (nothing before). */
export function MyLiveRunsSlot({ session, userId }: { session: Session; userId: string }) {
  if (readClockNow(session).state === 'not-started') return null;
  return <MyLiveRuns sessionId={session.id} railwayId={session.railwayId} userId={userId} initial={buildLiveState(session.id)} />;
}
