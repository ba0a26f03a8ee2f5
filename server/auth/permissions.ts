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
  /** See review rounds, their comments and the refined-analysis summary. */
  'review:read': ['admin', 'designer', 'reviewer', 'instructor'],
  /** Submit a deck version for review to a chosen reviewer, or withdraw the submission. */
  'review:submit': ['admin', 'designer'],
  /** Comment on a review round (its reviewer and its designer only). */
  'review:comment': ['designer', 'reviewer'],
  /** Approve or send back a version, record whether a refined analysis is justified (the assigned reviewer only). */
  'review:decide': ['reviewer'],
  /** Download the calculation package (PDF) and the CSV tables of a version. */
  'report:export': ['admin', 'designer', 'reviewer', 'instructor'],
  /** Attach a drawing (PDF, PNG, JPEG) to a project. */
  'attachment:upload': ['admin', 'designer', 'reviewer', 'instructor'],
  /** Delete a project's drawing. */
  'attachment:delete': ['admin', 'designer'],
  /** Make training exercises from deck versions, assign them, read submissions and grades. */
  'training:manage': ['instructor'],
  /** See one's own exercises and submit answers. */
  'training:submit': ['trainee'],
  /** See a project's parameter studies, their points and their CSV. */
  'study:read': ['admin', 'designer', 'reviewer', 'instructor'],
  /** Start, cancel and resume a parameter study from a saved deck version. */
  'study:create': ['designer', 'instructor'],
  /** Read the firm's outbox of e-mail notices (local mail service). */
  'mail:read': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

export function mayPerform(roles: readonly Role[], action: Action): boolean {
  const allowed: readonly Role[] = PERMISSIONS[action];
  return roles.some((r) => allowed.includes(r));
}
