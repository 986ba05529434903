import { formatMinute } from '@/lib/format/dates';

/** A date-time as the report prints it: 2026-11-03 09:30 UTC. */
export function reportTime(iso: string | null): string {
  if (!iso) return '—';
  return `${formatMinute(iso)} UTC`;
}
