'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

const LOOKS = {
  pills: {
    list: 'flex flex-wrap gap-1',
    tab: 'block whitespace-nowrap rounded-plate px-3 py-1.5 text-sm font-semibold',
    active: 'bg-verdigris-soft text-verdigris-strong',
    idle: 'text-muted hover:bg-sunken hover:text-ink',
  },
  underline: {
    list: 'flex flex-wrap gap-x-1',
    tab: 'block whitespace-nowrap border-b-2 px-3 py-2 text-sm font-semibold',
    active: 'border-verdigris text-ink',
    idle: 'border-transparent text-muted hover:text-ink',
  },
} as const;

/**
 * Links to the pages under `base`, the current one marked for the eye and for screen readers.
 * A tab's `href` is added to `base`; the empty one is `base` itself and is current only there,
 * every other tab is current on its own page and the pages below it. The tabs wrap onto a
 * second line on a phone rather than scroll out of sight.
 */
export function NavTabs({
  label,
  base,
  tabs,
  look,
  className,
}: {
  label: string;
  base: string;
  tabs: readonly { href: string; label: string }[];
  look: keyof typeof LOOKS;
  className?: string;
}) {
  const pathname = usePathname();
  const style = LOOKS[look];
  return (
    <nav className={className} aria-label={label}>
      <ul className={style.list}>
        {tabs.map((tab) => {
          const href = `${base}${tab.href}`;
          const active = tab.href === '' ? pathname === base : pathname.startsWith(href);
          return (
            <li key={tab.label}>
              <Link href={href} aria-current={active ? 'page' : undefined} className={`${style.tab} ${active ? style.active : style.idle}`}>
                {tab.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
