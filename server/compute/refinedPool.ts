/**
 * The refined-analysis pool: runs the grillage (server/compute/refinedWorker.ts) on worker
 * threads (piscina) so that no request waits behind one, with limits that keep one request
 * from exhausting the server:
 * - model size: a deck whose grillage would exceed `maxNodeGirders` (nodes × girder lines,
 *   server/compute/modelSize.ts) is refused before anything is queued (413);
 * - queue: at most `threads + queue` distinct jobs at once; beyond that 503 with Retry-After;
 * - time: a job running longer than `jobMs` is aborted (piscina terminates its worker and
 *   starts another when needed) and its requests get 503 saying so;
 * - memory: each worker's heap is capped (`workerMemoryMb`); a worker that runs out is
 *   reported (503) and replaced;
 * - de-duplication: concurrent requests for the same key (version and solver version) share
 *   one job;
 * - cancel: a queued or running job can be cancelled (`cancel`); every request waiting for it
 *   gets 409 saying who cancelled it, and nothing of it is stored.
 * The threads are those of server/compute/workerPool.ts (TypeScript through tsx's loader,
 * below the request thread's priority, heap-capped).
 */
import type { Piscina } from 'piscina';
import { tsxWorkerPool } from './workerPool.js';
import type { Deck } from '../../shared/deck/schema.js';
import type { Config } from '../config/env.js';
import { ApiError } from '../middleware/errors.js';
import { modelSizeRefusal, refinedModelSize } from './modelSize.js';
import { REFINED_SEGMENTS_PER_SPAN } from '../../shared/grillage/refinedFactors.js';
import type { ProgressMessage, RefinedAnswer, RefinedTask, StartedMessage } from './refinedWorker.js';
import type { RefinedProgress } from '../../shared/grillage/refinedFactors.js';
import type { JobMeta, JobRecorder } from './jobRecords.js';

export interface RefinedPoolOptions {
  /** Worker threads (at least 1). */
  threads: number;
  /** Jobs that may wait for a thread beyond those running. */
  queue: number;
  /** Longest run of one job, ms (from the moment a worker starts it). */
  jobMs: number;
  /** Heap cap of each worker (V8 old generation), MB. */
  workerMemoryMb: number;
  /** Largest model accepted, nodes × girder lines. */
  maxNodeGirders: number;
  /** Distinct jobs one user may have queued or running at once (joining a running job is free); default no limit. */
  jobsPerUser?: number;
  /** The same for all the users of one firm together; default no limit. */
  jobsPerFirm?: number;
  /** Where a worker's failure outside any job is reported (default: console.error). */
  log?: (line: string) => void;
}

export interface RefinedPoolStats {
  threads: number;
  /** Workers alive now. */
  workers: number;
  running: number;
  queued: number;
  /** Jobs sent to the pool. */
  jobs: number;
  /** Requests that joined a job already running or queued for the same version. */
  shared: number;
  completed: number;
  failed: number;
  cancelled: number;
  timedOut: number;
  outOfMemory: number;
  refusedBusy: number;
  refusedTooLarge: number;
  refusedOverUserLimit: number;
  refusedOverFirmLimit: number;
}

/** The refined run of a deck was refused before queueing: its model is above the limit. */
export class RefinedModelTooLargeError extends ApiError {
  constructor(message: string) {
    super(413, 'refined_model_too_large', `The refined (grillage) analysis was not run: ${message}.`, [{ path: 'deck', message }]);
    this.name = 'RefinedModelTooLargeError';
  }
}

interface Job {
  id: number;
  key: string;
  controller: AbortController;
  startedAt: number | null;
  timer: NodeJS.Timeout | null;
  /** Ends a job no worker has started in time (a worker that cannot start). */
  startTimer: NodeJS.Timeout;
  timedOut: boolean;
  notStarted: boolean;
  /** Who cancelled the job (null while it is not cancelled). */
  cancelledBy: string | null;
  promise: Promise<RefinedAnswer>;
  /** Its row in compute_jobs (null when not recorded). */
  recordId: number | null;
  /** The worker's last word on where the run is. */
  progress: RefinedProgress | null;
  meta: Omit<JobMeta, 'kind'> | undefined;
}

/** Allowance for starting a worker (the tsx loader and the solver's modules), ms. */
const WORKER_START_MS = 30_000;
const WORKER = new URL('./refinedWorker.ts', import.meta.url).href;

