/**
 * One way to write a moment, for every screen, e-mail, audit line and report:
 * "Dec 5, 2026, 13:09 UTC" — month, day, year, 24-hour time and the time zone named. Servers
 * write UTC (their readers are anywhere); a screen writes the reader's own zone, named, so the
 * same moment reads the same way in an e-mail and in the outbox.
 */

const formats = new Map<string, Intl.DateTimeFormat>();

function formatFor(timeZone: string | undefined): Intl.DateTimeFormat {
  const key = timeZone ?? '';
  let f = formats.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      year: 'numeric',
      month: 'short',
      day: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
      timeZoneName: 'short',
      ...(timeZone ? { timeZone } : {}),
    });
    formats.set(key, f);
  }
  return f;
}

/** An ISO timestamp as "Dec 5, 2026, 13:09 UTC" in `timeZone` (default: the runtime's own); unreadable text is returned as given. */
export function formatTimestamp(iso: string, timeZone?: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : formatFor(timeZone).format(date);
}
