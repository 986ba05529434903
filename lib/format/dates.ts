// Dates and times as the product shows them: ISO-like, in UTC, the same on the server and in every browser
// ("2026-12-02" and "2026-12-02 03:15"). One helper over Intl.DateTimeFormat instead of slicing ISO strings.

const PARTS = new Intl.DateTimeFormat('en-GB', {
  timeZone: 'UTC',
  year: 'numeric',
  month: '2-digit',
  day: '2-digit',
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
});

function parts(value: string | Date): Record<string, string> | null {
  const date = typeof value === 'string' ? new Date(value) : value;
  if (Number.isNaN(date.getTime())) return null;
  return Object.fromEntries(PARTS.formatToParts(date).map((p) => [p.type, p.value]));
}

/** "2026-12-02" (UTC); '' for null; an unreadable value is returned as it is. */
export function formatDay(value: string | Date | null | undefined): string {
  if (value === null || value === undefined) return '';
  const p = parts(value);
  return p ? `${p.year}-${p.month}-${p.day}` : String(value);
}

/** "2026-12-02 03:15" (UTC, 24-hour); '' for null; an unreadable value is returned as it is. */
export function formatMinute(value: string | Date | null | undefined): string {
  if (value === null || value === undefined) return '';
  const p = parts(value);
  return p ? `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute}` : String(value);
}
