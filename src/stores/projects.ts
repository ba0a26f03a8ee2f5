/** The firm's projects (bridges), and the decks and audit trail of the open project. */
import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as projectsApi from '@/api/projects';
import * as decksApi from '@/api/decks';
import * as auditApi from '@/api/audit';
import { appendNextPage } from '@/composables/usePagedList';
import type { ArchivedFilter, AuditEntry, DeckSummary, NewProject, Page, Project, ProjectChanges } from '@/api/types';

export const useProjectsStore = defineStore('projects', () => {
  const projects = ref<Project[]>([]);
  const archivedFilter = ref<ArchivedFilter>('exclude');
  const loading = ref(false);
  /** Error of the last list load, as a readable sentence (null when fine). */
  const listError = ref<string | null>(null);

  /** The project opened in the project view, with its decks and audit entries. */
  const current = ref<Project | null>(null);
  const currentDecks = ref<DeckSummary[]>([]);
  const currentAudit = ref<AuditEntry[]>([]);
  /** The last audit page fetched (total, and the cursor of older entries). */
  const auditPage = ref<Page | null>(null);

  async function fetchProjects(filter: ArchivedFilter = archivedFilter.value): Promise<void> {
    archivedFilter.value = filter;
    loading.value = true;
    try {
      projects.value = await projectsApi.listProjects(filter);
      listError.value = null;
    } catch (error) {
      listError.value = error instanceof Error ? error.message : 'Could not load the projects.';
      throw error;
    } finally {
      loading.value = false;
    }
  }

  function replaceInList(project: Project): void {
    const index = projects.value.findIndex((p) => p.id === project.id);
    const visible =
      archivedFilter.value === 'include' ||
      (archivedFilter.value === 'only' ? project.archived : !project.archived);
    if (index >= 0) {
      if (visible) projects.value.splice(index, 1, project);
      else projects.value.splice(index, 1);
    } else if (visible) {
      projects.value.unshift(project);
    }
    if (current.value?.id === project.id) current.value = project;
  }

  async function createProject(input: NewProject): Promise<Project> {
    const project = await projectsApi.createProject(input);
    replaceInList(project);
    return project;
  }

  async function updateProject(projectId: number, changes: ProjectChanges): Promise<Project> {
    const project = await projectsApi.updateProject(projectId, changes);
    replaceInList(project);
    return project;
  }

  /** Loads one project, its decks and (when `withAudit`) its audit entries. */
  async function openProject(projectId: number, withAudit: boolean): Promise<void> {
    if (current.value?.id !== projectId) {
      current.value = null;
      currentDecks.value = [];
      currentAudit.value = [];
    }
    const [project, decks] = await Promise.all([
      projectsApi.getProject(projectId),
      decksApi.listDecks(projectId),
    ]);
    current.value = project;
    currentDecks.value = decks;
    if (withAudit) await refreshAudit(projectId);
    else {
      currentAudit.value = [];
      auditPage.value = null;
    }
  }

  /** Loads the newest page of the project's audit trail. */
  async function refreshAudit(projectId: number): Promise<void> {
    const answer = await auditApi.listProjectAudit(projectId);
    currentAudit.value = answer.entries;
    auditPage.value = answer.page;
  }

  /** Appends the next (older) page of the audit trail. */
  async function fetchOlderAudit(projectId: number): Promise<void> {
    await appendNextPage(currentAudit, auditPage, async (cursor) => {
      const answer = await auditApi.listProjectAudit(projectId, cursor);
      return { rows: answer.entries, page: answer.page };
    });
  }

  return {
    projects,
    archivedFilter,
    loading,
    listError,
    current,
    currentDecks,
    currentAudit,
    auditPage,
    fetchProjects,
    createProject,
    updateProject,
    openProject,
    refreshAudit,
    fetchOlderAudit,
  };
});
