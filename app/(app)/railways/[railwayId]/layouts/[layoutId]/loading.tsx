import { CardSkeleton } from '@/components/ui/card';

export default function Loading() {
  return (
    <div className="space-y-6" aria-busy="true" aria-label="Loading">
      <CardSkeleton lines={6} />
      <CardSkeleton lines={3} />
    </div>
  );
}
