'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { roleAtLeast, type Role } from '@/lib/roles';

const TABS: { href: string; label: string; minimum: Role }[] = [
  { href: '', label: 'Overview', minimum: 'operator' },
  { href: '/sessions', label: 'Sessions', minimum: 'operator' },
  { href: '/layouts', label: 'Layouts', minimum: 'operator' },
  { href: '/members', label: 'Members', minimum: 'operator' },
  { href: '/mail', label: 'Mail outbox', minimum: 'host' },
];

export function RailwayNav({ railwayId, role }: { railwayId: string; role: Role }) {
  const pathname = usePathname();
  const base = `/railways/${railwayId}`;
  return (
    // The tabs wrap onto a second line on a phone rather than scroll out of sight.
    <nav className="no-print border-b border-line" aria-label="Railway">
      <ul className="flex flex-wrap gap-x-1">
        {TABS.filter((t) => roleAtLeast(role, t.minimum)).map((tab) => {
          const href = `${base}${tab.href}`;
          const active = tab.href === '' ? pathname === base : pathname.startsWith(href);
          return (
            <li key={tab.label}>
              <Link
                href={href}
                aria-current={active ? 'page' : undefined}
                className={`block whitespace-nowrap border-b-2 px-3 py-2 text-sm font-semibold ${
                  active ? 'border-verdigris text-ink' : 'border-transparent text-muted hover:text-ink'
                }`}
              >
                {tab.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
