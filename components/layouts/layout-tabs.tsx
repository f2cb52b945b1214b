'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

const TABS = [
  { href: '', label: 'Overview' },
  { href: '/track', label: 'Blocks & links' },
  { href: '/power', label: 'Power' },
  { href: '/stock', label: 'Rolling stock' },
  { href: '/wiring', label: 'Wiring' },
];

export function LayoutTabs({ base }: { base: string }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Layout">
      <ul className="flex flex-wrap gap-1">
        {TABS.map((tab) => {
          const href = `${base}${tab.href}`;
          const active = tab.href === '' ? pathname === base : pathname.startsWith(href);
          return (
            <li key={tab.label}>
              <Link
                href={href}
                aria-current={active ? 'page' : undefined}
                className={`block whitespace-nowrap rounded-plate px-3 py-1.5 text-sm font-semibold ${active ? 'bg-verdigris-soft text-verdigris-strong' : 'text-muted hover:bg-sunken hover:text-ink'}`}
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
