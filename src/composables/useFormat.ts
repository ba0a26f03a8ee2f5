/** Display formats shared by the views (dates in the reader's locale, relative when recent). */

const dateTime = new Intl.DateTimeFormat(undefined, {
  year: 'numeric',
  month: 'short',
  day: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});
const dateOnly = new Intl.DateTimeFormat(undefined, { year: 'numeric', month: 'short', day: 'numeric' });

/** "12 Mar 2026, 14:05" style; an unreadable timestamp is shown as given. */
export function formatDateTime(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTime.format(date);
}

export function formatDate(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateOnly.format(date);
}

/** Sort comparator for ISO timestamps. */
export function compareIso(a: string, b: string): number {
  return new Date(a).getTime() - new Date(b).getTime();
}

/** Locale-aware, case-insensitive text comparison for table sorters. */
export function compareText(a: string | null | undefined, b: string | null | undefined): number {
  return (a ?? '').localeCompare(b ?? '', undefined, { sensitivity: 'base', numeric: true });
}
