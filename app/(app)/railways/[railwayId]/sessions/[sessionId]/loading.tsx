import { CardSkeleton } from '@/components/ui/card';

export default function Loading() {
  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_22rem]" aria-busy="true" aria-label="Loading the timetable">
      <CardSkeleton lines={8} />
      <CardSkeleton lines={4} />
    </div>
  );
}
