/**
 * The firm-level storage quota. Database triggers count the bytes each firm's deck versions
 * and analysis results hold (table firm_storage, migration 0005); a save that would take the
 * firm past its quota (FIRM_STORAGE_QUOTA_MB) is refused with 403 'storage_quota_reached'
 * before anything is written. Saved versions are never deleted, so the message says how to
 * get room: ask the administrator of the installation for a larger quota.
 */
import { eq } from 'drizzle-orm';
import { firmStorage } from '../db/schema.js';
import type { DbOrTx } from '../api/audit/auditService.js';
import { ApiError } from '../middleware/errors.js';

export function firmStoredBytes(db: DbOrTx, firmId: number): number {
  return db.select({ bytes: firmStorage.bytes }).from(firmStorage).where(eq(firmStorage.firmId, firmId)).get()?.bytes ?? 0;
}

export function formatBytes(n: number): string {
  const units = ['bytes', 'KB', 'MB', 'GB', 'TB'];
  let v = n;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return i === 0 ? `${n} bytes` : `${Number.isInteger(v) ? v : v.toFixed(1)} ${units[i]}`;
}

/** Refuses (403) a write of `addingBytes` that would take the firm past `quotaBytes`. */
export function assertWithinQuota(db: DbOrTx, firmId: number, quotaBytes: number, addingBytes: number): void {
  const used = firmStoredBytes(db, firmId);
  if (used + addingBytes <= quotaBytes) return;
  throw ApiError.forbidden(
    `the firm's stored data has reached its quota of ${formatBytes(quotaBytes)} (${formatBytes(used)} stored, this save needs ${formatBytes(addingBytes)} more); nothing was saved — ask the administrator of this Deckshare installation to raise FIRM_STORAGE_QUOTA_MB`,
    'storage_quota_reached',
  );
}
