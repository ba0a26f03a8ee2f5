/** Projects (bridges) of the signed-in user's firm. */
import { http } from './http';
import type { ArchivedFilter, NewProject, Project, ProjectChanges } from './types';

export async function listProjects(archived: ArchivedFilter = 'exclude'): Promise<Project[]> {
  const { projects } = await http.get<{ projects: Project[] }>('/api/projects', { archived });
  return projects;
}

export async function getProject(projectId: number): Promise<Project> {
  const { project } = await http.get<{ project: Project }>(`/api/projects/${projectId}`);
  return project;
}

export async function createProject(input: NewProject): Promise<Project> {
  const { project } = await http.post<{ project: Project }>('/api/projects', input);
  return project;
}

export async function updateProject(projectId: number, changes: ProjectChanges): Promise<Project> {
  const { project } = await http.patch<{ project: Project }>(`/api/projects/${projectId}`, changes);
  return project;
}
