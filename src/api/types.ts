/**
 * Shapes of the Deckshare HTTP API as the client receives them (see the server's routes).
 * Timestamps are ISO 8601 strings; ids are integers.
 */
import type { DeckInput } from '@shared/deck/schema';

export const ROLES = ['admin', 'designer', 'reviewer', 'instructor', 'trainee'] as const;
export type Role = (typeof ROLES)[number];

/** Plain-word labels for each role, for tags and menus. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  designer: 'Designer',
  reviewer: 'Reviewer',
  instructor: 'Instructor',
  trainee: 'Trainee',
};

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  firmId: number;
  firmName: string;
  roles: Role[];
  mustChangePassword: boolean;
}

export interface PersonRef {
  id: number;
  name: string;
}

export type UnitSystem = 'US' | 'SI';

export const UNIT_LABELS: Record<UnitSystem, string> = {
  US: 'US customary',
  SI: 'SI (metric)',
};

export interface Project {
  id: number;
  name: string;
  ownerAgency: string;
  location: string;
  units: UnitSystem;
  notes: string;
  archived: boolean;
  createdAt: string;
  updatedAt: string;
  createdBy: PersonRef;
  deckCount: number;
}

export interface NewProject {
  name: string;
  ownerAgency?: string;
  location?: string;
  units: UnitSystem;
  notes?: string;
}

export type ProjectChanges = Partial<Omit<NewProject, 'units'>> & { units?: UnitSystem; archived?: boolean };

export type ArchivedFilter = 'exclude' | 'include' | 'only';

export interface VersionSummary {
  id: number;
  deckId: number;
  number: number;
  message: string;
  createdAt: string;
  createdBy: PersonRef;
  basedOnVersionId: number | null;
}

export interface DeckSummary {
  id: number;
  projectId: number;
  name: string;
  createdAt: string;
  createdBy: PersonRef;
  latestVersion: VersionSummary;
}

export interface StoredResult {
  method: string;
  solverVersion: string;
  /** Present when the version was fetched with its results (`?include=results`). */
  data?: unknown;
  createdAt: string;
}

/** Why a version's results are hidden from the reader (a trainee's open exercise on it). */
export interface ResultsWithheld {
  reason: 'open-exercise';
  message: string;
  exercises: { id: number; title: string }[];
}

export interface DeckVersion extends VersionSummary {
  deck: DeckInput;
  placements: unknown | null;
  results: StoredResult[];
  /** Set when the results are hidden from this reader until they submit their exercise. */
  resultsWithheld?: ResultsWithheld | null;
}

export interface AdminUser {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  mustChangePassword: boolean;
  disabled: boolean;
  createdAt: string;
}

export interface NewUser {
  email: string;
  name: string;
  roles: Role[];
}

export interface UserChanges {
  name?: string;
  roles?: Role[];
  disabled?: boolean;
}

/** One page of a long list, newest first: pass `nextCursor` back to get the next page. */
export interface Page {
  limit: number;
  total: number;
  nextCursor: string | null;
}

export interface AuditEntry {
  id: number;
  at: string;
  actor: PersonRef;
  action: string;
  entityType: string;
  entityId: number | string;
  summary: string;
}
