import Link from 'next/link';
import { LayoutTabs } from '@/components/layouts/layout-tabs';
import { layoutForPage } from '@/lib/layouts/layout-page';

export default async function LayoutShell({ children, params }: { children: React.ReactNode; params: Promise<{ railwayId: string; layoutId: string }> }) {
  const { railwayId, layoutId } = await params;
  const { layout } = await layoutForPage(railwayId, layoutId);
  const base = `/railways/${railwayId}/layouts/${layoutId}`;
  return (
    <div className="space-y-4">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-end sm:justify-between">
        <div>
          <Link href={`/railways/${railwayId}/layouts`} className="text-sm text-muted hover:text-ink">
            ← Layouts
          </Link>
          <h1 className="font-display text-xl font-bold" data-testid="layout-name">
            {layout.name}
          </h1>
          <p className="text-sm text-muted">
            {layout.scaleName} · 1:{layout.scaleRatio} · {layout.setting}
          </p>
        </div>
        <LayoutTabs base={base} />
      </div>
      {children}
    </div>
  );
}
