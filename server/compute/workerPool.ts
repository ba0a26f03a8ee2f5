/**
 * The worker threads both pools run on (refinedPool.ts, packagePool.ts): piscina with threads
 * started on demand and kept for five minutes, the TypeScript of the worker file loaded through
 * tsx's loader (resolved from node_modules, so the pools run the same under `tsx` and under
 * vitest, whose transform does not reach worker threads), a scheduling priority below the
 * request thread, a heap cap per worker, and a worker failure outside any task logged instead
 * of crashing the server.
 */
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';

const LOADER = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href;
/** Scheduling priority of the workers below the request thread (nice increment, Linux). */
const WORKER_NICE = 10;

export interface WorkerPoolOptions {
  /** The worker module (a file URL). */
  file: string;
  threads: number;
  /** Tasks that may wait for a thread beyond those running. */
  queue: number;
  /** Heap cap of each worker (V8 old generation), MB. */
  workerMemoryMb: number;
  /** Where a worker lost outside any task is reported, with what it is for. */
  log: (line: string) => void;
  what: string;
}

export function tsxWorkerPool<Task, Answer>(o: WorkerPoolOptions): Piscina<Task, Answer> {
  const pool = new Piscina<Task, Answer>({
    filename: o.file,
    minThreads: 0,
    maxThreads: o.threads,
    maxQueue: o.queue + o.threads,
    idleTimeout: 300_000,
    execArgv: ['--import', LOADER],
    niceIncrement: WORKER_NICE,
    resourceLimits: { maxOldGenerationSizeMb: o.workerMemoryMb },
  });
  pool.on('error', (e: unknown) => o.log(`${o.what} worker failed: ${e instanceof Error ? e.message : String(e)}`));
  return pool;
}
