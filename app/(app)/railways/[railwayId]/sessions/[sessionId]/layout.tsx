import { notFound } from 'next/navigation';
import { memberForPage } from '@/lib/auth/pages';
import { sessionForPage } from '@/lib/auth/pages';

/**
 * Every session page: another railway's session, a made-up id, or one the member may not see is a
 * 404 here, before the pages' loading skeleton (loading.tsx) starts the stream — a not-found page
 * thrown inside that boundary would already have been answered 200.
 */
export default async function SessionShell({ children, params }: { children: React.ReactNode; params: Promise<{ railwayId: string; sessionId: string }> }) {
  const { railwayId, sessionId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/sessions/${sessionId}`);
  if (member) sessionForPage(member, sessionId);
  else notFound();
  return children;
}
