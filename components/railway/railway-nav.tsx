import { NavTabs } from '@/components/ui/nav-tabs';
import { roleAtLeast, type Role } from '@/lib/roles';

const TABS: { href: string; label: string; minimum: Role }[] = [
  { href: '', label: 'Overview', minimum: 'operator' },
  { href: '/sessions', label: 'Sessions', minimum: 'operator' },
  { href: '/layouts', label: 'Layouts', minimum: 'operator' },
  { href: '/members', label: 'Members', minimum: 'operator' },
  { href: '/mail', label: 'Mail outbox', minimum: 'host' },
];

export function RailwayNav({ railwayId, role }: { railwayId: string; role: Role }) {
  return (
    <NavTabs
      label="Railway"
      base={`/railways/${railwayId}`}
      tabs={TABS.filter((t) => roleAtLeast(role, t.minimum))}
      look="underline"
      className="no-print border-b border-line"
    />
  );
}