/** "1 refined (grillage) analysis", "2 refined (grillage) analyses". */
const analyses = (n: number) => `${n} refined (grillage) ${n === 1 ? 'analysis' : 'analyses'}`;

function isProgress(m: unknown): m is ProgressMessage {
  return typeof m === 'object' && m !== null && (m as ProgressMessage).kind === 'refined-progress';
}

function isStarted(m: unknown): m is StartedMessage {
  return typeof m === 'object' && m !== null && (m as StartedMessage).kind === 'refined-started';
}

export class RefinedPool {
  private readonly pool: Piscina<RefinedTask, RefinedAnswer>;
  private readonly jobs = new Map<string, Job>();
  private readonly byId = new Map<number, Job>();
  private nextId = 1;
  /** Mean run time of recent jobs, ms (for Retry-After). */
  private meanMs = 5000;
  private readonly counts = { jobs: 0, shared: 0, completed: 0, failed: 0, cancelled: 0, timedOut: 0, outOfMemory: 0, refusedBusy: 0, refusedTooLarge: 0, refusedOverUserLimit: 0, refusedOverFirmLimit: 0 };
  private recorder: JobRecorder | null = null;

  /** Records every job from now on (server/compute/jobRecords.ts). */
  recordJobs(recorder: JobRecorder): void {
    this.recorder = recorder;
  }

  /** Where the live job recorded as `recordId` is (null when it is not live here, or has said nothing yet). */
  progressOf(recordId: number): RefinedProgress | null {
    for (const job of this.jobs.values()) if (job.recordId === recordId) return job.progress;
    return null;
  }

  /**
   * Cancels the live job recorded as `recordId` on behalf of `byName`: it leaves the queue, or
   * its worker is stopped; its record says so at once and every request waiting for it gets
   * 409. False when no such job is queued or running here.
   */
  cancel(recordId: number, byName: string): boolean {
    const job = [...this.jobs.values()].find((j) => j.recordId === recordId);
    if (!job || job.cancelledBy !== null) return false;
    job.cancelledBy = byName;
    this.recorder?.cancelled(recordId, this.cancelledError(job).message, job.startedAt === null ? null : performance.now() - job.startedAt);
    job.controller.abort();
    return true;
  }

  private cancelledError(job: Job): ApiError {
    return new ApiError(
      409,
      'refined_cancelled',
      `The refined (grillage) analysis of this version was cancelled by ${job.cancelledBy} ${job.startedAt === null ? 'before it started' : 'while it ran'}; nothing of it was stored. Ask for it again (open the review, the package or the CSV) to run it anew.`,
    );
  }

  /** The compute_jobs row of the job queued or running under `key` (null when none, or not recorded). */
  recordOf(key: string): number | null {
    return this.jobs.get(key)?.recordId ?? null;
  }

  constructor(readonly options: RefinedPoolOptions) {
    // A worker lost with no task on it (e.g. at start-up) is logged; jobs it leaves waiting are
    // ended by their start deadline.
    this.pool = tsxWorkerPool<RefinedTask, RefinedAnswer>({
      file: WORKER,
      threads: options.threads,
      queue: options.queue,
      workerMemoryMb: options.workerMemoryMb,
      log: options.log ?? ((line: string) => console.error(line)),
      what: 'refined-analysis',
    });
    this.pool.on('message', (m: unknown) => {
      if (isStarted(m)) this.started(m.jobId);
      else if (isProgress(m)) {
        const job = this.byId.get(m.jobId);
        if (job) job.progress = m.progress;
      }
    });
  }

  /**
   * The refined answer for `deck` (the version's stored deck text `deckJson`), shared by every
   * concurrent caller with the same `key`. Throws RefinedModelTooLargeError before queueing,
   * ApiError 503 when the pool is full, the job ran out of time or its worker out of memory.
   */
  run(key: string, deck: Deck, deckJson: string, meta?: Omit<JobMeta, 'kind'>): Promise<RefinedAnswer> {
    const existing = this.jobs.get(key);
    if (existing) {
      this.counts.shared++;
      return existing.promise;
    }
    const refusal = modelSizeRefusal(refinedModelSize(deck), this.options.maxNodeGirders);
    if (refusal) {
      this.counts.refusedTooLarge++;
      return Promise.reject(new RefinedModelTooLargeError(refusal));
    }
    const limited = this.limitError(meta);
    if (limited) return Promise.reject(limited);
    if (this.jobs.size >= this.options.threads + this.options.queue) {
      this.counts.refusedBusy++;
      return Promise.reject(this.busyError());
    }
    // The convergence check runs the moment rows again at twice the density: only when that model is within the limit too.
    const checkConvergence = refinedModelSize(deck, 2 * REFINED_SEGMENTS_PER_SPAN).nodeGirders <= this.options.maxNodeGirders;
    return this.submit(key, deckJson, checkConvergence, meta).promise;
  }

