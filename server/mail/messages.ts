/**
 * The product's e-mail notices, each as plain text and simple HTML (every value escaped).
 * Links point at the client's routes under `publicUrl`.
 */
import { formatTimestamp } from '../../shared/time/timestamps.js';
import type { MailKind, MailMessage } from './mailer.js';
import { gradeHeadline, oneAnswerWords } from '../../shared/training/answerWords.js';

const CAUTION = 'Results are aids to a licensed engineer’s judgement; local codes, owner policies and licensed practice govern.';

function escapeHtml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

interface Compose {
  kind: MailKind;
  firmId: number | null;
  to: string;
  subject: string;
  greeting: string;
  paragraphs: string[];
  link?: { label: string; url: string };
  caution?: boolean;
}

function compose(c: Compose): MailMessage {
  const lines = [c.greeting, '', ...c.paragraphs.flatMap((p) => [p, ''])];
  if (c.link) lines.push(`${c.link.label}: ${c.link.url}`, '');
  if (c.caution) lines.push(CAUTION, '');
  lines.push('— Deckshare');
  const html = [
    `<p>${escapeHtml(c.greeting)}</p>`,
    ...c.paragraphs.map((p) => `<p>${escapeHtml(p).replace(/\n/g, '<br>')}</p>`),
    c.link ? `<p><a href="${escapeHtml(c.link.url)}">${escapeHtml(c.link.label)}</a></p>` : '',
    c.caution ? `<p style="color:#555;font-size:90%">${escapeHtml(CAUTION)}</p>` : '',
    '<p>— Deckshare</p>',
  ].join('\n');
  return { kind: c.kind, firmId: c.firmId, to: c.to, subject: c.subject, text: lines.join('\n'), html };
}

export interface Person {
  name: string;
  email: string;
}

export interface VersionRef {
  projectName: string;
  deckName: string;
  versionNumber: number;
}

const versionText = (v: VersionRef) => `version ${v.versionNumber} of deck “${v.deckName}” (project “${v.projectName}”)`;

export function invitationMessage(p: { firmId: number; firmName: string; to: Person; invitedBy: string; link: string; expiresAt: string }): MailMessage {
  return compose({
    kind: 'invitation',
    firmId: p.firmId,
    to: p.to.email,
    subject: `You are invited to Deckshare (${p.firmName})`,
    greeting: `Hello ${p.to.name},`,
    paragraphs: [
      `${p.invitedBy} has given you an account at ${p.firmName} in Deckshare, the firm's tool for live-load distribution factors of slab-on-girder decks.`,
      `Choose your password with the link below. The link works once and expires on ${formatTimestamp(p.expiresAt, 'UTC')}.`,
    ],
    link: { label: 'Set your password', url: p.link },
  });
}

export function reviewRequestedMessage(p: { firmId: number; to: Person; from: string; version: VersionRef; note: string; link: string; resubmission: boolean }): MailMessage {
  return compose({
    kind: 'review-requested',
    firmId: p.firmId,
    to: p.to.email,
    subject: `Review requested: ${p.version.deckName}, version ${p.version.versionNumber}`,
    greeting: `Hello ${p.to.name},`,
    paragraphs: [
      `${p.from} asks you to review ${versionText(p.version)}${p.resubmission ? ', which answers your earlier comments' : ''}.`,
      ...(p.note ? [`Their note: ${p.note}`] : []),
    ],
    link: { label: 'Open the review', url: p.link },
    caution: true,
  });
}

export function versionApprovedMessage(p: { firmId: number; to: Person; reviewer: string; version: VersionRef; note: string; refined: string; link: string }): MailMessage {
  return compose({
    kind: 'version-approved',
    firmId: p.firmId,
    to: p.to.email,
    subject: `Approved: ${p.version.deckName}, version ${p.version.versionNumber}`,
    greeting: `Hello ${p.to.name},`,
    paragraphs: [
      `${p.reviewer} approved ${versionText(p.version)}. The approved version is locked; later versions of the deck need their own review.`,
      `Refined analysis: ${p.refined}`,
      ...(p.note ? [`Reviewer's note: ${p.note}`] : []),
    ],
    link: { label: 'Open the review', url: p.link },
    caution: true,
  });
}

export function versionSentBackMessage(p: { firmId: number; to: Person; reviewer: string; version: VersionRef; note: string; commentCount: number; link: string }): MailMessage {
  return compose({
    kind: 'version-sent-back',
    firmId: p.firmId,
    to: p.to.email,
    subject: `Sent back: ${p.version.deckName}, version ${p.version.versionNumber}`,
    greeting: `Hello ${p.to.name},`,
    paragraphs: [
      `${p.reviewer} sent back ${versionText(p.version)} with ${p.commentCount} comment${p.commentCount === 1 ? '' : 's'}.`,
      `Reason: ${p.note}`,
      'Answer the comments, save a new version of the deck and submit it for review again.',
    ],
    link: { label: 'Open the review', url: p.link },
  });
}

export function assignmentGivenMessage(p: { firmId: number; to: Person; instructor: string; title: string; question: string; dueAt: string; link: string }): MailMessage {
  return compose({
    kind: 'assignment-given',
    firmId: p.firmId,
    to: p.to.email,
    subject: `New exercise: ${p.title}`,
    greeting: `Hello ${p.to.name},`,
    paragraphs: [
      `${p.instructor} has given you an exercise: ${p.question}`,
      `Due ${formatTimestamp(p.dueAt, 'UTC')}. Work it by hand, then enter your values and steps in Deckshare.`,
    ],
    link: { label: 'Open the exercise', url: p.link },
  });
}

/** The grade of a trainee's one answer, in the words of the exercise page (shared/training/answerWords.ts). */
export function submissionGradedMessage(p: { firmId: number; to: Person; title: string; passed: boolean; summary: string; link: string }): MailMessage {
  const headline = gradeHeadline(p.passed);
  return compose({
    kind: 'submission-graded',
    firmId: p.firmId,
    to: p.to.email,
    subject: `${headline}: ${p.title}`,
    greeting: `Hello ${p.to.name},`,
    paragraphs: [`Your answer to “${p.title}” has been graded: ${headline.toLowerCase()}.`, p.summary, oneAnswerWords('graded')],
    link: { label: 'See the comparison', url: p.link },
    caution: true,
  });
}
