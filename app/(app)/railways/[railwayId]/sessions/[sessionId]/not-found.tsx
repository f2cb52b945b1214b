import { ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';

export default function SessionNotFound() {
  return (
    <Card title="Session not found">
      <p className="mb-4 text-muted">This session does not exist, belongs to another railway, or is not open to you yet.</p>
      <ButtonLink href="/railways">Back to my railways</ButtonLink>
    </Card>
  );
}
