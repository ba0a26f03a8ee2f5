/**
 * A small, bounded pool of worker threads for bcrypt. At most `threads` hashes run at once and
 * at most `queue` wait; one more is refused at once with a 503 (and Retry-After) instead of
 * piling up, so a flood of sign-ins can neither starve the request thread nor grow memory
 * without end. Idle workers do not keep the process alive.
 */
import { Piscina } from 'piscina';
import { ApiError } from '../middleware/errors.js';

export interface PasswordPoolOptions {
  /** Hashes computed at the same time (worker threads). */
  threads: number;
  /** Hashes allowed to wait for a free thread; beyond that the request gets a 503. */
  queue: number;
}

/** Seconds a refused client is told to wait before trying again. */
export const BUSY_RETRY_AFTER_SECONDS = 3;

const WORKER_FILE = new URL('./passwordWorker.mjs', import.meta.url).href;

type Task = { op: 'hash'; plain: string; cost: number } | { op: 'compare'; plain: string; hash: string };

export class PasswordPool {
  readonly options: PasswordPoolOptions;
  private readonly pool: Piscina;

  constructor(options: PasswordPoolOptions) {
    this.options = { ...options };
    this.pool = new Piscina({
      filename: WORKER_FILE,
      minThreads: options.threads,
      maxThreads: options.threads,
      maxQueue: options.queue,
      // The worker is plain JavaScript: it needs none of the parent's loader flags (tsx, vitest).
      execArgv: [],
    });
  }

  hash(plain: string, cost: number): Promise<string> {
    return this.run({ op: 'hash', plain, cost }) as Promise<string>;
  }

  compare(plain: string, hash: string): Promise<boolean> {
    return this.run({ op: 'compare', plain, hash }) as Promise<boolean>;
  }

  close(): Promise<void> {
    return this.pool.destroy();
  }

  private async run(task: Task): Promise<unknown> {
    try {
      return await this.pool.run(task);
    } catch (err) {
      if (isQueueFull(err)) throw busyError();
      throw err;
    }
  }
}

function isQueueFull(err: unknown): boolean {
  return err instanceof Error && /queue is at limit|all Workers are busy/i.test(err.message);
}

function busyError(): ApiError {
  return new ApiError(503, 'busy', `the server is busy checking other passwords: try again in ${BUSY_RETRY_AFTER_SECONDS} seconds`, [], {
    'Retry-After': String(BUSY_RETRY_AFTER_SECONDS),
  });
}
