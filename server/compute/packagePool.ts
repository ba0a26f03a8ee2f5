/**
 * The calculation-package pool: lays out each PDF (server/compute/packageWorker.ts) on a
 * worker thread (piscina), so no request waits behind one, with the limits of the refined
 * pool's kind (server/compute/refinedPool.ts):
 * - queue: at most `threads + queue` packages at once; beyond that 503 with Retry-After;
 * - time: a package taking longer than `jobMs` is aborted and its request gets 503 saying so;
 * - memory: each worker's heap is capped (`workerMemoryMb`); a worker that runs out is
 *   reported (503) and replaced.
 * The threads are those of server/compute/workerPool.ts, as the refined pool's are.
 */
import type { Piscina } from 'piscina';
import { tsxWorkerPool } from './workerPool.js';
import type { Config } from '../config/env.js';
import { ApiError } from '../middleware/errors.js';
import type { ReportData } from '../reports/reportData.js';
import type { JobRecorder } from './jobRecords.js';

export interface PackagePoolOptions {
  threads: number;
  /** Packages that may wait for a thread beyond those being laid out. */
  queue: number;
  /** Longest layout of one package, ms (from submission: a package waits for no grillage). */
  jobMs: number;
  workerMemoryMb: number;
  log?: (line: string) => void;
}

export interface PackagePoolStats {
  threads: number;
  workers: number;
  inFlight: number;
  jobs: number;
  completed: number;
  failed: number;
  timedOut: number;
  refusedBusy: number;
}

const WORKER = new URL('./packageWorker.ts', import.meta.url).href;
/** Allowance for starting a worker (the tsx loader, pdfkit and the fonts), ms. */
const WORKER_START_MS = 30_000;

export class PackagePool {
  private readonly pool: Piscina<ReportData, Uint8Array>;
  private inFlight = 0;
  private meanMs = 1000;
  private readonly counts = { jobs: 0, completed: 0, failed: 0, timedOut: 0, refusedBusy: 0 };
  private recorder: JobRecorder | null = null;

  /** Records every package from now on (server/compute/jobRecords.ts). */
  recordJobs(recorder: JobRecorder): void {
    this.recorder = recorder;
  }

  constructor(readonly options: PackagePoolOptions) {
    this.pool = tsxWorkerPool<ReportData, Uint8Array>({
      file: WORKER,
      threads: options.threads,
      queue: options.queue,
      workerMemoryMb: options.workerMemoryMb,
      log: options.log ?? ((line: string) => console.error(line)),
      what: 'calculation-package',
    });
  }

  /** The PDF of `data`. ApiError 503 when the pool is full, the layout ran out of time or memory. */
  async render(data: ReportData, requestedBy: number | null = null): Promise<Buffer> {
    if (this.inFlight >= this.options.threads + this.options.queue) {
      this.counts.refusedBusy++;
      throw this.busyError();
    }
    this.inFlight++;
    this.counts.jobs++;
    const controller = new AbortController();
    let timedOut = false;
    // The first package also starts a worker; later ones wait at most for those ahead of them.
    const limit = this.options.jobMs * Math.ceil(this.inFlight / this.options.threads) + WORKER_START_MS;
    const timer = setTimeout(() => {
      timedOut = true;
      controller.abort();
    }, limit);
    const t0 = performance.now();
    const recordId = this.recorder ? this.recorder.queued({ kind: 'package', versionId: data.version.id, requestedBy }) : null;
    // a package has no start message: it counts as running from submission
    if (recordId !== null) this.recorder?.started(recordId);
    try {
      const bytes = await this.pool.run(data, { signal: controller.signal });
      this.counts.completed++;
      this.meanMs = 0.7 * this.meanMs + 0.3 * (performance.now() - t0);
      if (recordId !== null) this.recorder?.done(recordId, performance.now() - t0);
      // structured cloning turns the worker's Buffer into a Uint8Array
      return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    } catch (e) {
      const error = this.failure(e, timedOut);
      if (recordId !== null) this.recorder?.failed(recordId, error.message, performance.now() - t0);
      throw error;
    } finally {
      clearTimeout(timer);
      this.inFlight--;
    }
  }

  private failure(e: unknown, timedOut: boolean): Error {
    if (timedOut) {
      this.counts.timedOut++;
      return new ApiError(
        503,
        'package_time_limit',
        `The calculation package took longer than this server's limit of ${(this.options.jobMs / 1000).toLocaleString('en-US')} s and was stopped. The server may be busy: try again in a few minutes.`,
      );
    }
    this.counts.failed++;
    if ((e as { code?: unknown }).code === 'ERR_WORKER_OUT_OF_MEMORY') {
      return new ApiError(
        503,
        'package_out_of_memory',
        `The calculation package needed more than this server's memory allowance of ${this.options.workerMemoryMb} MB and was stopped. Ask an administrator to raise REFINED_WORKER_MEMORY_MB.`,
      );
    }
    return e instanceof Error ? e : new Error(String(e));
  }

  private busyError(): ApiError {
    const retryAfter = Math.max(1, Math.ceil(((this.inFlight / this.options.threads) * this.meanMs) / 1000));
    return new ApiError(
      503,
      'package_busy',
      `The server is laying out as many calculation packages as it can (${this.inFlight} at once). Try again in ${retryAfter} s.`,
      [{ path: 'Retry-After', message: `${retryAfter} seconds` }],
      { 'Retry-After': String(retryAfter) },
    );
  }

  stats(): PackagePoolStats {
    return { threads: this.options.threads, workers: this.pool.threads.length, inFlight: this.inFlight, ...this.counts };
  }

  async close(): Promise<void> {
    await this.pool.destroy();
  }
}

/** The pool the configuration describes (one thread: packages are short and rare beside grillages). */
export function packagePoolFor(config: Pick<Config, 'packageThreads' | 'packageQueue' | 'refinedJobMs' | 'refinedWorkerMemoryMb'>): PackagePool {
  return new PackagePool({
    threads: config.packageThreads,
    queue: config.packageQueue,
    jobMs: config.refinedJobMs,
    workerMemoryMb: config.refinedWorkerMemoryMb,
  });
}
