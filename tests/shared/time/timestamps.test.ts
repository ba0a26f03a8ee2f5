/**
 * One way to write a moment (shared/time/timestamps.ts) in the e-mails, the audit, the package
 * and on screen (common practice, no source): "Dec 5, 2026, 13:09 UTC", the zone always named.
 */
import { describe, expect, it } from 'vitest';
import { formatTimestamp } from '../../../shared/time/timestamps.js';
import { formatDateTime } from '../../../src/composables/useFormat.js';
import { assignmentGivenMessage, invitationMessage } from '../../../server/mail/messages.js';

describe('timestamps', () => {
  it('write month, day, year, 24-hour time and the zone', () => {
    expect(formatTimestamp('2026-12-05T13:09:00.000Z', 'UTC')).toBe('Dec 5, 2026, 13:09 UTC');
    expect(formatTimestamp('2026-12-05T00:05:00.000Z', 'UTC')).toBe('Dec 5, 2026, 00:05 UTC');
    expect(formatTimestamp('2026-07-01T12:00:00.000Z', 'America/Chicago')).toBe('Jul 1, 2026, 07:00 CDT');
    expect(formatTimestamp('not a time', 'UTC')).toBe('not a time');
  });

  it('read the same in an e-mail and on a screen set to the same zone', () => {
    const iso = '2026-12-05T13:09:00.000Z';
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    expect(formatDateTime(iso)).toBe(formatTimestamp(iso, zone));
    const invite = invitationMessage({ firmId: 1, to: { email: 'new@larchmont-ridge.example', name: 'Noor Haddad' } as never, firmName: 'Larchmont Ridge Engineering', invitedBy: 'Priya Natarajan', link: 'http://localhost/x', expiresAt: iso });
    expect(JSON.stringify(invite)).toContain('expires on Dec 5, 2026, 13:09 UTC.');
    const exercise = assignmentGivenMessage({ firmId: 1, to: { email: 'trainee@larchmont-ridge.example', name: 'Noor Haddad' }, instructor: 'Priya Natarajan', title: 'Exterior girder', question: 'q', dueAt: iso, link: 'http://localhost/x' } as never);
    expect(JSON.stringify(exercise)).toContain('Due Dec 5, 2026, 13:09 UTC.');
  });
});
