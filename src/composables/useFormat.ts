/** Display formats shared by the views (moments as the e-mails and reports write them, in the reader's zone). */
import { formatTimestamp } from '@shared/time/timestamps';

const dateOnly = new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'short', day: 'numeric' });

/** "Dec 5, 2026, 14:09 GMT+1" in the reader's zone, named: the e-mails' and reports' way (shared/time/timestamps.ts). */
export function formatDateTime(iso: string): string {
  return formatTimestamp(iso);
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
