/** A project's audit trail (admin, reviewer, designer, instructor). */
import { http } from './http';
import type { AuditEntry } from './types';

export async function listProjectAudit(projectId: number): Promise<AuditEntry[]> {
  const { entries } = await http.get<{ entries: AuditEntry[] }>(`/api/projects/${projectId}/audit`);
  return entries;
}
