/** The editable fields of a project, their limits (as the API enforces them) and checks. */
import type { NewProject, Project, UnitSystem } from '@/api/types';

export interface ProjectDraft {
  name: string;
  ownerAgency: string;
  location: string;
  units: UnitSystem;
  notes: string;
}

export const PROJECT_FIELDS = ['name', 'ownerAgency', 'location', 'units', 'notes'] as const;
export type ProjectField = (typeof PROJECT_FIELDS)[number];

export const PROJECT_LIMITS = { name: 200, ownerAgency: 200, location: 200, notes: 5000 } as const;

export function emptyDraft(): ProjectDraft {
  return { name: '', ownerAgency: '', location: '', units: 'US', notes: '' };
}

export function draftOf(project: Project): ProjectDraft {
  return {
    name: project.name,
    ownerAgency: project.ownerAgency ?? '',
    location: project.location ?? '',
    units: project.units,
    notes: project.notes ?? '',
  };
}

/** The draft as the API's create body (text trimmed). */
export function toNewProject(draft: ProjectDraft): NewProject {
  return {
    name: draft.name.trim(),
    ownerAgency: draft.ownerAgency.trim(),
    location: draft.location.trim(),
    units: draft.units,
    notes: draft.notes.trim(),
  };
}

/** Only the fields that differ from the stored project. */
export function changesOf(project: Project, draft: ProjectDraft): Partial<NewProject> {
  const next = toNewProject(draft);
  const before = draftOf(project);
  const changes: Partial<NewProject> = {};
  if (next.name !== before.name) changes.name = next.name;
  if (next.ownerAgency !== before.ownerAgency) changes.ownerAgency = next.ownerAgency;
  if (next.location !== before.location) changes.location = next.location;
  if (next.units !== before.units) changes.units = next.units;
  if (next.notes !== before.notes) changes.notes = next.notes;
  return changes;
}

/** The client's own checks, the same rules the API applies; field → message. */
export function checkDraft(draft: ProjectDraft): Partial<Record<ProjectField, string>> {
  const problems: Partial<Record<ProjectField, string>> = {};
  const name = draft.name.trim();
  if (!name) problems.name = 'Give the project a name.';
  else if (name.length > PROJECT_LIMITS.name) {
    problems.name = `The name may have at most ${PROJECT_LIMITS.name} characters (it has ${name.length}).`;
  }
  for (const field of ['ownerAgency', 'location', 'notes'] as const) {
    const length = draft[field].trim().length;
    if (length > PROJECT_LIMITS[field]) {
      problems[field] = `At most ${PROJECT_LIMITS[field]} characters (this has ${length}).`;
    }
  }
  if (draft.units !== 'US' && draft.units !== 'SI') problems.units = 'Choose US customary or SI units.';
  return problems;
}
