import { Card } from '@/components/ui/card';
import { ROLE_LABELS, type Role } from '@/lib/roles';

export function NotAllowed({ needs }: { needs: Role }) {
  return (
    <Card title="Not open to your role">
      <p className="text-muted">
        This page is for the railway&apos;s {ROLE_LABELS[needs].toLowerCase()}s
        {needs === 'planner' ? ' and hosts' : ''}. Ask your host if you need access.
      </p>
    </Card>
  );
}
