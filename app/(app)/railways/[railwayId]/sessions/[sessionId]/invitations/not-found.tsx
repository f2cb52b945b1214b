import Link from 'next/link';
import { Card } from '@/components/ui/card';

export default function InvitationsNotFound() {
  return (
    <Card title="Session not found">
      <p className="text-muted">
        This session does not exist, or it belongs to a railway you are not a member of.{' '}
        <Link href="/railways" className="text-verdigris underline">Back to your railways</Link>
      </p>
    </Card>
  );
}
