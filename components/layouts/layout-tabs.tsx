import { NavTabs } from '@/components/ui/nav-tabs';

const TABS = [
  { href: '', label: 'Overview' },
  { href: '/track', label: 'Blocks & links' },
  { href: '/power', label: 'Power' },
  { href: '/stock', label: 'Rolling stock' },
  { href: '/wiring', label: 'Wiring' },
];

export function LayoutTabs({ base }: { base: string }) {
  return <NavTabs label="Layout" base={base} tabs={TABS} look="pills" />;
}
