import { CardSkeleton } from '@/components/ui/card';

export default function Loading() {
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]" aria-busy="true" aria-label="Loading">
      <CardSkeleton lines={5} />
      <CardSkeleton lines={3} />
    </div>
  );
}
