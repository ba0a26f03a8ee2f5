/** The firm's outbox of e-mail notices and the invitations to set a password. */
import { http } from './http';
import type { Page, PersonRef, SessionUser } from './types';

export const MAIL_KIND_LABELS = {
  invitation: 'invitation',
  'review-requested': 'review requested',
  'version-approved': 'version approved',
  'version-sent-back': 'version sent back',
  'assignment-given': 'exercise given',
  'submission-graded': 'submission graded',
} as const;
export type MailKind = keyof typeof MAIL_KIND_LABELS;

export interface OutboxMessage {
  id: number;
  kind: MailKind | '';
  from: string;
  to: string;
  subject: string;
  receivedAt: string;
  sizeBytes: number;
  text: string;
  html?: string | null;
}

export interface Invitation {
  id: number;
  user: { id: number; name: string; email: string };
  invitedBy: PersonRef;
  createdAt: string;
  expiresAt: string;
  usedAt: string | null;
  status: 'pending' | 'used' | 'expired' | 'replaced';
}

/** A page of the outbox, newest first. */
export async function listOutbox(query: { kind?: MailKind; to?: string; cursor?: string } = {}): Promise<{ messages: OutboxMessage[]; page: Page }> {
  return http.get<{ messages: OutboxMessage[]; page: Page }>('/api/mail/outbox', query);
}

export async function getOutboxMessage(id: number): Promise<OutboxMessage> {
  const { message } = await http.get<{ message: OutboxMessage }>(`/api/mail/outbox/${id}`);
  return message;
}

export async function listInvitations(): Promise<Invitation[]> {
  const { invitations } = await http.get<{ invitations: Invitation[] }>('/api/invitations');
  return invitations;
}

export async function inviteUser(userId: number): Promise<Invitation> {
  const { invitation } = await http.post<{ invitation: Invitation }>('/api/invitations', { userId });
  return invitation;
}

export async function describeInvitation(token: string): Promise<{ email: string; name: string; firmName: string; expiresAt: string }> {
  const { invitation } = await http.get<{ invitation: { email: string; name: string; firmName: string; expiresAt: string } }>(`/api/invitations/${encodeURIComponent(token)}`);
  return invitation;
}

/** Chooses the password from an invitation; the server signs the user in. */
export async function acceptInvitation(token: string, password: string): Promise<SessionUser> {
  const { user } = await http.post<{ user: SessionUser }>(`/api/invitations/${encodeURIComponent(token)}/accept`, { password });
  return user;
}
