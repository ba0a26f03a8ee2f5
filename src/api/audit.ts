/** A project's audit trail (admin, reviewer, designer, instructor), a page at a time, newest first. */
import { http } from './http';
import type { AuditEntry, Page } from './types';

export async function listProjectAudit(projectId: number, cursor?: string): Promise<{ entries: AuditEntry[]; page: Page }> {
  return http.get<{ entries: AuditEntry[]; page: Page }>(`/api/projects/${projectId}/audit`, cursor ? { cursor } : {});
}