  private submit(key: string, deckJson: string, checkConvergence: boolean, meta: Omit<JobMeta, 'kind'> | undefined): Job {
    const id = this.nextId++;
    const controller = new AbortController();
    // Every job ahead of this one ends within jobMs (plus a worker start), so it starts within this deadline.
    const startMs = (this.options.jobMs + WORKER_START_MS) * Math.ceil((this.jobs.size + 1) / this.options.threads);
    const startTimer = setTimeout(() => {
      job.notStarted = true;
      controller.abort();
    }, startMs);
    const recordId = meta && this.recorder ? this.recorder.queued({ kind: 'refined', ...meta }) : null;
    const job: Job = { id, key, controller, startedAt: null, timer: null, startTimer, timedOut: false, notStarted: false, cancelledBy: null, promise: Promise.resolve(null as never), recordId, progress: null, meta };
    const runMs = () => (job.startedAt === null ? null : performance.now() - job.startedAt);
    this.counts.jobs++;
    job.promise = this.pool
      .run({ jobId: id, deckJson, checkConvergence } satisfies RefinedTask, { signal: controller.signal })
      .then(
        (answer) => {
          this.counts.completed++;
          // structured cloning turns the worker's Buffer into a Uint8Array; the database binds Buffers
          const blob = answer.encoded?.dataBlob as Uint8Array | null | undefined;
          if (answer.encoded && blob && !Buffer.isBuffer(blob)) answer.encoded.dataBlob = Buffer.from(blob.buffer, blob.byteOffset, blob.byteLength);
          if (job.startedAt !== null) this.meanMs = 0.7 * this.meanMs + 0.3 * (performance.now() - job.startedAt);
          if (job.recordId !== null) this.recorder?.done(job.recordId, runMs());
          return answer;
        },
        (e: unknown) => {
          const error = this.failure(job, e);
          // a cancelled job's record was written when it was cancelled
          if (job.recordId !== null && job.cancelledBy === null) this.recorder?.failed(job.recordId, error.message, runMs());
          throw error;
        },
      )
      .finally(() => this.settle(job));
    this.jobs.set(key, job);
    this.byId.set(id, job);
    return job;
  }

  /** A worker began the job: its clock starts now. */
  private started(jobId: number): void {
    const job = this.byId.get(jobId);
    if (!job || job.startedAt !== null) return;
    clearTimeout(job.startTimer);
    job.startedAt = performance.now();
    if (job.recordId !== null) this.recorder?.started(job.recordId);
    job.timer = setTimeout(() => {
      job.timedOut = true;
      job.controller.abort();
    }, this.options.jobMs);
  }

  private settle(job: Job): void {
    clearTimeout(job.startTimer);
    if (job.timer) clearTimeout(job.timer);
    this.jobs.delete(job.key);
    this.byId.delete(job.id);
  }

  private failure(job: Job, e: unknown): Error {
    const seconds = (this.options.jobMs / 1000).toLocaleString('en-US');
    if (job.cancelledBy !== null) {
      this.counts.cancelled++;
      return this.cancelledError(job);
    }
    if (job.timedOut) {
      this.counts.timedOut++;
      return new ApiError(
        503,
        'refined_time_limit',
        `The refined (grillage) analysis of this version ran longer than this server's limit of ${seconds} s and was stopped. ` +
          'The server may be busy: try again in a few minutes. If it stops again, the deck is too large for a refined run here: run the grillage in the workspace with a coarser mesh, ' +
          'or ask an administrator to raise REFINED_JOB_SECONDS.',
      );
    }
    if (job.notStarted) {
      this.counts.failed++;
      return new ApiError(
        503,
        'refined_unavailable',
        'The refined (grillage) analysis of this version could not be started: no analysis worker became free in time. Try again in a few minutes; if it persists, an administrator should check the server log.',
      );
    }
    if ((e as { code?: unknown }).code === 'ERR_WORKER_OUT_OF_MEMORY') {
      this.counts.outOfMemory++;
      return new ApiError(
        503,
        'refined_out_of_memory',
        `The refined (grillage) analysis of this version needed more than this server's memory allowance of ${this.options.workerMemoryMb} MB per analysis and was stopped. ` +
          'Run the grillage in the workspace with a coarser mesh, or ask an administrator to raise REFINED_WORKER_MEMORY_MB.',
      );
    }
    this.counts.failed++;
    return e instanceof Error ? e : new Error(String(e));
  }

