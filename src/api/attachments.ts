/**
 * Project drawings and CSV imports: multipart uploads (the JSON wrapper in ./http cannot send
 * files), with the same CSRF header and the same typed errors as every other request.
 */
import { ApiError, CSRF_COOKIE, CSRF_HEADER, errorFromResponse, http, readCookie, request } from './http';
import type { PersonRef } from './types';

export interface Attachment {
  id: number;
  projectId: number;
  title: string;
  originalName: string;
  contentType: 'application/pdf' | 'image/png' | 'image/jpeg';
  sizeBytes: number;
  sha256: string;
  uploadedBy: PersonRef;
  createdAt: string;
  downloadUrl: string;
}

/** Largest drawing the server accepts, bytes (20 MB). */
export const MAX_DRAWING_BYTES = 20 * 1024 * 1024;

async function upload<T>(path: string, form: FormData): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const token = readCookie(CSRF_COOKIE);
  if (token) headers[CSRF_HEADER] = token;
  let response: Response;
  try {
    response = await fetch(path, { method: 'POST', body: form, headers, credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network_error', 'Could not reach the Deckshare server. Check your network connection and try again.');
  }
  const text = await response.text().catch(() => '');
  let body: unknown;
  try {
    body = text ? JSON.parse(text) : undefined;
  } catch {
    body = undefined;
  }
  if (!response.ok) throw errorFromResponse(response.status, body);
  return body as T;
}

export async function listAttachments(projectId: number): Promise<Attachment[]> {
  const { attachments } = await http.get<{ attachments: Attachment[] }>(`/api/projects/${projectId}/attachments`);
  return attachments;
}

export async function uploadAttachment(projectId: number, file: File, title?: string): Promise<Attachment> {
  const form = new FormData();
  if (title) form.append('title', title);
  form.append('file', file, file.name);
  const { attachment } = await upload<{ attachment: Attachment }>(`/api/projects/${projectId}/attachments`, form);
  return attachment;
}

export async function deleteAttachment(attachmentId: number): Promise<void> {
  await request<void>(`/api/attachments/${attachmentId}`, { method: 'DELETE' });
}

export interface GirderLayoutImport {
  dryRun: boolean;
  imported: { girderCount: number; offsets: number[]; spacings: number[]; section: Record<string, number>; basedOnVersion: number };
  version: { id: number; number: number } | null;
}

export function girderLayoutTemplateUrl(units: 'US' | 'SI'): string {
  return `/api/imports/girder-layout/template?units=${units}`;
}

/** Imports a girder layout CSV into a deck (a new version), or only checks it (`dryRun`). */
export async function importGirderLayout(deckId: number, file: File, options: { dryRun: boolean; message?: string }): Promise<GirderLayoutImport> {
  const form = new FormData();
  form.append('deckId', String(deckId));
  form.append('dryRun', String(options.dryRun));
  if (options.message) form.append('message', options.message);
  form.append('file', file, file.name);
  return upload<GirderLayoutImport>('/api/imports/girder-layout', form);
}
