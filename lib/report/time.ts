/** A date-time as the report prints it: 2026-11-03 09:30 UTC. */
export function reportTime(iso: string | null): string {
  if (!iso) return '—';
  return `${iso.slice(0, 16).replace('T', ' ')} UTC`;
}