  /** 429 when the requester, or the requester's firm, already has as many distinct jobs as allowed. */
  private limitError(meta: Omit<JobMeta, 'kind'> | undefined): ApiError | null {
    if (!meta) return null;
    const live = [...this.jobs.values()];
    const refusal = (code: string, message: string) => {
      const retryAfter = String(Math.max(1, Math.ceil(this.meanMs / 1000)));
      return new ApiError(429, code, message, [{ path: 'Retry-After', message: `${retryAfter} seconds` }], { 'Retry-After': retryAfter });
    };
    const perUser = this.options.jobsPerUser;
    if (perUser !== undefined && meta.requestedBy !== null) {
      const mine = live.filter((j) => j.meta?.requestedBy === meta.requestedBy).length;
      if (mine >= perUser) {
        this.counts.refusedOverUserLimit++;
        return refusal(
          'refined_user_limit',
          `You already have ${analyses(mine)} queued or running, the most one user may have at once on this server (${perUser}). Try again when one of them is done (a version's jobs list them); an administrator can raise REFINED_JOBS_PER_USER.`,
        );
      }
    }
    const perFirm = this.options.jobsPerFirm;
    if (perFirm !== undefined && meta.firmId !== undefined) {
      const firms = live.filter((j) => j.meta?.firmId === meta.firmId).length;
      if (firms >= perFirm) {
        this.counts.refusedOverFirmLimit++;
        return refusal(
          'refined_firm_limit',
          `Your firm already has ${analyses(firms)} queued or running, the most one firm may have at once on this server (${perFirm}). Try again when one of them is done; an administrator can raise REFINED_JOBS_PER_FIRM.`,
        );
      }
    }
    return null;
  }

  private busyError(): ApiError {
    const running = [...this.jobs.values()].filter((j) => j.startedAt !== null).length;
    const waiting = this.jobs.size - running;
    const estimate = Math.ceil(((waiting / this.options.threads + 1) * this.meanMs) / 1000);
    const retryAfter = Math.min(Math.max(estimate, 1), Math.ceil(this.options.jobMs / 1000));
    return new ApiError(
      503,
      'refined_busy',
      `The server is running as many refined (grillage) analyses as it can (${running} running, ${waiting} waiting). Try again in ${retryAfter} s.`,
      [{ path: 'Retry-After', message: `${retryAfter} seconds` }],
      { 'Retry-After': String(retryAfter) },
    );
  }

  stats(): RefinedPoolStats {
    const running = [...this.jobs.values()].filter((j) => j.startedAt !== null).length;
    return { threads: this.options.threads, workers: this.pool.threads.length, running, queued: this.jobs.size - running, ...this.counts };
  }

  /** Stops every worker (jobs still running fail); for shutdown and tests. */
  async close(): Promise<void> {
    for (const job of this.jobs.values()) {
      clearTimeout(job.startTimer);
      if (job.timer) clearTimeout(job.timer);
    }
    await this.pool.destroy();
  }
}

/** The pool the configuration describes. */
export function refinedPoolFor(
  config: Pick<Config, 'refinedThreads' | 'refinedQueue' | 'refinedJobMs' | 'refinedWorkerMemoryMb' | 'refinedMaxNodeGirders' | 'refinedJobsPerUser' | 'refinedJobsPerFirm'>,
): RefinedPool {
  return new RefinedPool({
    jobsPerUser: config.refinedJobsPerUser,
    jobsPerFirm: config.refinedJobsPerFirm,
    threads: config.refinedThreads,
    queue: config.refinedQueue,
    jobMs: config.refinedJobMs,
    workerMemoryMb: config.refinedWorkerMemoryMb,
    maxNodeGirders: config.refinedMaxNodeGirders,
  });
}
