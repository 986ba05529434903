import { SheetSkeleton } from '@/components/sheet/sheet-skeleton';

export default function Loading() {
  return <SheetSkeleton />;
}
