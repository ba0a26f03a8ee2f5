/**
 * Deckshare's database schema (SQLite through Drizzle). One file; migrations are generated
 * from it by drizzle-kit into server/db/migrations and applied at start-up.
 *
 * Immutability: deck versions, analysis results, the audit log, review comments, submissions
 * and the outbox are append-only. Triggers (migrations 0001, 0003, 0005) refuse UPDATE and
 * DELETE on those tables and any INSERT whose key already exists (so INSERT OR REPLACE,
 * REPLACE INTO and upserts cannot swap a row either), so not even a bug can change a saved
 * version. Stored bytes per firm are counted by triggers into firm_storage (migration 0005).
 * Timestamps are ISO-8601 strings in UTC.
 */
import { sql } from 'drizzle-orm';
import { blob, index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

export const ROLES = ['admin', 'designer', 'reviewer', 'instructor', 'trainee'] as const;
export type Role = (typeof ROLES)[number];

/** The current UTC time as ISO 8601 text, in SQL (column defaults and updates). */
export const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`;

export const firms = sqliteTable('firms', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  createdAt: text('created_at').notNull().default(now),
});

export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    email: text('email').notNull(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    mustChangePassword: integer('must_change_password', { mode: 'boolean' }).notNull().default(true),
    disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
    createdAt: text('created_at').notNull().default(now),
    passwordChangedAt: text('password_changed_at'),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email), index('users_firm_idx').on(t.firmId)],
);

export const userRoles = sqliteTable(
  'user_roles',
  {
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: ROLES }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.role] })],
);

/** Signed-in sessions; the token carries the session id so sign-out can revoke it. */
export const sessions = sqliteTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: text('created_at').notNull().default(now),
    expiresAt: text('expires_at').notNull(),
    revokedAt: text('revoked_at'),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const projects = sqliteTable(
  'projects',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    name: text('name').notNull(),
    ownerAgency: text('owner_agency').notNull().default(''),
    location: text('location').notNull().default(''),
    units: text('units', { enum: ['US', 'SI'] }).notNull().default('US'),
    notes: text('notes').notNull().default(''),
    archived: integer('archived', { mode: 'boolean' }).notNull().default(false),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
    updatedAt: text('updated_at').notNull().default(now),
  },
  (t) => [index('projects_firm_idx').on(t.firmId)],
);

/** A saved deck configuration; its content lives in immutable versions. */
export const decks = sqliteTable(
  'decks',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    projectId: integer('project_id')
      .notNull()
      .references(() => projects.id),
    name: text('name').notNull(),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [index('decks_project_idx').on(t.projectId)],
);

/** Every save of a deck: never updated, never deleted. The highest number is current. */
export const deckVersions = sqliteTable(
  'deck_versions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    deckId: integer('deck_id')
      .notNull()
      .references(() => decks.id),
    number: integer('number').notNull(),
    /** The deck (shared/deck/schema.ts DeckInput, internal SI units) as JSON. */
    deckJson: text('deck_json').notNull(),
    /** Saved lane and wheel placements as JSON, or null. */
    placementsJson: text('placements_json'),
    message: text('message').notNull(),
    basedOnVersionId: integer('based_on_version_id'),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('deck_versions_deck_number_unique').on(t.deckId, t.number)],
);

/** How a result's data is stored: 'json' in data_json (older rows), 'brotli-json' in data_blob. */
export const RESULT_ENCODINGS = ['json', 'brotli-json'] as const;
export type ResultEncoding = (typeof RESULT_ENCODINGS)[number];

/**
 * Computed results per deck version and method, with the solver version that made them.
 * Read and write them only through server/storage/storedResults.ts (it knows the encodings).
 */
export const analysisResults = sqliteTable(
  'analysis_results',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    versionId: integer('version_id')
      .notNull()
      .references(() => deckVersions.id),
    method: text('method').notNull(),
    solverVersion: text('solver_version').notNull(),
    /** The result as JSON when encoding is 'json'; '' when the data is in data_blob. */
    dataJson: text('data_json').notNull(),
    encoding: text('encoding', { enum: RESULT_ENCODINGS }).notNull().default('json'),
    /** The result's JSON compressed with brotli when encoding is 'brotli-json'. */
    dataBlob: blob('data_blob', { mode: 'buffer' }),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('analysis_results_version_method_unique').on(t.versionId, t.method, t.solverVersion)],
);

export const COMPUTE_JOB_KINDS = ['refined', 'package'] as const;
export const COMPUTE_JOB_STATES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;

/**
 * Work sent to the server's worker pools (server/compute/): one row per job, written when it
 * is queued and updated when a worker starts it and when it ends, so a restart finds the jobs
 * it interrupted and marks them failed with the reason (server/compute/jobRecords.ts).
 */
export const computeJobs = sqliteTable(
  'compute_jobs',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    kind: text('kind', { enum: COMPUTE_JOB_KINDS }).notNull(),
    versionId: integer('version_id')
      .notNull()
      .references(() => deckVersions.id),
    /** Who asked first (requests that share the job are not listed). */
    requestedBy: integer('requested_by').references(() => users.id),
    state: text('state', { enum: COMPUTE_JOB_STATES }).notNull().default('queued'),
    solverVersion: text('solver_version').notNull(),
    createdAt: text('created_at').notNull().default(now),
    startedAt: text('started_at'),
    finishedAt: text('finished_at'),
    /** Worker time, ms (done or failed after a start). */
    runMs: real('run_ms'),
    /** Why a failed job failed, in the words its requester was given. */
    error: text('error'),
  },
  (t) => [index('compute_jobs_version').on(t.versionId), index('compute_jobs_state').on(t.state)],
);

/** Who did what, when. Append-only. */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    projectId: integer('project_id'),
    actorId: integer('actor_id').references(() => users.id),
    action: text('action').notNull(),
    entityType: text('entity_type').notNull(),
    entityId: integer('entity_id'),
    summary: text('summary').notNull(),
    at: text('at').notNull().default(now),
  },
  (t) => [index('audit_firm_project_idx').on(t.firmId, t.projectId)],
);

/**
 * Bytes of deck data each firm has stored (versions and their results), kept by triggers on
 * insert (migration 0005) and checked against the firm's quota before a save.
 */
export const firmStorage = sqliteTable('firm_storage', {
  firmId: integer('firm_id')
    .primaryKey()
    .references(() => firms.id),
  bytes: integer('bytes').notNull().default(0),
});

/**
 * Refused sign-ins, one row per key and window: the first attempt a limit refuses (per client
 * address, or per account and address) is recorded with who was tried and from where; the
 * attempts that follow in the same window are refused without a row, so a flood cannot fill the
 * database. `firm_id` is the firm of the account tried, when the e-mail belongs to one.
 */
export const signInRefusals = sqliteTable(
  'sign_in_refusals',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    at: text('at').notNull().default(now),
    /** Which limit refused: 'address' (many e-mails from one address) or 'account-address'. */
    limit: text('limit_name').notNull(),
    /** The e-mail tried, when the limit saw it. */
    email: text('email'),
    address: text('address').notNull(),
    firmId: integer('firm_id').references(() => firms.id),
  },
  (t) => [index('sign_in_refusals_at_idx').on(t.at)],
);

export type UserRow = typeof users.$inferSelect;
export type ProjectRow = typeof projects.$inferSelect;
export type DeckRow = typeof decks.$inferSelect;
export type DeckVersionRow = typeof deckVersions.$inferSelect;
export type AnalysisResultRow = typeof analysisResults.$inferSelect;
export type AuditRow = typeof auditLog.$inferSelect;
export type SignInRefusalRow = typeof signInRefusals.$inferSelect;

// ─── Review, mail, attachments and training (workflow tables) ─────────────────────────────

/**
 * States of a review round, in plain words:
 * - 'awaiting-review': submitted to the chosen reviewer, who comments and decides;
 * - 'approved': the reviewer approved this version (final: the round is locked);
 * - 'sent-back': the reviewer returned it with comments; the designer answers and submits a
 *   new version in a new round (this round stays closed);
 * - 'withdrawn': the designer took the submission back before a decision.
 * A version with no round is "in progress".
 */
export const REVIEW_STATES = ['awaiting-review', 'approved', 'sent-back', 'withdrawn'] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

/** One submission of one deck version to one reviewer. Deck versions stay immutable. */
export const reviewRounds = sqliteTable(
  'review_rounds',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    projectId: integer('project_id')
      .notNull()
      .references(() => projects.id),
    deckId: integer('deck_id')
      .notNull()
      .references(() => decks.id),
    versionId: integer('version_id')
      .notNull()
      .references(() => deckVersions.id),
    submittedBy: integer('submitted_by')
      .notNull()
      .references(() => users.id),
    reviewerId: integer('reviewer_id')
      .notNull()
      .references(() => users.id),
    /** The round this one answers (the sent-back round of an earlier version), or null. */
    previousRoundId: integer('previous_round_id'),
    state: text('state', { enum: REVIEW_STATES }).notNull().default('awaiting-review'),
    submissionNote: text('submission_note').notNull().default(''),
    decidedBy: integer('decided_by').references(() => users.id),
    decidedAt: text('decided_at'),
    decisionNote: text('decision_note'),
    /** The reviewer's finding: is a refined analysis justified for this deck? null until recorded. */
    refinedJustified: integer('refined_justified', { mode: 'boolean' }),
    refinedReason: text('refined_reason'),
    refinedDecidedAt: text('refined_decided_at'),
    /** What the refined rows could back when the decision was recorded (JSON, shared/review/claimConditions.ts); null before it was kept. */
    refinedConditions: text('refined_conditions'),
    createdAt: text('created_at').notNull().default(now),
    updatedAt: text('updated_at').notNull().default(now),
  },
  (t) => [
    index('review_rounds_firm_state_idx').on(t.firmId, t.state),
    index('review_rounds_version_idx').on(t.versionId),
    index('review_rounds_reviewer_idx').on(t.reviewerId),
    // At most one open round per deck, and at most one approval per version.
    uniqueIndex('review_rounds_one_open_per_deck').on(t.deckId).where(sql`state = 'awaiting-review'`),
    uniqueIndex('review_rounds_one_approval_per_version').on(t.versionId).where(sql`state = 'approved'`),
  ],
);

/**
 * A comment of a review round, on the deck as a whole (anchor null) or anchored to one value
 * (girder, effect, method, lanes). Answers point at the comment they answer. Append-only.
 */
export const reviewComments = sqliteTable(
  'review_comments',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    roundId: integer('round_id')
      .notNull()
      .references(() => reviewRounds.id),
    authorId: integer('author_id')
      .notNull()
      .references(() => users.id),
    parentId: integer('parent_id'),
    body: text('body').notNull(),
    /** JSON `{ girder?, effect?, method?, lanes? }` or null for the deck as a whole. */
    anchorJson: text('anchor_json'),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [index('review_comments_round_idx').on(t.roundId)],
);

/**
 * Messages received by the local SMTP service (development and tests): the product's
 * outbox, readable by the firm's admins. Append-only.
 */
export const outboxMessages = sqliteTable(
  'outbox_messages',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    /** The firm named by the message's X-Deckshare-Firm header, or null. */
    firmId: integer('firm_id').references(() => firms.id),
    /** What the message is about (X-Deckshare-Kind header), e.g. 'review-requested'. */
    kind: text('kind').notNull().default(''),
    messageId: text('message_id').notNull().default(''),
    fromAddress: text('from_address').notNull(),
    /** Recipients, comma-separated, as the SMTP envelope named them. */
    toAddresses: text('to_addresses').notNull(),
    subject: text('subject').notNull(),
    textBody: text('text_body').notNull(),
    htmlBody: text('html_body'),
    sizeBytes: integer('size_bytes').notNull(),
    receivedAt: text('received_at').notNull().default(now),
  },
  (t) => [index('outbox_firm_idx').on(t.firmId)],
);

/** Invitations to set a password, sent by e-mail. Only the SHA-256 of the token is stored. */
export const invitations = sqliteTable(
  'invitations',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    tokenHash: text('token_hash').notNull(),
    expiresAt: text('expires_at').notNull(),
    usedAt: text('used_at'),
    /** Set when a newer invitation for the same user replaced this one. */
    replacedAt: text('replaced_at'),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('invitations_token_unique').on(t.tokenHash), index('invitations_user_idx').on(t.userId)],
);

/** Drawings attached to a project. The file lives outside the web root under `storedName`. */
export const attachments = sqliteTable(
  'attachments',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    projectId: integer('project_id')
      .notNull()
      .references(() => projects.id),
    title: text('title').notNull(),
    originalName: text('original_name').notNull(),
    /** Random file name in the attachments folder (no extension, never derived from input). */
    storedName: text('stored_name').notNull(),
    /** Type detected from the content: application/pdf, image/png or image/jpeg. */
    contentType: text('content_type').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    sha256: text('sha256').notNull(),
    uploadedBy: integer('uploaded_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('attachments_stored_name_unique').on(t.storedName), index('attachments_project_idx').on(t.projectId)],
);

/** A training exercise made from one deck version; the expected answer is frozen at creation. */
export const assignments = sqliteTable(
  'assignments',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    firmId: integer('firm_id')
      .notNull()
      .references(() => firms.id),
    projectId: integer('project_id')
      .notNull()
      .references(() => projects.id),
    deckId: integer('deck_id')
      .notNull()
      .references(() => decks.id),
    versionId: integer('version_id')
      .notNull()
      .references(() => deckVersions.id),
    /** What is asked: see server/api/training/trainingModel.ts. */
    kind: text('kind').notNull(),
    /** The question's parameters (girder, effect, lanes, method) as JSON. */
    paramsJson: text('params_json').notNull(),
    title: text('title').notNull(),
    instructions: text('instructions').notNull().default(''),
    /** Relative tolerance for numeric answers, percent. */
    tolerancePercent: real('tolerance_percent').notNull(),
    dueAt: text('due_at').notNull(),
    /** The product's answer with its trace, JSON, computed when the assignment was made. */
    expectedJson: text('expected_json').notNull(),
    /**
     * When the instructor opened the exercise to all: from then on its version's results and
     * the product's answer are shown to every trainee, submitted or not. Null while closed.
     */
    resultsOpenedAt: text('results_opened_at'),
    resultsOpenedBy: integer('results_opened_by').references(() => users.id),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [index('assignments_firm_idx').on(t.firmId)],
);

export const assignmentTrainees = sqliteTable(
  'assignment_trainees',
  {
    assignmentId: integer('assignment_id')
      .notNull()
      .references(() => assignments.id),
    traineeId: integer('trainee_id')
      .notNull()
      .references(() => users.id),
    assignedAt: text('assigned_at').notNull().default(now),
  },
  (t) => [primaryKey({ columns: [t.assignmentId, t.traineeId] }), index('assignment_trainees_trainee_idx').on(t.traineeId)],
);

/** A trainee's answer, graded when it is submitted. Append-only: a new attempt is a new row. */
export const submissions = sqliteTable(
  'submissions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    assignmentId: integer('assignment_id')
      .notNull()
      .references(() => assignments.id),
    traineeId: integer('trainee_id')
      .notNull()
      .references(() => users.id),
    attempt: integer('attempt').notNull(),
    /** The trainee's values (and optional placement) as JSON. */
    answerJson: text('answer_json').notNull(),
    /** The trainee's hand-calculation steps as JSON. */
    stepsJson: text('steps_json').notNull(),
    late: integer('late', { mode: 'boolean' }).notNull(),
    passed: integer('passed', { mode: 'boolean' }).notNull(),
    /** Per-value comparison with the product's answer, JSON. */
    gradingJson: text('grading_json').notNull(),
    submittedAt: text('submitted_at').notNull().default(now),
  },
  (t) => [uniqueIndex('submissions_attempt_unique').on(t.assignmentId, t.traineeId, t.attempt)],
);

export type ReviewRoundRow = typeof reviewRounds.$inferSelect;
export type ReviewCommentRow = typeof reviewComments.$inferSelect;
export type OutboxRow = typeof outboxMessages.$inferSelect;
export type InvitationRow = typeof invitations.$inferSelect;
export type AttachmentRow = typeof attachments.$inferSelect;
export type AssignmentRow = typeof assignments.$inferSelect;
export type SubmissionRow = typeof submissions.$inferSelect;

export const STUDY_STATES = ['running', 'done', 'cancelled', 'interrupted'] as const;
export type StudyState = (typeof STUDY_STATES)[number];

/**
 * A parameter study (shared/studies/sweep.ts): a sweep over a saved deck version, computed
 * point by point in the server's worker threads (server/compute/studyRunner.ts). 'interrupted':
 * a stopped server left it running; its finished points are kept and it can be resumed.
 */
export const studies = sqliteTable(
  'studies',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    projectId: integer('project_id')
      .notNull()
      .references(() => projects.id),
    versionId: integer('version_id')
      .notNull()
      .references(() => deckVersions.id),
    name: text('name').notNull(),
    /** The sweep (shared/studies/sweep.ts Sweep, internal SI units) as JSON. */
    sweepJson: text('sweep_json').notNull(),
    state: text('state', { enum: STUDY_STATES }).notNull().default('running'),
    pointsTotal: integer('points_total').notNull(),
    pointsDone: integer('points_done').notNull().default(0),
    solverVersion: text('solver_version').notNull(),
    createdBy: integer('created_by')
      .notNull()
      .references(() => users.id),
    createdAt: text('created_at').notNull().default(now),
    finishedAt: text('finished_at'),
    /** Who cancelled it (name), when cancelled. */
    cancelledBy: text('cancelled_by'),
  },
  (t) => [index('studies_project_idx').on(t.projectId)],
);

/** One computed point of a study: its parameter values, summary or the deck's error, solver version. */
export const studyPoints = sqliteTable(
  'study_points',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    studyId: integer('study_id')
      .notNull()
      .references(() => studies.id),
    index: integer('point_index').notNull(),
    /** The swept parameters' values at this point, internal units, as JSON. */
    valuesJson: text('values_json').notNull(),
    /** shared/studies/pointResult.ts PointSummary as JSON, or null when the deck is invalid here. */
    summaryJson: text('summary_json'),
    /** The deck's own error messages at this point. */
    error: text('error'),
    solverVersion: text('solver_version').notNull(),
    createdAt: text('created_at').notNull().default(now),
  },
  (t) => [uniqueIndex('study_points_study_index_unique').on(t.studyId, t.index)],
);
