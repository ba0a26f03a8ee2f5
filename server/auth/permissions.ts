/**
 * The permission matrix: which roles may perform each action. Every API route names one of
 * these actions (see `allow`). README's permission table is checked against this object by
 * tests/server/permissions.test.ts.
 */
import type { Role } from '../db/schema.js';

const ALL: readonly Role[] = ['admin', 'designer', 'reviewer', 'instructor', 'trainee'];

export const PERMISSIONS = {
  /** See the firm's projects, decks, versions and results. */
  'project:read': ALL,
  /** Create a project. */
  'project:create': ['admin', 'designer'],
  /** Rename, edit, archive or restore a project. */
  'project:update': ['admin', 'designer'],
  /** Save a deck (a new deck or a new version of one). */
  'deck:save': ['admin', 'designer', 'instructor'],
  /** Read a project's audit trail. */
  'audit:read': ['admin', 'designer', 'reviewer', 'instructor'],
  /** Create users of the firm, set their roles, disable them, reset passwords. */
  'users:manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

export function mayPerform(roles: readonly Role[], action: Action): boolean {
  const allowed: readonly Role[] = PERMISSIONS[action];
  return roles.some((r) => allowed.includes(r));
}
